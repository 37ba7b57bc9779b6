using Photometallicity.Errors;

namespace Photometallicity.Catalogues;

/// <summary>The table file formats, chosen by file extension.</summary>
public enum TableFormat
{
    Csv,
    Fits,
    Parquet,
}

/// <summary>Maps file names to formats.</summary>
public static class TableFormats
{
    public const string Known = ".csv, .fits (also .fit, .fts), .parquet";

    public static TableFormat FromPath(string path)
    {
        string ext = Path.GetExtension(path).ToLowerInvariant();
        return ext switch
        {
            ".csv" => TableFormat.Csv,
            ".fits" or ".fit" or ".fts" => TableFormat.Fits,
            ".parquet" => TableFormat.Parquet,
            _ => throw new InputException($"unknown table format '{ext}'; the known extensions are {Known}", path),
        };
    }
}
