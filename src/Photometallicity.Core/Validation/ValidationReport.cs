using System.Globalization;
using System.Text;
using Photometallicity.Catalogues;

namespace Photometallicity.Validation;

/// <summary>The suite's tables (validation.csv, validation_fields.csv), its printed table and the acceptance criteria.</summary>
public static class ValidationReport
{
    /// <summary>Bins with at least this many members with a value are judged by <see cref="Failures"/>.</summary>
    public const int MinJudged = 20;

    /// <summary>
    /// The acceptance criteria (the project's own targets): in every bin down to mu+1 with at least 20 members with
    /// values, 68% coverage in [0.60, 0.76], pull width in [0.85, 1.2], at least 90% of narrow-detected members given
    /// a value or a limit; members with narrow S/N &gt;= 25: median |bias| &lt; 0.05 dex; bad standards flagged &gt;= 80%,
    /// good standards flagged &lt;= 2%. Returns one line per failure.
    /// </summary>
    public static IReadOnlyList<string> Failures(FieldScore f)
    {
        var x = new List<string>();
        if (f.Error is not null) { x.Add($"{f.Field}: did not run: {f.Error}"); return x; }
        foreach (var (bin, s) in f.Bins)
        {
            if (bin.Lo >= 1) continue; // judged down to mu+1
            if (s.WithValue < MinJudged) continue;
            if (!(s.Coverage68 >= 0.60 && s.Coverage68 <= 0.76)) x.Add($"{f.Field} {bin.Label}: 68% coverage {s.Coverage68:F3} outside [0.60, 0.76]");
            if (!(s.PullWidth >= 0.85 && s.PullWidth <= 1.2)) x.Add($"{f.Field} {bin.Label}: pull width {s.PullWidth:F3} outside [0.85, 1.2]");
            if (!(s.ShareValueOrLimit >= 0.90)) x.Add($"{f.Field} {bin.Label}: {100 * s.ShareValueOrLimit:F1}% of narrow-detected members given a value or limit (< 90%)");
        }
        if (f.HighSnrMembers > 0 && !(Math.Abs(f.HighSnrMedianBias) < 0.05))
            x.Add($"{f.Field}: median bias {f.HighSnrMedianBias:+0.000;-0.000} dex at narrow S/N >= 25 (|bias| >= 0.05)");
        if (f.StandardsBad > 0 && !(f.BadFlaggedShare >= 0.80)) x.Add($"{f.Field}: {f.StandardsBadFlagged}/{f.StandardsBad} bad standards flagged (< 80%)");
        if (f.StandardsGood > 0 && !(f.GoodFlaggedShare <= 0.02)) x.Add($"{f.Field}: {f.StandardsGoodFlagged}/{f.StandardsGood} good standards flagged (> 2%)");
        return x;
    }

    /// <summary>validation.csv: one row per field and magnitude bin.</summary>
    public static Table BinTable(IReadOnlyList<FieldScore> fields)
    {
        var rows = fields.Where(f => f.Error is null).SelectMany(f => f.Bins.Select(b => (f, b.Bin, b.Score))).ToArray();
        int n = rows.Length;
        var t = new Table(n, "validation");
        t.Add(new Column<string>("field", rows.Select(r => r.f.Field).ToArray()));
        t.Add(new Column<string>("bin", rows.Select(r => r.Bin.Label).ToArray(), description: "true dereddened red magnitude relative to the distance modulus"));
        t.Add(new Column<double>("rel_red_lo", rows.Select(r => r.Bin.Lo).ToArray(), unit: "mag"));
        t.Add(new Column<double>("rel_red_hi", rows.Select(r => r.Bin.Hi).ToArray(), unit: "mag"));
        t.Add(new Column<int>("members", rows.Select(r => r.Score.Members).ToArray(), description: "true members in the bin"));
        t.Add(new Column<int>("narrow_detected", rows.Select(r => r.Score.NarrowDetected).ToArray(), description: "of them in the narrow-band catalogue (truth)"));
        t.Add(new Column<int>("with_value", rows.Select(r => r.Score.WithValue).ToArray(), description: "finite feh"));
        t.Add(new Column<int>("with_limit", rows.Select(r => r.Score.WithLimit).ToArray(), description: "index_above_range / index_below_range with a finite limit"));
        t.Add(new Column<double>("share_value_or_limit", rows.Select(r => R(r.Score.ShareValueOrLimit)).ToArray(), description: "of the narrow-detected members"));
        t.Add(new Column<double>("median_bias", rows.Select(r => R(r.Score.MedianBias)).ToArray(), unit: "dex", description: "median feh - truth"));
        t.Add(new Column<double>("pull_width", rows.Select(r => R(r.Score.PullWidth)).ToArray(), description: "1.4826 MAD of the pulls"));
        t.Add(new Column<double>("coverage68", rows.Select(r => R(r.Score.Coverage68)).ToArray(), description: "share with feh_lo <= truth <= feh_hi"));
        t.Add(new Column<double>("median_half_width", rows.Select(r => R(r.Score.MedianHalfWidth)).ToArray(), unit: "dex", description: "median (feh_hi - feh_lo) / 2"));
        return t;
    }

