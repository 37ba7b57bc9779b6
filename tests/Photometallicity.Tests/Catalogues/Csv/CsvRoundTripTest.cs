using Photometallicity.Catalogues;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Csv;

public class CsvRoundTripTest
{
    /// <summary>An invented table with every column type and missing values in each.</summary>
    internal static Table AllTypes()
    {
        var d = new Column<double>("d", [0.1 + 0.2, double.NaN, -0.0, 5e-324, 1.7976931348623157e308, 1e-7, 123456789.123456789, 3.0], unit: "mag");
        d.SetMissing(7);
        var f = new Column<float>("f", [0.1f, float.NaN, 3.4028235e38f, -1.5f, 1e-45f, 2f, 7.25f, 0f]);
        var l = new Column<long>("l", [long.MinValue, long.MaxValue, 0, -1, 42, 7, 8, 9]);
        l.SetMissing(6);
        var i = new Column<int>("i", [int.MinValue, int.MaxValue, 0, 1, 2, 3, 4, 5]);
        i.SetMissing(0);
        var s16 = new Column<short>("s16", [short.MinValue, short.MaxValue, 0, 1, 2, 3, 4, 5]);
        s16.SetMissing(2);
        var b = new Column<byte>("b", [0, 255, 1, 2, 3, 4, 5, 6]);
        b.SetMissing(3);
        var t = new Column<bool>("t", [true, false, true, false, true, false, true, false]);
        t.SetMissing(4);
        var s = new Column<string>("s", ["plain", null!, "", "a,b", "say \"hi\"", "two\nlines", " padded ", "#hash"], description: "free text");
        return new Table([d, f, l, i, s16, b, t, s], "memory");
    }

    [Fact]
    public void WriteRead_AllTypes_ValuesAndMissingSurvive()
    {
        using var dir = new TempDir();
        var original = AllTypes();
        string path = dir.File("all.csv");
        CatalogueIO.Write(original, path);
        var back = CatalogueIO.Read(path);

        Assert.Equal(original.RowCount, back.RowCount);
        Assert.Equal(original.Columns.Select(c => c.Name), back.Columns.Select(c => c.Name));
        // CSV keeps values, not storage types: floats come back as Double, small integers as Int64.
        Assert.Equal([ColumnType.Double, ColumnType.Double, ColumnType.Int64, ColumnType.Int64, ColumnType.Int64,
            ColumnType.Int64, ColumnType.Boolean, ColumnType.String], back.Columns.Select(c => c.Type));
        foreach (var c in original.Columns)
        {
            var r = back[c.Name];
            for (int row = 0; row < c.Length; row++)
            {
                Assert.Equal(c.IsMissing(row), r.IsMissing(row));
                if (c.IsMissing(row)) continue;
                if (c is Column<float> fc) Assert.Equal(fc.Values[row], (float)r.GetDouble(row));
                else if (c.Type == ColumnType.String || c.Type == ColumnType.Boolean) Assert.Equal(c.GetString(row), r.GetString(row));
                else if (c is Column<long> lc) Assert.Equal(lc.Values[row], ((Column<long>)r).Values[row]);
                else Assert.Equal(BitConverter.DoubleToInt64Bits(c.GetDouble(row)), BitConverter.DoubleToInt64Bits(r.GetDouble(row)));
            }
        }
        Assert.Null(back["d"].Unit); // CSV does not carry units (documented loss)
    }

    [Fact]
    public void Write_ExactText_LfNoBomQuotingAndRoundTripNumbers()
    {
        var t = new Table([
            new Column<string>("name", ["a,b", "", null!, " x", "q\"q"]),
            new Column<double>("v", [0.1 + 0.2, 1e300, double.NaN, -0.0, 2.0]),
            new Column<bool>("ok", [true, false, true, false, true], [false, false, true, false, false]),
        ]);
        string text = CsvFiles.ToCsv(t);
        Assert.Equal("name,v,ok\n\"a,b\",0.30000000000000004,true\n\"\",1E+300,false\n,,\n\" x\",-0.0,false\n\"q\"\"q\",2.0,true\n", text);
    }

    [Fact]
    public void WriteRead_FirstColumnNameStartingWithHash_IsNotTakenForAComment()
    {
        var t = new Table([new Column<long>("#id", [1, 2]), new Column<string>("s", [" a", "b "])]);
        string text = CsvFiles.ToCsv(t);
        Assert.Equal("\"#id\",s\n1,\" a\"\n2,\"b \"\n", text);
        var back = CsvFiles.Read(text);
        Assert.Equal(["#id", "s"], back.Columns.Select(c => c.Name));
        Assert.Equal((IEnumerable<string?>)[" a", "b "], ((Column<string>)back["s"]).Values);
    }

    [Fact]
    public void WriteRead_WholeNumberDoubles_StayDouble()
    {
        var t = new Table([new Column<double>("p", [0.0, 1.0, -3.0, 1e16]), new Column<float>("f", [2f, -0f, 1e20f, 7f])]);
        string text = CsvFiles.ToCsv(t);
        Assert.Equal("p,f\n0.0,2.0\n1.0,-0.0\n-3.0,1E+20\n10000000000000000.0,7.0\n", text);
        var back = CsvFiles.Read(text);
        Assert.Equal(ColumnType.Double, back["p"].Type);
        Assert.Equal([0.0, 1.0, -3.0, 1e16], back["p"].ToDoubleArray());
    }

    [Fact]
    public void Write_NoRowsNoColumns_IsEmpty()
    {
        Assert.Equal("", CsvFiles.ToCsv(new Table(0)));
        Assert.Equal("a,b\n", CsvFiles.ToCsv(new Table([new Column<double>("a", []), new Column<long>("b", [])])));
    }
}
