using System.Globalization;
using Photometallicity.Errors;
using Photometallicity.Units;

namespace Photometallicity.Calibration;

/// <summary>One reference globular cluster: name, centre, literature [Fe/H] (dex), E(B-V) (mag) and a note on the value's provenance.</summary>
public sealed record GlobularCluster(string Name, string Alias, SkyPosition Centre, double Feh, double Ebv, string Note);

/// <summary>
/// Reads the shipped reference table calibration/globular_clusters.csv (or a user's table in the same layout):
/// lines starting with '#' are comments; a header row naming the columns name, ra_deg, dec_deg, feh, ebv, and
/// optionally alias and note (any order); one cluster per row, comma-separated, no quoting.
/// </summary>
public static class GlobularClusterCatalogue
{
    private static readonly string[] Required = ["name", "ra_deg", "dec_deg", "feh", "ebv"];

    public static IReadOnlyList<GlobularCluster> Load(string path)
    {
        string[] lines;
        try { lines = File.ReadAllLines(path); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException($"cannot read the cluster table: {e.Message}", file: path, inner: e);
        }
        Dictionary<string, int>? col = null;
        var list = new List<GlobularCluster>();
        var names = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        long row = 0;
        foreach (var raw in lines)
        {
            var line = raw.Trim();
            if (line.Length == 0 || line.StartsWith('#')) continue;
            var cells = line.Split(',').Select(c => c.Trim()).ToArray();
            if (col is null)
            {
                col = new Dictionary<string, int>(StringComparer.Ordinal);
                for (int k = 0; k < cells.Length; k++) col[cells[k]] = k;
                foreach (var r in Required)
                    if (!col.ContainsKey(r))
                        throw new InputException($"the header has no column '{r}' (found: {string.Join(", ", cells)}).", file: path, column: r);
                continue;
            }
            row++;
            if (cells.Length != col.Count)
                throw new InputException($"{cells.Length} cells but the header has {col.Count} columns.", file: path, row: row);
            double Num(string c, double min, double max)
            {
                string s = cells[col[c]];
                if (!double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out double v) || !double.IsFinite(v))
                    throw new InputException($"'{s}' is not a number.", file: path, row: row, column: c);
                if (v < min || v > max) throw new InputException($"{v} is outside [{min}, {max}].", file: path, row: row, column: c);
                return v;
            }
            string name = cells[col["name"]];
            if (name.Length == 0) throw new InputException("the name is empty.", file: path, row: row, column: "name");
            if (!names.Add(name)) throw new InputException($"cluster '{name}' is listed twice.", file: path, row: row, column: "name");
            var pos = SkyPosition.FromDegrees(Num("ra_deg", 0, 360), Num("dec_deg", -90, 90));
            list.Add(new GlobularCluster(name, col.TryGetValue("alias", out int ai) ? cells[ai] : "", pos, Num("feh", -5, 1), Num("ebv", 0, 10), col.TryGetValue("note", out int ni) ? cells[ni] : ""));
        }
        if (col is null) throw new InputException("the cluster table has no header row.", file: path);
        return list;
    }

    /// <summary>The cluster of that name or alias (case-insensitive, spaces ignored), or null.</summary>
    public static GlobularCluster? Find(IReadOnlyList<GlobularCluster> clusters, string name)
    {
        static string Key(string s) => s.Replace(" ", "", StringComparison.Ordinal).ToUpperInvariant();
        string k = Key(name);
        return clusters.FirstOrDefault(c => Key(c.Name) == k || (c.Alias.Length > 0 && Key(c.Alias) == k));
    }

    /// <summary>Relative location of the shipped reference table.</summary>
    public const string ShippedRelativePath = "calibration/globular_clusters.csv";

    /// <summary>
    /// The shipped table: calibration/globular_clusters.csv beside the executable, or in the nearest folder above it
    /// that has one (a build inside the source tree); null when there is none.
    /// </summary>
    public static string? DefaultPath()
    {
        for (var d = new DirectoryInfo(AppContext.BaseDirectory); d is not null; d = d.Parent)
        {
            string p = Path.Combine(d.FullName, "calibration", "globular_clusters.csv");
            if (File.Exists(p)) return p;
        }
        return null;
    }
}
