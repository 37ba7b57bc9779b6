namespace Photometallicity.Calibration;

/// <summary>
/// A fitted calibration of the index: X0 = f(C0, [Fe/H]) on <see cref="Basis"/>, with its intrinsic scatter,
/// bootstrap ensemble and validity domain. This is what calibration.json holds and what the metallicity and
/// forecast stages consume.
/// </summary>
public sealed record CalibrationModel
{
    public required PolynomialBasis2D Basis { get; init; }

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

    public required ValidityDomain Domain { get; init; }

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
}
