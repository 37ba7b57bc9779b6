using Photometallicity.Calibration;
using Photometallicity.Configuration;
using Photometallicity.Demo;
using Photometallicity.Errors;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Configuration;

public class ClusterStandardsConfigTest
{
    private const string Stars = "\"feh\": \"feh_spec\", \"feh_err\": \"feh_spec_err\" }";

    /// <summary>The demo config with <paramref name="entry"/> added to its standards list (files are placeholders).</summary>
    private static string WriteConfig(TempDir dir, string entry)
    {
        foreach (var f in new[] { "broad.csv", "narrow.csv", "standards.csv", "cb.csv", "cn.csv" }) File.WriteAllText(dir.File(f), "ra,dec\n1,2\n");
        DemoFilters.WriteTo(dir.Path);
        string p = dir.File("config.json");
        File.WriteAllText(p, DemoWriter.ConfigText(new DemoTruth(), 5).Replace(Stars, Stars + ",\n" + entry, StringComparison.Ordinal));
        return p;
    }

    private const string Pair = "\"broadband\": { \"path\": \"cb.csv\", \"id\": \"src\" }, \"narrowband\": { \"path\": \"cn.csv\" }";

    [Fact]
    public void Load_ClusterWithEveryValue_ParsesItAndKeepsStarSets()
    {
        using var dir = new TempDir();
        var c = ConfigLoader.Load(WriteConfig(dir, $$"""
            { "kind": "cluster", "name": "Invented A", {{Pair}}, "centre": { "ra": 10.5, "dec": -20.25 }, "radius_arcmin": 4,
              "feh": -1.8, "feh_err": 0.07, "reddening": { "value": 0.02 }, "ridge_degree": 1, "keep_sigma": 3, "blue0_range": [12, 18] }
            """));
        Assert.Single(c.Standards);
        var k = Assert.Single(c.ClusterStandards);
        Assert.Equal("standards[1]", k.Key);
        Assert.Equal("Invented A", k.Name);
        Assert.Equal(dir.File("cb.csv"), k.Broadband.Path);
        Assert.Equal("src", k.Broadband.IdColumn);
        Assert.Equal("ra", k.Narrowband.RaColumn);
        Assert.Equal(10.5, k.Centre.RaDegrees, 12);
        Assert.Equal(-20.25, k.Centre.DecDegrees, 12);
        Assert.Equal((4.0, -1.8, 0.07, 0.02), (k.RadiusArcmin, k.Feh, k.FehErr, k.Reddening.Value!.Value));
        Assert.Equal((1, 3.0, 12.0, 18.0), (k.RidgeDegree, k.KeepSigma, k.Blue0Bright!.Value, k.Blue0Faint!.Value));
        Assert.Equal("config", k.Source);
    }

    [Fact]
    public void Load_ClusterByName_TakesCentreFehAndReddeningFromTheShippedTable()
    {
        using var dir = new TempDir();
        var c = ConfigLoader.Load(WriteConfig(dir, $$"""{ "kind": "cluster", "name": "M15", {{Pair}}, "radius_arcmin": 5 }"""));
        var k = Assert.Single(c.ClusterStandards);
        var row = GlobularClusterCatalogue.Find(GlobularClusterCatalogue.Load(RepoPaths.Calibration("globular_clusters.csv")), "M15")!;
        Assert.Equal(row.Centre, k.Centre);
        Assert.Equal(row.Feh, k.Feh);
        Assert.Equal(ConfigLoader.DefaultClusterFehErr, k.FehErr);
        Assert.Equal(row.Ebv, k.Reddening.Value);
        Assert.Contains("from globular_clusters.csv", k.Source);
        // M 15 = NGC 7078 in Harris (1996, AJ 112, 1487; 2010 edition), part II: [Fe/H] -2.37, E(B-V) 0.10.
        Assert.Equal((-2.37, 0.10), (k.Feh, k.Reddening.Value!.Value));
        Assert.Contains("(NGC 7078; Harris 1996 (2010 edition)", k.Source);
    }

