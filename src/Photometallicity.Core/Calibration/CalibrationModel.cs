namespace Photometallicity.Calibration;

/// <summary>
/// A fitted calibration of the index: X0 = f(C0, [Fe/H]) on <see cref="Basis"/>, with its intrinsic scatter,
/// bootstrap ensemble, validity domain and (for models fitted by this version) the growth of its error beyond the standards. This is what calibration.json holds and what the metallicity and
/// forecast stages consume.
/// </summary>
public sealed record CalibrationModel
{
    public required IIndexBasis Basis { get; init; }

    /// <summary>Maximum-likelihood coefficients (length Basis.Count).</summary>
    public required double[] Coefficients { get; init; }

    /// <summary>Covariance of the coefficients (Basis.Count squared, row-major).</summary>
    public required double[] CoefficientCovariance { get; init; }

    /// <summary>Fitted intrinsic scatter of the index about the model (mag).</summary>
    public required double SigmaInt { get; init; }

    /// <summary>Bootstrap ensemble: one coefficient vector per resample.</summary>
    public required double[][] EnsembleCoefficients { get; init; }

    /// <summary>Intrinsic scatter of each ensemble member (mag), same length as the ensemble.</summary>
    public required double[] EnsembleSigmaInt { get; init; }

    /// <summary>The convex hull of the accepted standards in (C0, [Fe/H]); the strict domain, when asked for.</summary>
    public required ValidityDomain Domain { get; init; }

    /// <summary>The standards' support and how the model-form error grows beyond it; null for older, hull-only calibrations.</summary>
    public Extrapolation? Extrapolation { get; init; }

    /// <summary>Fitted share of bad standards (NaN when not known).</summary>
    public double OutlierFraction { get; init; } = double.NaN;

    public required FilterSet Filters { get; init; }

    /// <summary>Residual RMS of the accepted standards in [Fe/H] (dex).</summary>
    public double RmsDex { get; init; }

    /// <summary>Residual RMS of the accepted standards in the index (mag).</summary>
    public double RmsIndex { get; init; }

    public int StandardsUsed { get; init; }
    public int StandardsRejected { get; init; }

    /// <summary>Free-form provenance (version, seed, checksums), copied into calibration.json.</summary>
    public IReadOnlyDictionary<string, string> Provenance { get; init; } = new Dictionary<string, string>();

    public double Evaluate(double colour, double feh) => Basis.Value(Coefficients, colour, feh);

    /// <summary>Ensemble member <paramref name="member"/> at one colour, with its draw of the model-form error where there is one.</summary>
    public IndexSlice MemberSlice(int member, double colour) =>
        Extrapolation is { } e ? e.Perturb(Basis, EnsembleCoefficients[member], colour, member) : Basis.Slice(EnsembleCoefficients[member], colour);
}
