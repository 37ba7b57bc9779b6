using Photometallicity.Configuration;
using Photometallicity.Demo;
using Photometallicity.Errors;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Configuration;

public class ConfigLoaderTest
{
    private static string WriteConfig(TempDir dir, string text)
    {
        foreach (var f in new[] { "broad.csv", "narrow.csv", "standards.csv" }) File.WriteAllText(dir.File(f), "ra,dec\n1,2\n");
        DemoFilters.WriteTo(dir.Path);
        string p = dir.File("config.json");
        File.WriteAllText(p, text);
        return p;
    }

    private static string DemoConfig() => DemoWriter.ConfigText(new DemoTruth(), 5);

    [Fact]
    public void Load_DemoConfig_ResolvesPathsAndDefaults()
    {
        using var dir = new TempDir();
        var c = ConfigLoader.Load(WriteConfig(dir, DemoConfig()));
        Assert.Equal(dir.File("broad.csv"), c.Broadband.Path);
        Assert.Equal(5UL, c.Seed);
        Assert.Equal("b480", c.Blue.MagColumn);
        Assert.Equal(1.0, c.CrossMatch.RadiusArcsec);
        Assert.Equal(300, c.Calibration.Bootstrap);
        Assert.Equal(5UL, c.Calibration.Seed);
        Assert.Equal([99.999], c.Broadband.MissingValues);
        Assert.Equal(Path.Combine(dir.Path, "out"), c.Output.Directory);
        Assert.Equal(-4.5, c.Metallicity.GridMin);
    }

    [Fact]
    public void Load_UnknownKey_NamesItAndTheAllowedKeys()
    {
        using var dir = new TempDir();
        string p = WriteConfig(dir, DemoConfig().Replace("\"solve_offset\": true", "\"solve_offset\": true, \"radious\": 2"));
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.Equal($"{p}: unknown config key 'crossmatch.radious'; the keys allowed here are: radius_arcsec, solve_offset, solve_rotation", e.Message);
    }

    [Fact]
    public void Load_MissingRequiredKey_NamesIt()
    {
        using var dir = new TempDir();
        string p = WriteConfig(dir, DemoConfig().Replace("\"distance_modulus\": 21.2,", ""));
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.Equal($"{p}: config key 'target.distance_modulus' is required but missing", e.Message);
    }

    [Fact]
    public void Load_WrongType_NamesKeyAndWhatWasFound()
    {
        using var dir = new TempDir();
        string p = WriteConfig(dir, DemoConfig().Replace("\"bootstrap\": 300", "\"bootstrap\": \"many\""));
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.Equal($"{p}: config key 'calibration.bootstrap': expected an integer, found the string \"many\"", e.Message);
    }

    [Fact]
    public void Load_MissingFile_NamesKeyAndPath()
    {
        using var dir = new TempDir();
        string p = WriteConfig(dir, DemoConfig().Replace("narrow.csv", "nowhere.csv"));
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.StartsWith($"{p}: config key 'narrowband.path': file not found: nowhere.csv", e.Message);
    }

    [Fact]
    public void Load_OutOfRange_GivesTheAllowedRange()
    {
        using var dir = new TempDir();
        string p = WriteConfig(dir, DemoConfig().Replace("\"dec\": -38.47", "\"dec\": -98.47"));
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.Equal($"{p}: config key 'target.dec': value -98.47 is outside the allowed range [-90, 90]", e.Message);
    }

    [Theory]
    [InlineData("\"metallicity\": { \"domain\": \"box\" },", "config key 'metallicity.domain': must be \"extrapolate\" or \"hull\", not \"box\"")]
    [InlineData("\"metallicity\": { \"colour_reach\": 9 },", "config key 'metallicity.colour_reach': value 9 is outside the allowed range [0, 3]")]
    [InlineData("\"calibration\": { \"model\": \"spline\" },", "config key 'calibration.model': must be \"monotone\" or \"polynomial\", not \"spline\"")]
    [InlineData("\"calibration\": { \"knots\": 7 },", "config key 'calibration.knots': value 7 is outside the allowed range [0, 4]")]
    public void Load_CalibrationAndDomainKeys_NameTheKeyAndTheAllowedValues(string block, string message)
    {
        using var dir = new TempDir();
        string text = DemoConfig();
        string key = block[..block.IndexOf(':')];
        // Replace the demo's own block of that key (one line) with the test's.
        var lines = text.Split('\n').Where(l => !l.TrimStart().StartsWith(key, StringComparison.Ordinal)).ToList();
        int at = lines.FindIndex(l => l.TrimStart().StartsWith("\"target\"", StringComparison.Ordinal));
        lines.Insert(at, "  " + block);
        string p = WriteConfig(dir, string.Join('\n', lines));
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.Contains(message, e.Message);
    }

    [Fact]
    public void Load_CommentsAndTrailingCommas_AreAccepted()
    {
        using var dir = new TempDir();
        string p = WriteConfig(dir, DemoConfig().Replace("\"plots\"", "\"plots\"").Replace("\"formats\": [\"csv\", \"fits\"] }", "\"formats\": [\"csv\", \"fits\",], /* ok */ }"));
        Assert.Equal(["csv", "fits"], ConfigLoader.Load(p).Output.Formats);
    }

    [Fact]
    public void Load_NotJson_SaysSo()
    {
        using var dir = new TempDir();
        string p = WriteConfig(dir, "{ \"seed\": ");
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.StartsWith($"{p}: not valid JSON:", e.Message);
    }
}

public class ConfigLoaderMembershipTest
{
    [Fact]
    public void Load_IncompleteProperMotionColumns_AreAnError()
    {
        using var dir = new TempDir();
        foreach (var f in new[] { "broad.csv", "narrow.csv", "standards.csv" }) File.WriteAllText(dir.File(f), "ra,dec\n1,2\n");
        DemoFilters.WriteTo(dir.Path);
        string p = dir.File("config.json");
        File.WriteAllText(p, DemoWriter.ConfigText(new DemoTruth(), 5).Replace("\"use_metallicity\": true", "\"use_metallicity\": true, \"pm_ra\": \"pmra\""));
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.Equal($"{p}: config key 'membership': proper motions need all four of pm_ra, pm_dec, pm_ra_err, pm_dec_err (columns of the broadband catalogue, mas/yr)", e.Message);
    }
}
