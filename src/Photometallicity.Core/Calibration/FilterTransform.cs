namespace Photometallicity.Calibration;

/// <summary>
/// Stars measured in both filter sets (dereddened, mag; variances mag^2), columnar. Used to fit the
/// transformation from the new set to the old one.
/// </summary>
public sealed class TransferStars
{
    public required double[] OldColour0 { get; init; }
    public required double[] OldIndex0 { get; init; }
    public required double[] NewColour0 { get; init; }
    public required double[] NewIndex0 { get; init; }
    public required double[] VarOldColour { get; init; }
    public required double[] VarOldIndex { get; init; }
    public required double[] VarNewColour { get; init; }
    public required double[] VarNewIndex { get; init; }
    /// <summary>Covariance of the new index and new colour (optional; zero when absent).</summary>
    public double[]? CovNewIndexColour { get; init; }

    public int Count => OldColour0.Length;
}

/// <summary>
/// Linear transformation from a new filter set to an old one, with colour terms:
/// C_old = A0 + A1 C_new and X_old = B0 + B1 X_new + B2 C_new (mag). Ensemble: bootstrap draws of
/// (A0, A1, B0, B1, B2) from resampling the common stars. RmsColour, RmsIndex: residual RMS (mag); IndexScatter:
/// scatter of the index transformation beyond the measurement errors (mag, in old-index units).
/// </summary>
public sealed record FilterTransform(
    double A0, double A1, double B0, double B1, double B2,
    double[] ColourCovariance, double[] IndexCovariance,
    double RmsColour, double RmsIndex, double IndexScatter, int Stars, double[][] Ensemble)
{
    public double OldColour(double newColour) => A0 + A1 * newColour;
    public double NewColour(double oldColour) => (oldColour - A0) / A1;
    public double OldIndex(double newIndex, double newColour) => B0 + B1 * newIndex + B2 * newColour;

    /// <summary>(A0, A1, B0, B1, B2) as an array, the layout of <see cref="Ensemble"/> rows.</summary>
    public double[] Parameters => [A0, A1, B0, B1, B2];

    internal static FilterTransform FromParameters(double[] q, FilterTransform template) =>
        template with { A0 = q[0], A1 = q[1], B0 = q[2], B1 = q[3], B2 = q[4] };
}
