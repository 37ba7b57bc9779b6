using System.Security.Cryptography;

namespace Photometallicity.Reporting;

/// <summary>One input file of the run: its path as the user gave it, how many data rows were read, its SHA-256.</summary>
public sealed record InputFileEntry(string Path, long? Rows, string Sha256, string? Role = null)
{
    /// <summary>An entry for a file on disk, its SHA-256 (lower-case hex) computed here.</summary>
    public static InputFileEntry FromFile(string path, long? rows, string? role = null)
    {
        using var stream = File.OpenRead(path);
        return new InputFileEntry(path, rows, Convert.ToHexStringLower(SHA256.HashData(stream)), role);
    }
}

/// <summary>One file the run wrote.</summary>
public sealed record OutputFileEntry(string Path, string? Description = null);

/// <summary>
/// One headline number: label, value, 1-sigma uncertainty (null: none) and unit (empty: dimensionless).
/// <paramref name="Format"/> is a .NET numeric format for value and uncertainty (e.g. "0.000"); null rounds
/// the uncertainty to two significant figures and the value to the same decimal place (common practice).
/// </summary>
public sealed record KeyNumber(string Label, double Value, double? Uncertainty, string Unit, string? Format = null);

/// <summary>A figure of the page: the PNG file (embedded in HTML, linked from Markdown) and its caption.</summary>
public sealed record FigureEntry(string PngPath, string Caption, string? Title = null);

/// <summary>
/// How the run was made: software version, master seed, named settings (e.g. derived seeds, thread count),
/// the resolved configuration as text, and a time stamp only if the caller passes one (the page is otherwise
/// a pure function of its data).
/// </summary>
public sealed record ProvenanceInfo(
    string SoftwareVersion,
    long? MasterSeed,
    IReadOnlyList<KeyValuePair<string, string>> Settings,
    string? ConfigText = null,
    string? GeneratedAt = null);

/// <summary>Everything the summary page shows.</summary>
public sealed record SummaryPageData(
    string Title,
    IReadOnlyList<InputFileEntry> Inputs,
    IReadOnlyList<OutputFileEntry> Outputs,
    IReadOnlyList<string> Warnings,
    IReadOnlyList<KeyNumber> KeyNumbers,
    IReadOnlyList<FigureEntry> Figures,
    ProvenanceInfo Provenance)
{
    /// <summary>A line under the title (e.g. the target's name), or null.</summary>
    public string? Subtitle { get; init; }
}
