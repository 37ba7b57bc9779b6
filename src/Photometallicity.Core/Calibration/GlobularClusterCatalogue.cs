using System.Globalization;
using Photometallicity.Errors;
using Photometallicity.Units;

namespace Photometallicity.Calibration;

/// <summary>
/// One reference globular cluster: name, other name (alias, "" when none), centre, literature [Fe/H] (dex), E(B-V) (mag),
/// a note on the values' provenance, and the apparent visual distance modulus (m-M)V (mag). E(B-V) and (m-M)V are NaN
/// where the table gives none.
/// </summary>
public sealed record GlobularCluster(string Name, string Alias, SkyPosition Centre, double Feh, double Ebv, string Note,
    double DistanceModulusV = double.NaN);

/// <summary>
/// Reads the shipped reference table calibration/globular_clusters.csv (made from Harris 1996, AJ 112, 1487, 2010
/// edition, by calibration/make_globular_clusters.py) or a user's table in the same layout: lines starting with '#'
/// are comments; a header row naming the columns name, ra_deg, dec_deg, feh, ebv, and optionally alias, note and
/// distance_modulus_v (any order; other columns are ignored); one cluster per row, comma-separated, no quoting.
/// Empty ebv and distance_modulus_v cells mean "no value" (NaN). Names and aliases must be unique once case and
/// spaces are ignored, so that a lookup (<see cref="Find"/>) names one cluster.
/// </summary>
public static class GlobularClusterCatalogue
{
    private static readonly string[] Required = ["name", "ra_deg", "dec_deg", "feh", "ebv"];

    /// <summary>The lookup key of a name or alias: spaces removed, upper case ("ngc 104" and "NGC104" are one key).</summary>
    public static string Key(string nameOrAlias) => nameOrAlias.Replace(" ", "", StringComparison.Ordinal).ToUpperInvariant();

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
        var keys = new Dictionary<string, (string Label, long Row)>(StringComparer.Ordinal); // lookup key -> first holder
        long row = 0;
        foreach (var raw in lines)
        {
            var line = raw.Trim();
            if (line.Length == 0 || line.StartsWith('#')) continue;
            var cells = line.Split(',').Select(c => c.Trim()).ToArray();
            if (col is null)
            {
                col = new Dictionary<string, int>(StringComparer.Ordinal);
                for (int k = 0; k < cells.Length; k++)
                    if (!col.TryAdd(cells[k], k))
                        throw new InputException($"the header names the column '{cells[k]}' twice.", file: path, column: cells[k]);
                foreach (var r in Required)
                    if (!col.ContainsKey(r))
                        throw new InputException($"the header has no column '{r}' (found: {string.Join(", ", cells)}).", file: path, column: r);
                continue;
            }
            row++;
            if (cells.Length != col.Count)
                throw new InputException($"{cells.Length} cells but the header has {col.Count} columns.", file: path, row: row);
            double Num(string c, double min, double max, bool optional = false)
            {
                if (!col.TryGetValue(c, out int i)) return double.NaN; // an optional column the table does not have
                string s = cells[i];
                if (optional && s.Length == 0) return double.NaN;
                if (!double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out double v) || !double.IsFinite(v))
                    throw new InputException(s.Length == 0 ? "the cell is empty; a number is needed." : $"'{s}' is not a number.", file: path, row: row, column: c);
                if (v < min || v > max) throw new InputException($"{v} is outside [{min}, {max}].", file: path, row: row, column: c);
                return v;
            }
            string name = cells[col["name"]];
            if (name.Length == 0) throw new InputException("the name is empty.", file: path, row: row, column: "name");
            string alias = col.TryGetValue("alias", out int ai) ? cells[ai] : "";
            foreach (var (label, column) in new[] { (name, "name"), (alias, "alias") })
            {
                if (label.Length == 0) continue;
                string key = Key(label);
                if (keys.TryGetValue(key, out var held) && held.Row != row) // an alias may repeat its own row's name
                    throw new InputException($"'{label}' is already the name or alias of the cluster '{held.Label}' on row {held.Row} (case and spaces are ignored in lookups).",
                        file: path, row: row, column: column);
                keys.TryAdd(key, (name, row));
            }
            var pos = SkyPosition.FromDegrees(Num("ra_deg", 0, 360), Num("dec_deg", -90, 90));
            double feh = Num("feh", -5, 1);
            double ebv = Num("ebv", 0, 10, optional: true);
            double dmv = Num("distance_modulus_v", 0, 60, optional: true); // apparent visual modulus; 38.05 mag is the largest in Harris (2010 edition)
            list.Add(new GlobularCluster(name, alias, pos, feh, ebv, col.TryGetValue("note", out int ni) ? cells[ni] : "", dmv));
        }
        if (col is null) throw new InputException("the cluster table has no header row.", file: path);
        return list;
    }

    /// <summary>The cluster of that name or alias (case-insensitive, spaces ignored), or null.</summary>
    public static GlobularCluster? Find(IReadOnlyList<GlobularCluster> clusters, string name)
    {
        string k = Key(name);
        if (k.Length == 0) return null;
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
