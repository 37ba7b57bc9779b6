using Photometallicity.Catalogues;
using Photometallicity.Catalogues.Csv;
using Photometallicity.Errors;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues;

/// <summary>
/// <see cref="ReadOptions.Columns"/>: every format keeps only the named columns, with the same values as a full read;
/// a missing column is still reported with every column of the file. Plus the block storage of the CSV reader across
/// block boundaries and the typed <see cref="Column.ToDoubleArray"/>.
/// </summary>
public class ColumnSelectionTest
{
    private static Table Sample(int n)
    {
        var id = new string[n]; var a = new double[n]; var b = new long[n]; var c = new double[n];
        for (int i = 0; i < n; i++) { id[i] = "S" + i; a[i] = i * 0.25 - 3; b[i] = i * 7; c[i] = i % 5 == 0 ? double.NaN : i; }
        return new Table([new Column<string>("id", id), new Column<double>("a", a), new Column<long>("b", b), new Column<double>("c", c)]);
    }

    [Theory]
    [InlineData("t.csv")]
    [InlineData("t.fits")]
    [InlineData("t.parquet")]
    public void Read_WithColumns_KeepsOnlyThoseWithTheSameValues(string name)
    {
        using var dir = new TempDir();
        string path = dir.File(name);
        CatalogueIO.Write(Sample(300), path);
        var full = CatalogueIO.Read(path, new ReadOptions { TextColumns = new HashSet<string> { "id" } });
        var some = CatalogueIO.Read(path, new ReadOptions { TextColumns = new HashSet<string> { "id" }, Columns = new HashSet<string> { "c", "id" } });
        Assert.Equal(["id", "c"], some.Columns.Select(x => x.Name));
        Assert.Equal(300, some.RowCount);
        Assert.Equal(full.RequireDoubles("c"), some.RequireDoubles("c"));
        Assert.Equal(Enumerable.Range(0, 300).Select(i => full["id"].GetString(i)), Enumerable.Range(0, 300).Select(i => some["id"].GetString(i)));
        var e = Assert.Throws<InputException>(() => some.Require("a2", "bands.blue.mag"));
        Assert.Contains("the columns found are: id, a, b, c", e.Message);
    }

    [Fact]
    public void Csv_WithNoColumnKept_StillCountsTheRowsAndChecksThem()
    {
        using var dir = new TempDir();
        string path = dir.File("t.csv");
        File.WriteAllText(path, "a,b\n1,2\n3,4\n");
        Assert.Equal(2, CatalogueIO.Read(path, new ReadOptions { Columns = new HashSet<string>() }).RowCount);
        File.WriteAllText(path, "a,b\n1,2\n3\n");
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(path, new ReadOptions { Columns = new HashSet<string> { "a" } }));
        Assert.Contains("row 2: the row has 1 field but the header has 2 columns", e.Message);
    }

    [Fact]
    public void Csv_ColumnsAcrossBlockBoundaries_ReadBackExactly()
    {
        // 150 000 rows span three 65 536-element blocks; a late text cell turns an integer column into text (backfill),
        // a late real turns an integer column into reals, missing cells fall on both sides of a boundary.
        const int n = 150_000;
        using var dir = new TempDir();
        string path = dir.File("big.csv");
        using (var w = new StreamWriter(path))
        {
            w.Write("i,late_text,late_real,gaps\n");
            for (int r = 0; r < n; r++)
            {
                string txt = r == n - 1 ? "x7" : (r % 1000).ToString("D3");
                string re = r == 100_000 ? "0.5" : r.ToString();
                string gap = r is 65_535 or 65_536 or 131_071 ? "" : (r * 0.5).ToString("R", System.Globalization.CultureInfo.InvariantCulture);
                w.Write($"{r},{txt},{re},{gap}\n");
            }
        }
        var t = CsvTableReader.Read(path, ReadOptions.Default);
        Assert.Equal(n, t.RowCount);
        var i = (Column<long>)t["i"];
        Assert.Equal(Enumerable.Range(0, n).Select(r => (long)r), i.Values);
        var text = (Column<string>)t["late_text"];
        Assert.Equal("000", text[0]);
        Assert.Equal("999", text[65_999]);
        Assert.Equal("x7", text[n - 1]);
        var real = (Column<double>)t["late_real"];
        Assert.Equal(0.5, real[100_000]);
        Assert.Equal(149_999.0, real[n - 1]);
        var gaps = t.RequireDoubles("gaps");
        Assert.True(double.IsNaN(gaps[65_535]) && double.IsNaN(gaps[65_536]) && double.IsNaN(gaps[131_071]));
        Assert.Equal(65_537 * 0.5, gaps[65_537]);
    }

    [Fact]
    public void ToDoubleArray_MatchesGetDoubleForEveryType()
    {
        var cols = new Column[]
        {
            new Column<double>("d", [1.5, double.NaN, -2], [false, false, true]),
            new Column<float>("f", [1.25f, float.NaN, 3]),
            new Column<long>("l", [long.MaxValue, -4, 0], [false, true, false]),
            new Column<int>("n", [7, -8, 9]),
            new Column<short>("s", [1, 2, 3]),
            new Column<bool>("b", [true, false, true]),
            new Column<string>("t", ["1.5", "x", null!]),
        };
        foreach (var c in cols)
            Assert.Equal(Enumerable.Range(0, c.Length).Select(c.GetDouble), c.ToDoubleArray());
    }
}
