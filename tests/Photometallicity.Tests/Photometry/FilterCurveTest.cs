using Photometallicity.Errors;
using Photometallicity.Photometry.Extinction;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Photometry;

public class FilterCurveTest
{
    private static string Write(TempDir dir, string text)
    {
        string path = dir.File("curve.csv");
        File.WriteAllText(path, text);
        return path;
    }

    [Fact]
    public void Load_ReadsCommentsHeaderAndSeparators()
    {
        using var dir = new TempDir();
        var c = FilterCurve.Load(Write(dir, "# invented\n\nwavelength_angstrom,transmission\n4000,0.1\n4010 0.5\n4020;0.2\n"));
        Assert.Equal(3, c.Count);
        Assert.Equal([4000.0, 4010.0, 4020.0], c.WavelengthAngstrom);
        Assert.Equal(0.5, c.Transmission[1]);
        Assert.Equal("curve", c.Name);
    }

    [Fact]
    public void Load_NonIncreasingWavelengthNamesFileAndRow()
    {
        using var dir = new TempDir();
        string path = Write(dir, "# c\n4000,0.1\n4010,0.5\n4010,0.2\n");
        var e = Assert.Throws<InputException>(() => FilterCurve.Load(path));
        Assert.Equal(path, e.File);
        Assert.Equal(3, e.Row);
        Assert.Contains("increase", e.Message);
        Assert.Contains("line 4", e.Message);
    }

    [Fact]
    public void Load_NegativeTransmission()
    {
        using var dir = new TempDir();
        var e = Assert.Throws<InputException>(() => FilterCurve.Load(Write(dir, "4000,0.1\n4010,-0.5\n4020,0.2\n")));
        Assert.Equal(2, e.Row);
        Assert.Contains("negative", e.Message);
    }

    [Fact]
    public void Load_BadRowNamesRow()
    {
        using var dir = new TempDir();
        var e = Assert.Throws<InputException>(() => FilterCurve.Load(Write(dir, "w,t\n4000,0.1\n4010,abc\n4020,0.2\n")));
        Assert.Equal(2, e.Row);
        e = Assert.Throws<InputException>(() => FilterCurve.Load(Write(dir, "4000,0.1\n4010,0.3,7\n4020,0.2\n")));
        Assert.Contains("expected 2 values", e.Message);
    }

    [Fact]
    public void Load_TooFewPointsOrMissingFile()
    {
        using var dir = new TempDir();
        var e = Assert.Throws<InputException>(() => FilterCurve.Load(Write(dir, "4000,0.1\n4010,0.5\n")));
        Assert.Contains("at least 3", e.Message);
        Assert.Throws<InputException>(() => FilterCurve.Load(dir.File("nope.csv")));
        Assert.Throws<InputException>(() => FilterCurve.Load(Write(dir, "4000,0\n4010,0\n4020,0\n")));
    }

    [Theory]
    [InlineData("invented_blue_b480.csv", 4000, 5600, 80)]
    [InlineData("invented_red_r770.csv", 6900, 8600, 80)]
    [InlineData("invented_narrow_n395.csv", 3900, 4000, 10)]
    public void ShippedCurves_HaveTheirDocumentedHalfPowerRange(string file, double lo, double hi, double tol)
    {
        var c = FilterCurve.Load(RepoPaths.Calibration("filters", file));
        double peak = c.Transmission.Max();
        var above = Enumerable.Range(0, c.Count).Where(i => c.Transmission[i] >= 0.5 * peak).Select(i => c.WavelengthAngstrom[i]).ToArray();
        Assert.InRange(above.First(), lo - tol, lo + tol);
        Assert.InRange(above.Last(), hi - tol, hi + tol);
        Assert.Contains("INVENTED", File.ReadLines(RepoPaths.Calibration("filters", file)).First());
    }
}
