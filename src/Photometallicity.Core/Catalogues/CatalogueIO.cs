using Photometallicity.Catalogues.Csv;
using Photometallicity.Catalogues.Fits;
using Photometallicity.Catalogues.Parquet;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues;

/// <summary>The one entry point for reading and writing catalogue files; the format follows the extension.</summary>
public static class CatalogueIO
{
    public static Table Read(string path, ReadOptions? options = null)
    {
        options ??= ReadOptions.Default;
        var format = TableFormats.FromPath(path);
        if (!File.Exists(path)) throw new InputException("file not found", path);
        if (new FileInfo(path).Length == 0) throw new InputException("file is empty", path);
        return format switch
        {
            TableFormat.Csv => CsvTableReader.Read(path, options),
            TableFormat.Fits => FitsTableReader.Read(path, options),
            TableFormat.Parquet => ParquetTableReader.Read(path, options),
            _ => throw new InvalidOperationException(),
        };
    }

    /// <summary>Writes atomically: a temporary file renamed into place when complete.</summary>
    public static void Write(Table table, string path, WriteOptions? options = null)
    {
        options ??= WriteOptions.Default;
        var format = TableFormats.FromPath(path);
        AtomicFile.Write(path, stream =>
        {
            switch (format)
            {
                case TableFormat.Csv: CsvTableWriter.Write(table, stream); break;
                case TableFormat.Fits: FitsTableWriter.Write(table, stream, options); break;
                case TableFormat.Parquet: ParquetTableWriter.Write(table, stream); break;
            }
        });
    }
}
