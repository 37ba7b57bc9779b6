using System.Text;
using Photometallicity.Catalogues;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Csv;

/// <summary>Small CSV files written byte for byte into a scratch directory, and read back through CatalogueIO.</summary>
internal static class CsvFiles
{
    public static string Write(TempDir dir, string text, string name = "t.csv", bool bom = false)
    {
        string path = dir.File(name);
        var bytes = Encoding.UTF8.GetBytes(text);
        File.WriteAllBytes(path, bom ? [0xEF, 0xBB, 0xBF, .. bytes] : bytes);
        return path;
    }

    public static Table Read(string text, ReadOptions? options = null, bool bom = false)
    {
        using var dir = new TempDir();
        return CatalogueIO.Read(Write(dir, text, bom: bom), options);
    }

    public static string ToCsv(Table table)
    {
        using var ms = new MemoryStream();
        Photometallicity.Catalogues.Csv.CsvTableWriter.Write(table, ms);
        return Encoding.UTF8.GetString(ms.ToArray());
    }
}
