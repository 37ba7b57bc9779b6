using System.Text;
using System.Text.Json.Nodes;
using Photometallicity.Errors;
using Photometallicity.Tests.Support;
using Photometallicity.Tiling;

namespace Photometallicity.Tests.Tiling;

/// <summary>plan.json: written, read back, and every malformed key reported with the file and the key.</summary>
public class TilePlanJsonTest
{
    private static void AssertSamePlan(TilePlan expected, TilePlan actual)
    {
        Assert.Equal(expected.WorkDirectory, actual.WorkDirectory);
        Assert.Equal(expected.ConfigPath, actual.ConfigPath);
        Assert.Equal(expected.OutputDirectory, actual.OutputDirectory);
        Assert.Equal(expected.Order, actual.Order);
        Assert.Equal(BitConverter.DoubleToInt64Bits(expected.MarginArcsec), BitConverter.DoubleToInt64Bits(actual.MarginArcsec));
        Assert.Equal(expected.BroadbandRows, actual.BroadbandRows);
        Assert.Equal(expected.NarrowbandRows, actual.NarrowbandRows);
        Assert.Equal(expected.Tiles, actual.Tiles);
    }

    [Fact]
    public void WriteThenRead_GivesThePlanBack()
    {
        using var dir = new TempDir();
        var plan = TilePlanSamples.FourTiles(dir.Path);
        TilePlanJson.Write(plan, TilePlanJson.PathIn(dir.Path));
        AssertSamePlan(plan, TilePlanJson.Read(dir.Path));
        Assert.Equal(["plan.json"], dir.Files());
    }

    [Fact]
    public void Write_IsByteStableAndUsesTheDocumentedKeys()
    {
        using var dir = new TempDir();
        var plan = TilePlanSamples.FourTiles(dir.Path) with { MarginArcsec = 2.5, Tiles = [TilePlanSamples.Tile(0, 123, 10, 12, 9)], BroadbandRows = 12, NarrowbandRows = 9 };
        string a = dir.File("a.json"), b = dir.File("b.json");
        TilePlanJson.Write(plan, a);
        TilePlanJson.Write(plan, b);
        Assert.Equal(File.ReadAllBytes(a), File.ReadAllBytes(b));
        // The format as documented for the tiling verbs, written out by hand.
        string expected = """
            {
              "kind": "photometallicity tile plan",
              "version": 1,
              "config": "/data/field one/config.json",
              "output_directory": "/data/field one/out",
              "order": 6,
              "margin_arcsec": 2.5,
              "broadband_rows": 12,
              "narrowband_rows": 9,
              "checksums": [],
              "tiles": [
                {
                  "index": 0,
                  "pixel": 123,
                  "owned_rows": 10,
                  "broadband_rows": 12,
                  "narrowband_rows": 9
                }
              ]
            }
            """;
        Assert.Equal(expected, File.ReadAllText(a));
    }

    [Fact]
    public void Read_TakesTheWorkDirectoryFromWhereThePlanIs()
    {
        using var dir = new TempDir();
        string first = Path.Combine(dir.Path, "first"), moved = Path.Combine(dir.Path, "moved here");
        TilePlanJson.Write(TilePlanSamples.FourTiles(first), TilePlanJson.PathIn(first));
        Directory.Move(first, moved);
        var plan = TilePlanJson.Read(moved + "/");
        Assert.Equal(Path.GetFullPath(moved + "/"), plan.WorkDirectory);
        Assert.Equal(Path.Combine(plan.WorkDirectory, "tiles", "00003"), plan.TileDirectory(3));
    }

    [Fact]
    public void Read_MissingFile_NamesTheFileAndSplit()
    {
        using var dir = new TempDir();
        var e = Assert.Throws<InputException>(() => TilePlanJson.Read(dir.Path));
        Assert.Equal(2, e.ExitCode);
        Assert.Equal(Path.Combine(dir.Path, "plan.json"), e.File);
        Assert.Contains("split", e.Message);
    }

    [Fact]
    public void Read_NotJson_SaysWhere()
    {
        using var dir = new TempDir();
        File.WriteAllText(dir.File("plan.json"), "{\"kind\": \n oops", new UTF8Encoding(false));
        var e = Assert.Throws<InputException>(() => TilePlanJson.Read(dir.Path));
        Assert.Contains("not valid JSON (line 2)", e.Message);
        Assert.Equal(dir.File("plan.json"), e.File);
    }

    /// <summary>Edits of a valid plan: the tile (-1: the top level), the key, its new JSON value (null: removed), the message expected.</summary>
    public static TheoryData<int, string, string?, string> BadPlans() => new()
    {
        { -1, "kind", null, "key 'kind': is missing" },
        { -1, "kind", "\"calibration\"", "key 'kind': must be \"photometallicity tile plan\"" },
        { -1, "version", "2", "key 'version': version 2 is not supported" },
        { -1, "config", "\"relative/config.json\"", "key 'config': \"relative/config.json\" must be an absolute path" },
        { -1, "output_directory", "3", "key 'output_directory': must be a string" },
        { -1, "order", null, "key 'order': is missing" },
        { -1, "order", "30", "key 'order': 30 is outside [0, 29]" },
        { -1, "order", "6.5", "key 'order': must be an integer" },
        { -1, "margin_arcsec", "-1", "key 'margin_arcsec': must be a finite number of arcsec, 0 or more" },
        { -1, "margin_arcsec", "\"2\"", "key 'margin_arcsec': must be a finite number" },
        { -1, "broadband_rows", "-5", "key 'broadband_rows': -5 is negative" },
        { -1, "orders", "6", "key 'orders': unknown key" },
        { -1, "tiles", "{}", "key 'tiles': must be an array" },
        { -1, "broadband_rows", "9000", "key 'tiles[2].broadband_rows': 9700 is more than the plan's 9000 broadband rows" },
        { 1, "index", "3", "key 'tiles[1].index': is 3; tiles must be numbered 0, 1, 2, ..." },
        { 2, "pixel", "38586", "key 'tiles[2].pixel': 38586 does not follow the previous tile's pixel 38586" },
        { 3, "pixel", "49152", "key 'tiles[3].pixel': 49152 is outside [0, 49151] (order 6)" },
        { 0, "narrowband_rows", null, "key 'tiles[0].narrowband_rows': is missing" },
        { 0, "owned_rows", "201", "key 'tiles[0].owned_rows': 201 is more than the tile's 200 broadband rows" },
        { 2, "narrowband_rows", "20000", "key 'tiles[2].narrowband_rows': 20000 is more than the plan's 16233 narrow-band rows" },
        { 1, "pixels", "1", "key 'tiles[1].pixels': unknown key" },
    };

    [Theory]
    [MemberData(nameof(BadPlans))]
    public void Read_BadKey_NamesFileAndKey(int tile, string key, string? json, string expected)
    {
        using var dir = new TempDir();
        string path = TilePlanJson.PathIn(dir.Path);
        TilePlanJson.Write(TilePlanSamples.FourTiles(dir.Path), path);
        var root = JsonNode.Parse(File.ReadAllText(path))!.AsObject();
        var target = tile < 0 ? root : root["tiles"]![tile]!.AsObject();
        if (json is null) target.Remove(key);
        else target[key] = JsonNode.Parse(json);
        File.WriteAllText(path, root.ToJsonString(), new UTF8Encoding(false));

        var e = Assert.Throws<InputException>(() => TilePlanJson.Read(dir.Path));
        Assert.Equal(path, e.File);
        Assert.StartsWith(path + ": ", e.Message);
        Assert.Contains(expected, e.Message);
    }
}
