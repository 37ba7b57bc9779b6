namespace Photometallicity.Catalogues.Csv;

/// <summary>Writes a <see cref="Table"/> as CSV. (Placeholder until the CSV writer lands.)</summary>
public static class CsvTableWriter
{
    public static void Write(Table table, Stream stream) => throw new NotImplementedException("CSV writing is not implemented yet");
}
