namespace Photometallicity.Photometry.Extinction;

/// <summary>
/// An interstellar extinction law: the extinction at a wavelength relative to the V-band extinction,
/// A(lambda)/A_V, as a function of wavelength and R_V = A_V / E(B-V). Implementations are immutable and
/// thread-safe. What "A_V" means (monochromatic at a reference wavelength, or the Johnson V band) is stated by
/// each law; A(lambda)/E(B-V) is always R_V * AOverAV.
/// </summary>
public interface IExtinctionLaw
{
    /// <summary>Lookup name, as accepted by <see cref="ExtinctionLaws.FromName"/>.</summary>
    string Name { get; }

    /// <summary>Shortest wavelength (Angstrom) where the law is defined.</summary>
    double MinWavelengthAngstrom { get; }

    /// <summary>Longest wavelength (Angstrom) where the law is defined.</summary>
    double MaxWavelengthAngstrom { get; }

    /// <summary>
    /// A(lambda)/A_V at <paramref name="wavelengthAngstrom"/> for the given R_V. Throws
    /// <see cref="ArgumentOutOfRangeException"/> outside [Min, Max]WavelengthAngstrom (callers check the range
    /// of user input first, see <see cref="ExtinctionLaws.CheckDomain"/>).
    /// </summary>
    double AOverAV(double wavelengthAngstrom, double rv);
}
