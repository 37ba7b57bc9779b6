using Photometallicity.Catalogues;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Fits;

/// <summary>Write then read: every column type, missing values, units, descriptions and metadata survive.</summary>
public class FitsRoundTripTest
{
    private static Table RoundTrip(Table table, WriteOptions? write = null, ReadOptions? read = null)
    {
        using var dir = new TempDir();
        string path = dir.File("t.fits");
        CatalogueIO.Write(table, path, write);
        return CatalogueIO.Read(path, read);
    }

    private static Table AllTypes()
    {
        var mask = new[] { false, true, false, false };
        return new Table(
        [
            new Column<double>("gmag", [21.5, double.NaN, -0.0, double.MaxValue], unit: "mag", description: "g-band magnitude (invented)"),
            new Column<float>("gerr", [0.01f, float.NaN, 1e-30f, 3.5f], unit: "mag"),
            new Column<long>("src", [long.MaxValue, 0, -5, 42], (bool[])mask.Clone()),
            new Column<int>("n", [int.MaxValue, 7, -1, 0], (bool[])mask.Clone(), unit: "count"),
            new Column<short>("flag", [short.MaxValue, 1, -2, 3], (bool[])mask.Clone()),
            new Column<byte>("nb", [0, 255, 254, 3], new[] { false, false, true, false }),
            new Column<bool>("good", [true, false, true, false], new[] { false, false, false, true }),
            new Column<string>("name", ["star-1", null!, "", "it's a very long name"], description: "invented star name"),
        ], "memory");
    }

    [Fact]
    public void Write_Read_EveryColumnTypeWithMissingValuesAndUnits()
    {
        var original = AllTypes();
        var back = RoundTrip(original);
        Assert.Equal(4, back.RowCount);
        Assert.Equal(original.Columns.Select(c => (c.Name, c.Type, c.Unit)), back.Columns.Select(c => (c.Name, c.Type, c.Unit)));
        foreach (var c in original.Columns)
        {
            var b = back[c.Name];
            for (int r = 0; r < 4; r++)
            {
                Assert.Equal(c.IsMissing(r), b.IsMissing(r));
                Assert.Equal(c.GetString(r), b.GetString(r));
            }
        }
        Assert.Equal("g-band magnitude (invented)", back["gmag"].Description);
        Assert.Equal("invented star name", back["name"].Description);
        Assert.Null(back["gerr"].Description);
        // -0.0 keeps its sign bit (IEEE 754 bytes are copied as they are).
        Assert.True(double.IsNegative(((Column<double>)back["gmag"]).Values[2]));
    }

    [Fact]
    public void Write_Read_EmptyStringIsPresentMissingStringIsMissing()
    {
        var back = RoundTrip(AllTypes());
        Assert.Equal("", back["name"].GetString(2));
        Assert.True(back["name"].IsMissing(1));
        Assert.Equal("it's a very long name", back["name"].GetString(3));
    }

    [Fact]
    public void Write_IntegerTnullAvoidsValuesInUse()
    {
        // short.MinValue is a real value here, so the writer must pick another TNULL.
        var t = new Table([new Column<short>("q", [short.MinValue, 5, 0], new[] { false, true, false })]);
        var back = RoundTrip(t);
        Assert.Equal(ColumnType.Int16, back["q"].Type);
        Assert.Equal(short.MinValue, ((Column<short>)back["q"]).Values[0]);
        Assert.True(back["q"].IsMissing(1));
        Assert.False(back["q"].IsMissing(0));
    }

    [Fact]
    public void Write_ByteColumnUsingAll256ValuesAndMissing_IsWrittenAsInt16()
    {
        var v = Enumerable.Range(0, 257).Select(i => (byte)(i % 256)).ToArray();
        var m = new bool[257];
        m[256] = true;
        var back = RoundTrip(new Table([new Column<byte>("b", v, m)]));
        Assert.Equal(ColumnType.Int16, back["b"].Type);
        for (int i = 0; i < 256; i++) Assert.Equal(i, back["b"].GetDouble(i));
        Assert.True(back["b"].IsMissing(256));
    }

    [Fact]
    public void Write_NoMissingIntegers_WritesNoTnull()
    {
        using var dir = new TempDir();
        string path = dir.File("t.fits");
        CatalogueIO.Write(new Table([new Column<int>("n", [1, 2, 3])]), path);
        string header = System.Text.Encoding.ASCII.GetString(File.ReadAllBytes(path), 2880, 2880);
        Assert.DoesNotContain("TNULL", header);
    }

