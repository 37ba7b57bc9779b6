using Photometallicity.Catalogues;
using Photometallicity.Errors;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues;

/// <summary>
/// Text read as <see cref="Utf8Column"/> (ReadOptions.CompactText) behaves as the same text read as strings: the same
/// values, missing against empty kept apart, the same bytes written to CSV, FITS and Parquet, the same id checks.
/// </summary>
public class Utf8ColumnTest
{
    private const string Csv = "id,x\nVD0000001,1\n\"\",2\n,3\n\"a,b\",4\nÅngström,5\n  padded  ,6\n";

    private static (Table Strings, Table Compact) ReadBoth(TempDir dir, string text = Csv)
    {
        string path = dir.File("in.csv");
        File.WriteAllText(path, text);
        var strings = CatalogueIO.Read(path, new ReadOptions { TextColumns = new HashSet<string> { "id" } });
        var compact = CatalogueIO.Read(path, new ReadOptions { TextColumns = new HashSet<string> { "id" }, CompactText = true });
        return (strings, compact);
    }

    [Fact]
    public void CompactText_SameValuesAsStrings()
    {
        using var dir = new TempDir();
        var (s, c) = ReadBoth(dir);
        Assert.IsType<Column<string>>(s["id"]);
        var u = Assert.IsType<Utf8Column>(c["id"]);
        Assert.Equal(s.RowCount, u.Length);
        for (int i = 0; i < u.Length; i++)
        {
            Assert.Equal(s["id"].GetString(i), u.GetString(i));
            Assert.Equal(s["id"].IsMissing(i), u.IsMissing(i));
        }
        Assert.Equal("", u.GetString(1));   // quoted empty: a value
        Assert.Null(u.GetString(2));        // empty cell: missing
        var picked = u.Select([0, 4]);
        Assert.Equal(new string?[] { "VD0000001", "Ångström" }, new[] { picked.GetString(0), picked.GetString(1) });
    }

    [Theory]
    [InlineData("out.csv")]
    [InlineData("out.fits")]
    [InlineData("out.parquet")]
    public void CompactText_WritesTheSameBytesAsStrings(string name)
    {
        using var dir = new TempDir();
        var (s, c) = ReadBoth(dir);
        string a = dir.File("a-" + name), b = dir.File("b-" + name);
        CatalogueIO.Write(s, a);
        CatalogueIO.Write(c, b);
        Assert.Equal(File.ReadAllBytes(a), File.ReadAllBytes(b));
    }

    [Fact]
    public void InvalidUtf8_IsReplacedAsStringDecodingWould()
    {
        using var dir = new TempDir();
        string path = dir.File("bad.csv");
        File.WriteAllBytes(path, [.. "id\n"u8, 0x41, 0xFF, 0x42, (byte)'\n']);
        var s = CatalogueIO.Read(path, new ReadOptions { TextColumns = new HashSet<string> { "id" } });
        var c = CatalogueIO.Read(path, new ReadOptions { TextColumns = new HashSet<string> { "id" }, CompactText = true });
        Assert.Equal(s["id"].GetString(0), c["id"].GetString(0));
        Assert.True(System.Text.Unicode.Utf8.IsValid(((Utf8Column)c["id"]).Utf8(0)));
    }

    [Theory]
    [InlineData("id,ra,dec\nA,1,1\nB,2,2\nA,3,3\nB,4,4\n")]
    [InlineData("id,ra,dec\nA,1,1\nB,2,2\nB,3,3\nA,4,4\n")]
    [InlineData("id,ra,dec\nA,1,1\n,2,2\nA,3,3\n")]
    public void UniqueIds_SameFirstErrorAsStrings(string text)
    {
        using var dir = new TempDir();
        var (s, c) = ReadBoth(dir, text);
        var es = Assert.Throws<InputException>(() => PositionValidation.RequireUniqueIds(s, "id"));
        var ec = Assert.Throws<InputException>(() => PositionValidation.RequireUniqueIds(c, "id"));
        Assert.Equal(es.Message, ec.Message);
    }

    [Fact]
    public void Gather_NegativeRowsAreMissing()
    {
        var src = new Column<string>("n", ["x", "yy", "zzz"]);
        var g = Utf8Column.Gather("g", src, [2, -1, 0, 1]);
        Assert.Equal(["zzz", null, "x", "yy"], Enumerable.Range(0, 4).Select(g.GetString));
    }
}
