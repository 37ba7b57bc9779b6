using System.Text.Json;
using Photometallicity.Photometry.Extinction;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Photometry;

public class ExtinctionCommandTest
{
    private static readonly string Narrow = RepoPaths.Calibration("filters", "invented_narrow_n395.csv");

    [Fact]
    public void Json_HasTheThreeKeysAndMatchesTheLibrary()
    {
        var r = CliRun.Invoke("extinction", "--curve", Narrow, "--law", "ccm89", "--rv", "3.1", "--json");
        Assert.Equal(0, r.ExitCode);
        using var doc = JsonDocument.Parse(r.Out);
        var expected = BandExtinction.Compute(FilterCurve.Load(Narrow), new CardelliClaytonMathis1989(), 3.1);
        Assert.Equal(expected.AOverEbv, doc.RootElement.GetProperty("a_over_ebv").GetDouble(), 12);
        Assert.Equal(expected.AOverAv, doc.RootElement.GetProperty("a_over_av").GetDouble(), 12);
        Assert.Equal(expected.LambdaEffAngstrom, doc.RootElement.GetProperty("lambda_eff_angstrom").GetDouble(), 9);
    }

    [Fact]
    public void Text_DefaultLawIsFitzpatrick99()
    {
        var r = CliRun.Invoke("extinction", "--curve", Narrow);
        Assert.Equal(0, r.ExitCode);
        double expected = BandExtinction.Compute(FilterCurve.Load(Narrow), new Fitzpatrick1999(), 3.1).AOverEbv;
        Assert.Contains($"a_over_ebv {expected:F4}", r.Out);
        Assert.Contains("lambda_eff_angstrom", r.Out);
        Assert.Contains("fitzpatrick99", r.Error);
    }

    [Fact]
    public void Help_NamesTheDefaultLaw()
    {
        var r = CliRun.Invoke("extinction", "--help");
        Assert.Contains("default fitzpatrick99", r.Out);
    }

    [Fact]
    public void BadInput_ExitsTwo()
    {
        Assert.Equal(2, CliRun.Invoke("extinction", "--curve", Narrow, "--law", "nope").ExitCode);
        Assert.Equal(2, CliRun.Invoke("extinction", "--curve", Narrow, "--rv", "0").ExitCode);
        Assert.Equal(2, CliRun.Invoke("extinction", "--curve", "/nonexistent/curve.csv").ExitCode);
        Assert.Equal(2, CliRun.Invoke("extinction").ExitCode);
    }
}
