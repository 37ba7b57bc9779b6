using System.Globalization;
using System.Text.Json;
using Photometallicity.Catalogues;
using Photometallicity.Errors;

namespace Photometallicity.Tiling;

/// <summary>
/// plan.json: the <see cref="TilePlan"/> written by 'split' and read by 'tile', 'merge' and 'batch'. Keys are
/// snake_case and written in a fixed order, doubles in round-trip form, so the same plan gives the same bytes.
/// The work directory is not stored: it is the directory the file is read from, so a work directory can be moved
/// as a whole. Every problem found when reading is an <see cref="InputException"/> naming the file and the key.
/// </summary>
public static class TilePlanJson
{
    public const string Kind = "photometallicity tile plan";
    public const int Version = 1;

    /// <summary>Highest HEALPix order a 64-bit nested pixel index holds (Nside = 2^29), as the healpix verb allows.</summary>
    public const int MaxOrder = 29;

    private static readonly string[] TopKeys = ["kind", "version", "config", "output_directory", "order", "margin_arcsec", "broadband_rows", "narrowband_rows", "checksums", "tiles"];
    private static readonly string[] TileKeys = ["index", "pixel", "owned_rows", "broadband_rows", "narrowband_rows"];

    /// <summary>plan.json inside <paramref name="workDirectory"/>.</summary>
    public static string PathIn(string workDirectory) => Path.Combine(Path.GetFullPath(workDirectory), TilePlan.FileName);

    /// <summary>Writes the plan to <paramref name="path"/> (temporary name, then rename).</summary>
    public static void Write(TilePlan plan, string path) => AtomicFile.Write(path, s => Write(plan, s));

