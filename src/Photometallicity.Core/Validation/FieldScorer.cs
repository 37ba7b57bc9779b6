using System.Text.Json.Nodes;
using Photometallicity.Catalogues;

namespace Photometallicity.Validation;

/// <summary>A magnitude bin of the scoring: dereddened true red magnitude minus the distance modulus in [Lo, Hi).</summary>
public sealed record MagnitudeBin(string Label, double Lo, double Hi)
{
    /// <summary>The bins: brighter than mu-3, then one magnitude wide down to mu+1, then mu+1 to the faintest member.</summary>
    public static IReadOnlyList<MagnitudeBin> All { get; } =
    [
        new("<mu-3", double.NegativeInfinity, -3), new("mu-3..mu-2", -3, -2), new("mu-2..mu-1", -2, -1),
        new("mu-1..mu", -1, 0), new("mu..mu+1", 0, 1), new("mu+1..limit", 1, double.PositiveInfinity),
    ];
}

/// <summary>The scores of one field: per magnitude bin, the metallicity distribution and the standards.</summary>
public sealed record FieldScore
{
    public required string Field { get; init; }
    public string Law { get; init; } = "";
    public string Standards { get; init; } = "";
    public double BadShare { get; init; } = double.NaN;
    public string Depth { get; init; } = "";
    public int Members { get; init; }
    public IReadOnlyList<(MagnitudeBin Bin, BinScore Score)> Bins { get; init; } = [];
    public double MdfMeanTrue { get; init; } = double.NaN;
    public double MdfSigmaTrue { get; init; } = double.NaN;
    public double MdfMean { get; init; } = double.NaN;
    public double MdfMeanErr { get; init; } = double.NaN;
    public double MdfSigma { get; init; } = double.NaN;
    public double MdfSigmaErr { get; init; } = double.NaN;
    public int StandardsBad { get; init; }
    public int StandardsBadFlagged { get; init; }
    public int StandardsGood { get; init; }
    public int StandardsGoodFlagged { get; init; }
    /// <summary>Members with a value and narrow-band S/N of at least 25 (true magnitude).</summary>
    public int HighSnrMembers { get; init; }
    public double HighSnrMedianBias { get; init; } = double.NaN;
    public double Seconds { get; init; } = double.NaN;
    /// <summary>Why the field could not be run or scored (null when it was).</summary>
    public string? Error { get; init; }

    public double BadFlaggedShare => StandardsBad > 0 ? (double)StandardsBadFlagged / StandardsBad : double.NaN;
    public double GoodFlaggedShare => StandardsGood > 0 ? (double)StandardsGoodFlagged / StandardsGood : double.NaN;
}

/// <summary>
/// Scores a run of a validation field (its directory as <see cref="ValidationFieldWriter"/> wrote it, the results in
/// DIR/out) against the field's truth. Only true members (truth is_member) enter the bins.
/// </summary>
public static class FieldScorer
{
    public const double HighSnr = 25;