    [Fact]
    public void Write_Read_MetadataKeywords()
    {
        var t = new Table([new Column<double>("x", [1.0])]);
        t.Metadata.Add(("OBJECT", "Invented Dwarf I", "an invented galaxy"));
        t.Metadata.Add(("SEED", "42", null));
        t.Metadata.Add(("RADIUS", "1.5E-03", "arcsec"));
        t.Metadata.Add(("DONE", "T", null));
        t.Metadata.Add(("QUOTE", "it's", null));
        t.Metadata.Add(("LONGTEXT", new string('a', 100) + "'" + new string('b', 100), null));
        t.Metadata.Add(("photometallicity.version", "0.1.0", null));
        t.Metadata.Add(("COMMENT", "invented demonstration data", null));
        t.Metadata.Add(("HISTORY", "step one", null));
        t.Metadata.Add(("NAXIS1", "999", null)); // structural: the writer makes its own
        t.Metadata.Add(("bad=key", "x", null)); // cannot be written: skipped
        var back = RoundTrip(t);
        Assert.Equal(
        [
            ("OBJECT", "Invented Dwarf I", "an invented galaxy"),
            ("SEED", "42", null),
            ("RADIUS", "1.5E-03", "arcsec"),
            ("DONE", "T", null),
            ("QUOTE", "it's", null),
            ("LONGTEXT", new string('a', 100) + "'" + new string('b', 100), null),
            ("photometallicity.version", "0.1.0", null),
            ("COMMENT", "invented demonstration data", null),
            ("HISTORY", "step one", null),
        ], back.Metadata);
    }

    [Fact]
    public void Write_Read_ExtensionName()
    {
        using var dir = new TempDir();
        string path = dir.File("t.fits");
        CatalogueIO.Write(new Table([new Column<double>("x", [1.0])]), path, new WriteOptions { ExtensionName = "STARS" });
        Assert.Equal(1, CatalogueIO.Read(path, new ReadOptions { Extension = "stars" }).RowCount);
    }

    [Fact]
    public void Write_Read_ZeroRowsAndManyRows()
    {
        Assert.Equal(0, RoundTrip(new Table([new Column<double>("x", []), new Column<string>("s", [])])).RowCount);
        // More rows than one 4 MB chunk, so that chunk boundaries are crossed.
        int n = 300_000;
        var x = Enumerable.Range(0, n).Select(i => i * 0.5).ToArray();
        var id = Enumerable.Range(0, n).Select(i => (long)i * 3).ToArray();
        var back = RoundTrip(new Table([new Column<double>("x", x), new Column<long>("id", id)]));
        Assert.Equal(x, ((Column<double>)back["x"]).Values);
        Assert.Equal(id, ((Column<long>)back["id"]).Values);
    }

    [Fact]
    public void Write_FileIsWholeBlocksAndStartsWithSimple()
    {
        using var dir = new TempDir();
        string path = dir.File("t.fits");
        CatalogueIO.Write(AllTypes(), path);
        var bytes = File.ReadAllBytes(path);
        Assert.Equal(0, bytes.Length % 2880);
        Assert.StartsWith("SIMPLE  =                    T", System.Text.Encoding.ASCII.GetString(bytes, 0, 80));
        string header = System.Text.Encoding.ASCII.GetString(bytes, 2880, 2880);
        Assert.StartsWith("XTENSION= 'BINTABLE'", header);
        // The description goes to TCOMMn and, cut to fit, to the comment of TTYPEn.
        Assert.Contains("TTYPE1  = 'gmag    '           / g-band magnitude (invented)", header);
        Assert.Contains("TCOMM1  = 'g-band magnitude (invented)'", header);
        Assert.Contains("TUNIT1  = 'mag     '", header);
    }

    [Fact]
    public void Read_MissingSentinels_MaskNumericValues()
    {
        var t = new Table([new Column<double>("m", [99.999, 20.0]), new Column<float>("f", [99.999f, 1f]), new Column<int>("i", [-99, 3])]);
        var back = RoundTrip(t, read: new ReadOptions { MissingSentinels = [99.999, -99] });
        Assert.True(back["m"].IsMissing(0));
        Assert.True(back["f"].IsMissing(0));
        Assert.True(back["i"].IsMissing(0));
        Assert.False(back["m"].IsMissing(1) || back["f"].IsMissing(1) || back["i"].IsMissing(1));
    }
}