    public static void Write(TilePlan plan, Stream stream)
    {
        using var w = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true, NewLine = "\n", Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping });
        w.WriteStartObject();
        w.WriteString("kind", Kind);
        w.WriteNumber("version", Version);
        w.WriteString("config", plan.ConfigPath);
        w.WriteString("output_directory", plan.OutputDirectory);
        w.WriteNumber("order", plan.Order);
        w.WritePropertyName("margin_arcsec");
        w.WriteRawValue(plan.MarginArcsec.ToString("R", CultureInfo.InvariantCulture), skipInputValidation: true);
        w.WriteNumber("broadband_rows", plan.BroadbandRows);
        w.WriteNumber("narrowband_rows", plan.NarrowbandRows);
        w.WriteStartArray("checksums");
        foreach (var (file, sha) in plan.Checksums)
        {
            w.WriteStartObject();
            w.WriteString("path", file);
            w.WriteString("sha256", sha);
            w.WriteEndObject();
        }
        w.WriteEndArray();
        w.WriteStartArray("tiles");
        foreach (var t in plan.Tiles)
        {
            w.WriteStartObject();
            w.WriteNumber("index", t.Index);
            w.WriteNumber("pixel", t.Pixel);
            w.WriteNumber("owned_rows", t.OwnedRows);
            w.WriteNumber("broadband_rows", t.BroadbandRows);
            w.WriteNumber("narrowband_rows", t.NarrowbandRows);
            w.WriteEndObject();
        }
        w.WriteEndArray();
        w.WriteEndObject();
        w.Flush();
    }

    /// <summary>
    /// Reads WORKDIR/plan.json and checks it: known keys only, the kind and version, absolute paths, order in
    /// [0, 29], a finite non-negative margin, non-negative row counts, tiles numbered 0..T-1 in order with
    /// strictly increasing pixels valid at the order, and no tile holding more rows than the plan.
    /// </summary>
    public static TilePlan Read(string workDirectory)
    {
        string dir = Path.GetFullPath(workDirectory);
        string path = Path.Combine(dir, TilePlan.FileName);
        if (!File.Exists(path))
            throw new InputException($"no tile plan here (write one with 'photometallicity split CONFIG --order K --out {workDirectory}')", file: path);
        byte[] bytes;
        try { bytes = File.ReadAllBytes(path); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException($"cannot read the tile plan: {e.Message}", file: path, inner: e);
        }
        JsonDocument doc;
        try { doc = JsonDocument.Parse(bytes); }
        catch (JsonException e)
        {
            throw new InputException($"not valid JSON (line {e.LineNumber + 1}): {e.Message}", file: path, inner: e);
        }
        using (doc) return Parse(doc.RootElement, dir, path);
    }

    private static TilePlan Parse(JsonElement root, string dir, string file)
    {
        var r = new Reader(file);
        if (root.ValueKind != JsonValueKind.Object) throw r.Error("(root)", "must be a JSON object");
        r.KnownKeys(root, TopKeys, "");
        if (r.Str(root, "kind", "") != Kind) throw r.Error("kind", $"must be \"{Kind}\"");
        long version = r.Long(root, "version", "");
        if (version != Version) throw r.Error("version", $"version {version} is not supported (this program reads version {Version})");

        string config = r.AbsolutePath(root, "config");
        string output = r.AbsolutePath(root, "output_directory");
        long order = r.Long(root, "order", "");
        if (order < 0 || order > MaxOrder) throw r.Error("order", $"{order} is outside [0, {MaxOrder}]");
        var marginEl = r.Get(root, "margin_arcsec", "");
        if (!(marginEl.ValueKind == JsonValueKind.Number && marginEl.TryGetDouble(out double margin) && double.IsFinite(margin) && margin >= 0))
            throw r.Error("margin_arcsec", "must be a finite number of arcsec, 0 or more");
        long broad = r.Count(root, "broadband_rows", "");
        long narrow = r.Count(root, "narrowband_rows", "");

        var sums = new List<(string, string)>();
        if (root.TryGetProperty("checksums", out var sumsEl))
        {
            if (sumsEl.ValueKind != JsonValueKind.Array) throw r.Error("checksums", "must be an array");
            foreach (var c in sumsEl.EnumerateArray())
            {
                string at = $"checksums[{sums.Count}]";
                if (c.ValueKind != JsonValueKind.Object) throw r.Error(at, "must be an object");
                r.KnownKeys(c, ["path", "sha256"], at);
                sums.Add((r.Str(c, "path", at), r.Str(c, "sha256", at)));
            }
        }

        var tilesEl = r.Get(root, "tiles", "");
        if (tilesEl.ValueKind != JsonValueKind.Array) throw r.Error("tiles", "must be an array");
        long pixelCount = 12L << (int)(2 * order);
        var tiles = new List<TileEntry>(tilesEl.GetArrayLength());
        long ownedSum = 0, lastPixel = -1;
        foreach (var t in tilesEl.EnumerateArray())
        {
            int i = tiles.Count;
            string at = $"tiles[{i}]";
            if (t.ValueKind != JsonValueKind.Object) throw r.Error(at, "must be an object");
            r.KnownKeys(t, TileKeys, at);
            long index = r.Long(t, "index", at);
            if (index != i) throw r.Error($"{at}.index", $"is {index}; tiles must be numbered 0, 1, 2, ... in the order listed");
            long pixel = r.Long(t, "pixel", at);
            if (pixel < 0 || pixel >= pixelCount) throw r.Error($"{at}.pixel", $"{pixel} is outside [0, {pixelCount - 1}] (order {order})");
            if (pixel <= lastPixel) throw r.Error($"{at}.pixel", $"{pixel} does not follow the previous tile's pixel {lastPixel}; tiles must be in increasing pixel order");
            long owned = r.Count(t, "owned_rows", at);
            long tb = r.Count(t, "broadband_rows", at);
            long tn = r.Count(t, "narrowband_rows", at);
            if (owned > tb) throw r.Error($"{at}.owned_rows", $"{owned} is more than the tile's {tb} broadband rows");
            if (tb > broad) throw r.Error($"{at}.broadband_rows", $"{tb} is more than the plan's {broad} broadband rows");
            if (tn > narrow) throw r.Error($"{at}.narrowband_rows", $"{tn} is more than the plan's {narrow} narrow-band rows");
            ownedSum += owned;
            lastPixel = pixel;
            tiles.Add(new TileEntry { Index = i, Pixel = pixel, OwnedRows = owned, BroadbandRows = tb, NarrowbandRows = tn });
        }
        if (ownedSum > broad) throw r.Error("tiles", $"the tiles own {ownedSum} broadband rows in all, more than the plan's {broad}");

        return new TilePlan
        {
            WorkDirectory = dir,
            ConfigPath = config,
            OutputDirectory = output,
            Order = (int)order,
            MarginArcsec = margin,
            BroadbandRows = broad,
            NarrowbandRows = narrow,
            Checksums = sums,
            Tiles = tiles,
        };
    }

    private sealed class Reader(string file)
    {
        public InputException Error(string key, string what) => new($"key '{key}': {what}.", file: file);

        private static string Path(string parent, string key) => parent.Length == 0 ? key : $"{parent}.{key}";

        public void KnownKeys(JsonElement o, string[] known, string parent)
        {
            foreach (var prop in o.EnumerateObject())
                if (!known.Contains(prop.Name)) throw Error(Path(parent, prop.Name), $"unknown key (known: {string.Join(", ", known)})");
        }

        public JsonElement Get(JsonElement o, string key, string parent)
        {
            if (!o.TryGetProperty(key, out var v)) throw Error(Path(parent, key), "is missing");
            return v;
        }

        public string Str(JsonElement o, string key, string parent)
        {
            var v = Get(o, key, parent);
            return v.ValueKind == JsonValueKind.String ? v.GetString()! : throw Error(Path(parent, key), "must be a string");
        }

        public string AbsolutePath(JsonElement o, string key)
        {
            string s = Str(o, key, "");
            if (s.Length == 0 || !System.IO.Path.IsPathFullyQualified(s)) throw Error(key, $"\"{s}\" must be an absolute path");
            return s;
        }

        public long Long(JsonElement o, string key, string parent)
        {
            var v = Get(o, key, parent);
            return v.ValueKind == JsonValueKind.Number && v.TryGetInt64(out long i) ? i : throw Error(Path(parent, key), "must be an integer");
        }

        public long Count(JsonElement o, string key, string parent)
        {
            long n = Long(o, key, parent);
            return n >= 0 ? n : throw Error(Path(parent, key), $"{n} is negative; a row count must be 0 or more");
        }
    }
}
