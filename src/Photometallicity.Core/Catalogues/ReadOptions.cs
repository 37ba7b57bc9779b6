namespace Photometallicity.Catalogues;

/// <summary>How to read a catalogue file.</summary>
public sealed record ReadOptions
{
    public static ReadOptions Default { get; } = new();

    /// <summary>Numeric values that mean "no measurement" (for example 99.999 or -99); read as missing.</summary>
    public IReadOnlyList<double> MissingSentinels { get; init; } = Array.Empty<double>();

    /// <summary>FITS only: the EXTNAME of the table extension to read; null reads the first table extension.</summary>
    public string? Extension { get; init; }

    /// <summary>
    /// CSV only: columns forced to be read as text (ids, names). Other CSV columns are typed by their content:
    /// all-integer columns become Int64, numeric ones Double, true/false ones Boolean, anything else String.
    /// </summary>
    public IReadOnlySet<string> TextColumns { get; init; } = new HashSet<string>();

    /// <summary>
    /// CSV only: columns that must be numeric; a non-numeric cell in one of them is an error naming the row.
    /// </summary>
    public IReadOnlySet<string> NumericColumns { get; init; } = new HashSet<string>();
}
