using Photometallicity.Errors;

namespace Photometallicity.Photometry;

/// <summary>
/// Options of the photometric preparation. Extinction coefficients are A_band/E(B-V) (dimensionless; from a
/// number in the config or from <see cref="Extinction.BandExtinction"/>); zero-point offsets (mag) are added to the
/// catalogue magnitudes before dereddening; k is the index colour coefficient, X = (narrow - blue) - k (blue - red);
/// a band whose error exceeds its maximum (mag; default 0.3, common practice for "a usable detection") flags the
/// star; an optional dereddened colour window [ColourMin, ColourMax] (mag) flags stars outside it.
/// </summary>
public sealed record PhotometryOptions
{
    public const double DefaultMaxError = 0.3;

    public required BandValues ExtinctionCoefficients { get; init; }
    public BandValues ZeroPoints { get; init; } = BandValues.All(0.0);
    public required double ColourCoefficient { get; init; }
    public BandValues MaxError { get; init; } = BandValues.All(DefaultMaxError);
    public double? ColourMin { get; init; }
    public double? ColourMax { get; init; }

    /// <summary>InputException naming the option when a value is not allowed.</summary>
    public void Validate()
    {
        Finite(ExtinctionCoefficients, "extinction");
        Finite(ZeroPoints, "zero_point");
        Finite(MaxError, "max_error");
        if (!(MaxError.Blue > 0 && MaxError.Red > 0 && MaxError.Narrow > 0))
            throw new InputException($"max_error must be positive in every band, got blue {MaxError.Blue}, red {MaxError.Red}, narrow {MaxError.Narrow}");
        if (ExtinctionCoefficients.Blue < 0 || ExtinctionCoefficients.Red < 0 || ExtinctionCoefficients.Narrow < 0)
            throw new InputException("extinction coefficients A/E(B-V) must not be negative");
        if (!double.IsFinite(ColourCoefficient))
            throw new InputException($"colour_coefficient k = {ColourCoefficient} is not a finite number");
        if (ColourMin is double lo && !double.IsFinite(lo)) throw new InputException($"colour_min = {lo} is not finite");
        if (ColourMax is double hi && !double.IsFinite(hi)) throw new InputException($"colour_max = {hi} is not finite");
        if (ColourMin is double a && ColourMax is double b && !(a < b))
            throw new InputException($"colour range: colour_min = {a} must be below colour_max = {b}");
    }

    private static void Finite(BandValues v, string name)
    {
        if (!double.IsFinite(v.Blue) || !double.IsFinite(v.Red) || !double.IsFinite(v.Narrow))
            throw new InputException($"{name}: every band needs a finite value, got blue {v.Blue}, red {v.Red}, narrow {v.Narrow}");
    }
}
