using Photometallicity.Catalogues;
using Photometallicity.Errors;

namespace Photometallicity.Tests.Catalogues;

public class TableTest
{
    [Fact]
    public void Require_MissingColumn_ListsTheColumnsFound()
    {
        var t = new Table([new Column<double>("gmag", [1.0, 2.0]), new Column<long>("id", [1, 2])], "broad.csv");
        var e = Assert.Throws<InputException>(() => t.Require("imag", "bands.red.mag"));
        Assert.Equal("broad.csv: no column named 'imag' (asked for by config key 'bands.red.mag'); the columns found are: gmag, id", e.Message);
        Assert.Equal(2, e.ExitCode);
    }

    [Fact]
    public void Missing_IsMaskOrNaN()
    {
        var c = new Column<double>("x", [1.0, double.NaN, 3.0]);
        c.SetMissing(2);
        Assert.False(c.IsMissing(0));
        Assert.True(c.IsMissing(1));
        Assert.True(c.IsMissing(2));
        Assert.True(double.IsNaN(c.GetDouble(2)));
        var s = new Column<string>("s", ["a", null!]);
        Assert.True(s.IsMissing(1));
    }
}
