namespace Photometallicity.Catalogues.Parquet;

/// <summary>Reads a Parquet table file into a <see cref="Table"/>. (Placeholder until the Parquet reader lands.)</summary>
public static class ParquetTableReader
{
    public static Table Read(string path, ReadOptions options) =>
        throw new NotImplementedException("Parquet reading is not implemented yet");
}