    [Fact]
    public void Load_ClusterFromAUserTableWithoutEbv_AsksForTheReddening()
    {
        using var dir = new TempDir();
        File.WriteAllText(dir.File("mine.csv"), "# invented clusters\nname,ra_deg,dec_deg,feh,ebv\nInvented B,100.0,5.0,-1.1,\n");
        string p = WriteConfig(dir, $$"""{ "kind": "cluster", "name": "Invented B", {{Pair}}, "radius_arcmin": 2, "cluster_table": "mine.csv" }""");
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.Contains("config key 'standards[1].name': cluster 'Invented B' (Invented B) has no E(B-V) in the cluster table", e.Message);
        var ok = ConfigLoader.Load(WriteConfig(dir, $$"""{ "kind": "cluster", "name": "Invented B", {{Pair}}, "radius_arcmin": 2, "cluster_table": "mine.csv", "reddening": { "value": 0.2 } }"""));
        Assert.Equal(0.2, Assert.Single(ok.ClusterStandards).Reddening.Value);
    }

    [Fact]
    public void Load_ClusterTableOfTheUser_GivenValuesWin()
    {
        using var dir = new TempDir();
        File.WriteAllText(dir.File("mine.csv"), "# invented clusters\nname,ra_deg,dec_deg,feh,ebv\nInvented B,100.0,5.0,-1.1,0.3\n");
        var c = ConfigLoader.Load(WriteConfig(dir, $$"""
            { "kind": "cluster", "name": "invented b", {{Pair}}, "radius_arcmin": 2, "cluster_table": "mine.csv", "feh": -1.3, "feh_err": 0.2 }
            """));
        var k = Assert.Single(c.ClusterStandards);
        Assert.Equal((100.0, 5.0, -1.3, 0.2, 0.3), (k.Centre.RaDegrees, k.Centre.DecDegrees, k.Feh, k.FehErr, k.Reddening.Value!.Value));
        Assert.StartsWith("centre, E(B-V) from mine.csv", k.Source);
    }

    [Theory]
    [InlineData("\"kind\": \"clump\", \"path\": \"standards.csv\"", "config key 'standards[1].kind': unknown kind of standard set 'clump'")]
    [InlineData("\"kind\": \"cluster\", \"name\": \"Invented C\", PAIR", "config key 'standards[1].radius_arcmin' is required but missing")]
    [InlineData("\"kind\": \"cluster\", \"name\": \"Invented C\", PAIR, \"radius_arcmin\": 3, \"feh\": -2", "config key 'standards[1]': \"feh\" is given without \"feh_err\"")]
    [InlineData("\"kind\": \"cluster\", \"name\": \"Invented C\", PAIR, \"radius_arcmin\": 3", "config key 'standards[1].name': cluster 'Invented C' is not in the cluster table")]
    [InlineData("\"kind\": \"cluster\", \"name\": \"M15\", PAIR, \"radius_arcmin\": 3, \"radious\": 3", "unknown config key 'standards[1].radious'; the keys allowed here are: blue0_range, broadband, centre, cluster_table, feh, feh_err, keep_sigma, kind, name, narrowband, radius_arcmin, reddening, ridge_degree")]
    [InlineData("\"kind\": \"cluster\", \"name\": \"M15\", PAIR, \"radius_arcmin\": 3, \"blue0_range\": [18, 12]", "config key 'standards[1].blue0_range': expected [bright, faint]")]
    [InlineData("\"kind\": \"cluster\", \"name\": \"M15\", PAIR, \"radius_arcmin\": 0", "config key 'standards[1].radius_arcmin': value 0 is outside the allowed range [0.05, 120]")]
    [InlineData("\"kind\": \"cluster\", \"name\": \"M15\", PAIR, \"radius_arcmin\": 3, \"centre\": { \"ra\": 10 }", "config key 'standards[1].centre.dec' is required but missing")]
    public void Load_BadClusterEntry_NamesTheKey(string body, string expected)
    {
        using var dir = new TempDir();
        string p = WriteConfig(dir, "{ " + body.Replace("PAIR", Pair, StringComparison.Ordinal) + " }");
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.StartsWith($"{p}: {expected}", e.Message);
    }

    [Fact]
    public void Load_SameClusterTwice_IsAnError()
    {
        using var dir = new TempDir();
        string one = $$"""{ "kind": "cluster", "name": "M15", {{Pair}}, "radius_arcmin": 3 }""";
        string p = WriteConfig(dir, one + ",\n" + one.Replace("\"M15\"", "\"m 15\"", StringComparison.Ordinal));
        var e = Assert.Throws<InputException>(() => ConfigLoader.Load(p));
        Assert.Equal($"{p}: config key 'standards[2].name': cluster 'm 15' is listed twice among the standards", e.Message);
    }
}
