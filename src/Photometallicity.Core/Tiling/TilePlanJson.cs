using System.Text.Json;
using System.Text.Json.Nodes;
using Photometallicity.Catalogues;
using Photometallicity.Errors;

namespace Photometallicity.Tiling;

/// <summary>plan.json of a split survey: written last by 'split', read by 'tile', 'merge' and 'batch'.</summary>
public static class TilePlanJson
{
    public const string Kind = "photometallicity tile plan";
    public const int Version = 1;

    public static void Write(TilePlan plan, string path)
    {
        var tiles = new JsonArray();
        foreach (var t in plan.Tiles)
            tiles.Add(new JsonObject
            {
                ["index"] = t.Index, ["pixel"] = t.Pixel, ["owned_rows"] = t.OwnedRows,
                ["broadband_rows"] = t.BroadbandRows, ["narrowband_rows"] = t.NarrowbandRows,
            });
        var o = new JsonObject
        {
            ["kind"] = Kind, ["version"] = Version, ["config"] = plan.ConfigPath, ["output_directory"] = plan.OutputDirectory,
            ["order"] = plan.Order, ["margin_arcsec"] = plan.MarginArcsec,
            ["broadband_rows"] = plan.BroadbandRows, ["narrowband_rows"] = plan.NarrowbandRows,
            ["checksums"] = new JsonArray(plan.Checksums.Select(c => (JsonNode)new JsonObject { ["path"] = c.Path, ["sha256"] = c.Sha256 }).ToArray()),
            ["tiles"] = tiles,
        };
        AtomicFile.WriteAllText(path, o.ToJsonString(new JsonSerializerOptions { WriteIndented = true }) + "\n");
    }

    /// <summary>The plan in <paramref name="workDirectory"/>; an <see cref="InputException"/> naming the key when something is missing or wrong.</summary>
    public static TilePlan Read(string workDirectory)
    {
        workDirectory = Path.GetFullPath(workDirectory);
        string path = Path.Combine(workDirectory, TilePlan.FileName);
        if (!File.Exists(path)) throw new InputException("no tile plan here: run 'split' first (or it did not finish)", file: path);
        JsonObject o;
        try
        {
            o = JsonNode.Parse(File.ReadAllText(path))?.AsObject() ?? throw new InputException("empty plan", file: path);
        }
        catch (Exception e) when (e is JsonException or InvalidOperationException)
        {
            throw new InputException($"not a valid JSON tile plan: {e.Message}", file: path);
        }
        T Get<T>(JsonObject obj, string key, string where)
        {
            try
            {
                var node = obj[key] ?? throw new InputException($"key '{where}{key}' is missing", file: path);
                return node.GetValue<T>();
            }
            catch (Exception e) when (e is InvalidOperationException or FormatException)
            {
                throw new InputException($"key '{where}{key}' has the wrong type ({e.Message})", file: path);
            }
        }
        if (Get<string>(o, "kind", "") != Kind) throw new InputException($"key 'kind' is not '{Kind}'", file: path);
        int version = Get<int>(o, "version", "");
        if (version != Version) throw new InputException($"plan version {version}; this program reads version {Version}", file: path);
        var list = new List<TileEntry>();
        var arr = o["tiles"] as JsonArray ?? throw new InputException("key 'tiles' is missing or not an array", file: path);
        for (int i = 0; i < arr.Count; i++)
        {
            var t = arr[i] as JsonObject ?? throw new InputException($"key 'tiles[{i}]' is not an object", file: path);
            string w = $"tiles[{i}].";
            var e = new TileEntry
            {
                Index = Get<int>(t, "index", w), Pixel = Get<long>(t, "pixel", w), OwnedRows = Get<long>(t, "owned_rows", w),
                BroadbandRows = Get<long>(t, "broadband_rows", w), NarrowbandRows = Get<long>(t, "narrowband_rows", w),
            };
            if (e.Index != i) throw new InputException($"key 'tiles[{i}].index' is {e.Index}; tiles must be numbered 0, 1, 2, ... in order", file: path);
            list.Add(e);
        }
        var sums = new List<(string, string)>();
        if (o["checksums"] is JsonArray cs)
            for (int i = 0; i < cs.Count; i++)
            {
                var c = cs[i] as JsonObject ?? throw new InputException($"key 'checksums[{i}]' is not an object", file: path);
                sums.Add((Get<string>(c, "path", $"checksums[{i}]."), Get<string>(c, "sha256", $"checksums[{i}].")));
            }
        return new TilePlan
        {
            Checksums = sums,
            WorkDirectory = workDirectory,
            ConfigPath = Get<string>(o, "config", ""),
            OutputDirectory = Get<string>(o, "output_directory", ""),
            Order = Get<int>(o, "order", ""),
            MarginArcsec = Get<double>(o, "margin_arcsec", ""),
            BroadbandRows = Get<long>(o, "broadband_rows", ""),
            NarrowbandRows = Get<long>(o, "narrowband_rows", ""),
            Tiles = list,
        };
    }
}

/// <summary>Refuses to go on when the config or the catalogues changed after the split.</summary>
public static class TilePlanChecks
{
    /// <summary>Compares the files' checksums now with the plan's (only the config when <paramref name="configOnly"/>).</summary>
    public static void RequireUnchanged(TilePlan plan, bool configOnly)
    {
        foreach (var (file, sha) in configOnly ? plan.Checksums.Take(1) : plan.Checksums)
        {
            if (!File.Exists(file)) throw new InputException("an input of the split is gone", file: file);
            if (Pipeline.Checksums.Sha256(file) != sha)
                throw new InputException($"the file changed after the split (SHA-256 differs from plan.json's); run 'split' again", file: file);
        }
    }
}
