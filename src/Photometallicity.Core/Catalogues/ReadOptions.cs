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

    /// <summary>
    /// The columns to keep; null keeps every column. The others are skipped while the file is read (a CSV cell of a
    /// skipped column is never parsed or stored; the row still must have every field), so that a wide catalogue costs only
    /// the memory of the columns a run uses. A named column the file lacks is not an error here: <see cref="Table.Require"/>
    /// reports it, listing every column of the file.
    /// </summary>
    public IReadOnlySet<string>? Columns { get; init; }

    /// <summary>
    /// CSV only: the <see cref="TextColumns"/> are read as <see cref="Utf8Column"/>s (UTF-8 bytes, ~13 bytes a row for a short
    /// id instead of ~48 as strings) instead of columns of strings.
    /// </summary>
    public bool CompactText { get; init; }

    /// <summary>True when column <paramref name="name"/> is to be kept.</summary>
    public bool Keeps(string name) => Columns is null || Columns.Contains(name);
}
