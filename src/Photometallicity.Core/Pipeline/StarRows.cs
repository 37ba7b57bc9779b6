namespace Photometallicity.Pipeline;

/// <summary>
/// The per-star products of a run, one entry per broadband input row in input order (columnar, plain arrays).
/// NaN (or null) where a value does not exist for the row; <see cref="Status"/> says why.
/// </summary>
public sealed class StarRows
{
    /// <summary>
    /// The broadband id of every row, as a text column (usually the input's own <see cref="Catalogues.Utf8Column"/>, shared
    /// rather than copied into a string per row; the row number when the config names no id column).
    /// </summary>
    public required Catalogues.Column Id { get; init; }
    public required double[] Ra { get; init; }
    public required double[] Dec { get; init; }

    /// <summary>The narrow-band partner's id per row (missing without a partner), a text column.</summary>
    public required Catalogues.Column NarrowId { get; init; }
    public required double[] MatchSepArcsec { get; init; }
    public required int[] MatchFlag { get; init; }
    public required double[] Blue0 { get; init; }
    public required double[] Red0 { get; init; }
    public required double[] Narrow0 { get; init; }
    public required double[] Colour0 { get; init; }
    public required double[] Colour0Err { get; init; }
    public required double[] Index0 { get; init; }
    public required double[] Index0Err { get; init; }
    public required double[] CovIndexColour { get; init; }
    public required double[] Feh { get; init; }
    public required double[] FehLo { get; init; }
    public required double[] FehHi { get; init; }
    public required double[] PMember { get; init; }
    public required string[] Status { get; init; }

    /// <summary>[Fe/H] under the dwarf calibration (median, 16th, 84th percentile), when there is one.</summary>
    public double[]? FehDwarf { get; init; }
    public double[]? FehDwarfLo { get; init; }
    public double[]? FehDwarfHi { get; init; }

    public int Count => Ra.Length;
}
