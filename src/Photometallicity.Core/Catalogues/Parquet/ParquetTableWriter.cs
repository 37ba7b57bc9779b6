namespace Photometallicity.Catalogues.Parquet;

/// <summary>Writes a <see cref="Table"/> as Parquet. (Placeholder until the Parquet writer lands.)</summary>
public static class ParquetTableWriter
{
    public static void Write(Table table, Stream stream) => throw new NotImplementedException("Parquet writing is not implemented yet");
}