    /// <summary>validation_fields.csv: one row per field.</summary>
    public static Table FieldTable(IReadOnlyList<FieldScore> fields)
    {
        int n = fields.Count;
        var t = new Table(n, "validation_fields");
        t.Add(new Column<string>("field", fields.Select(f => f.Field).ToArray()));
        t.Add(new Column<string>("index_law", fields.Select(f => f.Law).ToArray()));
        t.Add(new Column<string>("standards", fields.Select(f => f.Standards).ToArray()));
        t.Add(new Column<double>("bad_share", fields.Select(f => R(f.BadShare)).ToArray(), description: "share of individual standards given a wrong [Fe/H]"));
        t.Add(new Column<string>("depth", fields.Select(f => f.Depth).ToArray()));
        t.Add(new Column<int>("members", fields.Select(f => f.Members).ToArray()));
        t.Add(new Column<double>("mdf_mean_true", fields.Select(f => R(f.MdfMeanTrue)).ToArray(), unit: "dex", description: "mean [Fe/H] of all true members"));
        t.Add(new Column<double>("mdf_mean", fields.Select(f => R(f.MdfMean)).ToArray(), unit: "dex", description: "summary.json mdf.mean"));
        t.Add(new Column<double>("mdf_mean_err", fields.Select(f => R(f.MdfMeanErr)).ToArray(), unit: "dex"));
        t.Add(new Column<double>("mdf_mean_pull", fields.Select(f => R((f.MdfMean - f.MdfMeanTrue) / f.MdfMeanErr)).ToArray(), description: "(mean - true) / mean_err"));
        t.Add(new Column<double>("mdf_sigma_true", fields.Select(f => R(f.MdfSigmaTrue)).ToArray(), unit: "dex", description: "standard deviation of all true members' [Fe/H]"));
        t.Add(new Column<double>("mdf_sigma", fields.Select(f => R(f.MdfSigma)).ToArray(), unit: "dex"));
        t.Add(new Column<double>("mdf_sigma_err", fields.Select(f => R(f.MdfSigmaErr)).ToArray(), unit: "dex"));
        t.Add(new Column<double>("mdf_sigma_pull", fields.Select(f => R((f.MdfSigma - f.MdfSigmaTrue) / f.MdfSigmaErr)).ToArray()));
        t.Add(new Column<int>("std_bad", fields.Select(f => f.StandardsBad).ToArray(), description: "bad standards that entered the fit"));
        t.Add(new Column<double>("std_bad_flagged", fields.Select(f => R(f.BadFlaggedShare)).ToArray(), description: "share of them flagged"));
        t.Add(new Column<int>("std_good", fields.Select(f => f.StandardsGood).ToArray()));
        t.Add(new Column<double>("std_good_flagged", fields.Select(f => R(f.GoodFlaggedShare)).ToArray()));
        t.Add(new Column<int>("high_snr_members", fields.Select(f => f.HighSnrMembers).ToArray(), description: "members with a value and narrow S/N >= 25"));
        t.Add(new Column<double>("high_snr_median_bias", fields.Select(f => R(f.HighSnrMedianBias)).ToArray(), unit: "dex"));
        t.Add(new Column<int>("criteria_failed", fields.Select(f => Failures(f).Count).ToArray(), description: "acceptance criteria failed (see README)"));
        t.Add(new Column<string>("error", fields.Select(f => f.Error ?? "").ToArray(), description: "why the field did not run"));
        return t;
    }

    /// <summary>The readable table printed on stdout.</summary>
    public static string Text(IReadOnlyList<FieldScore> fields)
    {
        var ci = CultureInfo.InvariantCulture;
        string N(double v, string fmt) => double.IsFinite(v) ? v.ToString(fmt, ci) : "-";
        var sb = new StringBuilder();
        foreach (var f in fields)
        {
            sb.Append(ci, $"== {f.Field}  law={f.Law} standards={f.Standards} bad={N(100 * f.BadShare, "F0")}% depth={f.Depth} members={f.Members}\n");
            if (f.Error is not null) { sb.Append(ci, $"   DID NOT RUN: {f.Error}\n\n"); continue; }
            sb.Append(ci, $"   MDF mean {N(f.MdfMean, "F3")} +/- {N(f.MdfMeanErr, "F3")} (true {N(f.MdfMeanTrue, "F3")}, pull {N((f.MdfMean - f.MdfMeanTrue) / f.MdfMeanErr, "+0.0;-0.0")})   "
                + $"sigma {N(f.MdfSigma, "F3")} +/- {N(f.MdfSigmaErr, "F3")} (true {N(f.MdfSigmaTrue, "F3")})\n");
            sb.Append(ci, $"   standards: bad flagged {f.StandardsBadFlagged}/{f.StandardsBad}, good flagged {f.StandardsGoodFlagged}/{f.StandardsGood}   "
                + $"bias at narrow S/N>=25: {N(f.HighSnrMedianBias, "+0.000;-0.000")} dex ({f.HighSnrMembers} stars)\n");
            sb.Append("   bin           members  narrow  value  limit  val|lim   bias   pullw   cov68   halfw\n");
            foreach (var (b, s) in f.Bins)
                sb.Append(ci, $"   {b.Label,-12} {s.Members,8} {s.NarrowDetected,7} {s.WithValue,6} {s.WithLimit,6} {N(s.ShareValueOrLimit, "F3"),8} {N(s.MedianBias, "+0.000;-0.000"),6} {N(s.PullWidth, "F2"),7} {N(s.Coverage68, "F3"),7} {N(s.MedianHalfWidth, "F3"),7}\n");
            var fail = Failures(f);
            sb.Append(ci, $"   criteria: {(fail.Count == 0 ? "all met" : fail.Count + " not met")}\n");
            foreach (var l in fail) sb.Append("     - ").Append(l).Append('\n');
            sb.Append('\n');
        }
        return sb.ToString();
    }

    private static double R(double v) => double.IsFinite(v) ? Math.Round(v, 5) : double.NaN;
}
