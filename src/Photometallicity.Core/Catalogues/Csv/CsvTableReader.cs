namespace Photometallicity.Catalogues.Csv;

/// <summary>Reads a Csv table file into a <see cref="Table"/>. (Placeholder until the Csv reader lands.)</summary>
public static class CsvTableReader
{
    public static Table Read(string path, ReadOptions options) =>
        throw new NotImplementedException("Csv reading is not implemented yet");
}