    public static FieldScore Score(string dir, string outDir)
    {
        var vt = JsonNode.Parse(File.ReadAllText(Path.Combine(dir, "truth", "validation_truth.json")))!.AsObject();
        double mu = vt["distance_modulus"]!.GetValue<double>();
        var truth = CatalogueIO.Read(Path.Combine(dir, "truth", "truth_stars.csv"), new ReadOptions { TextColumns = new HashSet<string> { "src" } });
        var stars = CatalogueIO.Read(Path.Combine(outDir, "stars.csv"), new ReadOptions { TextColumns = new HashSet<string> { "id", "narrow_id", "status" } });
        if (stars.RowCount != truth.RowCount)
            throw new InvalidOperationException($"stars.csv has {stars.RowCount} rows but the truth {truth.RowCount}");
        var (tid, sid) = (truth["src"], stars["id"]);
        double[] isMember = truth.RequireDoubles("is_member"), fehTrue = truth.RequireDoubles("feh_true"), red0 = truth.RequireDoubles("red0_true");
        double[] snr = truth.RequireDoubles("narrow_snr_true"), det = truth.RequireDoubles("narrow_detected");
        double[] feh = stars.RequireDoubles("feh"), lo = stars.RequireDoubles("feh_lo"), hi = stars.RequireDoubles("feh_hi");
        var status = stars["status"];
        var perBin = MagnitudeBin.All.Select(_ => new List<ScoredStar>()).ToArray();
        var highSnrBias = new List<double>();
        int members = 0;
        for (int i = 0; i < truth.RowCount; i++)
        {
            if (isMember[i] == 0) continue;
            if (!string.Equals(tid.GetString(i), sid.GetString(i), StringComparison.Ordinal))
                throw new InvalidOperationException($"row {i + 1}: stars.csv id {sid.GetString(i)} is not the truth's {tid.GetString(i)}");
            members++;
            var s = new ScoredStar(fehTrue[i], feh[i], lo[i], hi[i], status.GetString(i) ?? "", det[i] != 0, snr[i]);
            double rel = red0[i] - mu;
            for (int b = 0; b < perBin.Length; b++)
                if (rel >= MagnitudeBin.All[b].Lo && rel < MagnitudeBin.All[b].Hi) { perBin[b].Add(s); break; }
            if (s.HasValue && snr[i] >= HighSnr) highSnrBias.Add(s.Feh - s.FehTrue);
        }

        var summary = JsonNode.Parse(File.ReadAllText(Path.Combine(outDir, "summary.json")))!.AsObject();
        var mdf = summary["mdf"] as JsonObject;
        double Mdf(string key) => mdf?[key] is JsonValue v && v.TryGetValue<double>(out double x) ? x : double.NaN;

        var (bad, badFlagged, good, goodFlagged) = StandardsFlags(dir, outDir, vt);
        return new FieldScore
        {
            Field = vt["field"]!.GetValue<string>(),
            Law = vt["index_law"]!.GetValue<string>(),
            Standards = vt["standards"]!.GetValue<string>(),
            BadShare = vt["bad_share"]!.GetValue<double>(),
            Depth = vt["depth"]!.GetValue<string>(),
            Members = members,
            Bins = MagnitudeBin.All.Select((b, k) => (b, Scoring.Score(perBin[k]))).ToArray(),
            MdfMeanTrue = vt["mdf_mean_true"]!.GetValue<double>(),
            MdfSigmaTrue = vt["mdf_sigma_true"]!.GetValue<double>(),
            MdfMean = Mdf("mean"),
            MdfMeanErr = Mdf("mean_err"),
            MdfSigma = Mdf("sigma"),
            MdfSigmaErr = Mdf("sigma_err"),
            StandardsBad = bad,
            StandardsBadFlagged = badFlagged,
            StandardsGood = good,
            StandardsGoodFlagged = goodFlagged,
            HighSnrMembers = highSnrBias.Count,
            HighSnrMedianBias = Scoring.Median(highSnrBias),
        };
    }

    /// <summary>
    /// Standards that entered the fit (calibration_residuals.csv rows not "excluded"): flagged when the status is not
    /// "accepted" or, when the column exists, p_outlier &gt; 0.5. Bad = truth_bad 1 (individual standards) or a
    /// foreground star of an invented cluster field (id NAME:CF...).
    /// </summary>
    public static (int Bad, int BadFlagged, int Good, int GoodFlagged) StandardsFlags(string dir, string outDir, JsonObject vt)
    {
        string resPath = Path.Combine(outDir, "calibration_residuals.csv");
        if (!File.Exists(resPath)) return (0, 0, 0, 0);
        var res = CatalogueIO.Read(resPath, new ReadOptions { TextColumns = new HashSet<string> { "id", "status", "reason" } });
        var truthBad = new Dictionary<string, bool>(StringComparer.Ordinal);
        string stdPath = Path.Combine(dir, "standards.csv");
        if (File.Exists(stdPath))
        {
            string idCol = vt["standards_id_column"]!.GetValue<string>();
            var std = CatalogueIO.Read(stdPath, new ReadOptions { TextColumns = new HashSet<string> { idCol } });
            var ids = std[idCol];
            double[] tb = std.RequireDoubles("truth_bad");
            for (int i = 0; i < std.RowCount; i++) truthBad[ids.GetString(i)!] = tb[i] != 0;
        }
        double[]? pOut = res.Contains("p_outlier") ? res.RequireDoubles("p_outlier") : null;
        var rid = res["id"];
        var rstatus = res["status"];
        int bad = 0, badFlagged = 0, good = 0, goodFlagged = 0;
        for (int i = 0; i < res.RowCount; i++)
        {
            string st = rstatus.GetString(i) ?? "";
            if (st == "excluded") continue;
            string id = rid.GetString(i) ?? "";
            bool isBad;
            if (truthBad.TryGetValue(id, out bool b)) isBad = b;
            else if (id.Contains(":CF", StringComparison.Ordinal)) isBad = true;
            else if (id.Contains(":CM", StringComparison.Ordinal)) isBad = false;
            else continue; // not a standard of known truth
            bool flagged = st != "accepted" || (pOut is not null && pOut[i] > 0.5);
            if (isBad) { bad++; if (flagged) badFlagged++; }
            else { good++; if (flagged) goodFlagged++; }
        }
        return (bad, badFlagged, good, goodFlagged);
    }
}
