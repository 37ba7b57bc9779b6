namespace Photometallicity.Photometry;

/// <summary>
/// The prepared photometry of every broadband row, in input order (columnar). Magnitudes are dereddened and
/// zero-point corrected (mag). Colour C0 = blue0 - red0; index X0 = (narrow0 - blue0) - k C0.
/// Variances in mag^2. Entries are NaN where they cannot be computed; <see cref="Status"/> says why.
/// </summary>
public sealed class IndexPhotometry
{
    public required double[] Blue0 { get; init; }
    public required double[] Red0 { get; init; }
    public required double[] Narrow0 { get; init; }
    public required double[] Colour0 { get; init; }
    public required double[] Index0 { get; init; }
    public required double[] VarColour { get; init; }
    public required double[] VarIndex { get; init; }
    public required double[] CovIndexColour { get; init; }
    public required PhotometryStatus[] Status { get; init; }

    /// <summary>The colour coefficient k of the index.</summary>
    public required double ColourCoefficient { get; init; }

    public int Count => Colour0.Length;

    /// <summary>True when the star's index and colour can be used for [Fe/H].</summary>
    public bool IsUsable(int i) => Status[i] == PhotometryStatus.Ok;

    /// <summary>The flags that concern only the narrow band (the colour is unaffected by them).</summary>
    public const PhotometryStatus NarrowOnlyFlags =
        PhotometryStatus.NoNarrowMatch | PhotometryStatus.NarrowMissing | PhotometryStatus.NarrowErrorTooLarge;

    /// <summary>True when the star's dereddened colour and magnitudes can be used (e.g. for membership), whatever its narrow band.</summary>
    public bool HasUsableColour(int i) => (Status[i] & ~NarrowOnlyFlags) == PhotometryStatus.Ok;
}
