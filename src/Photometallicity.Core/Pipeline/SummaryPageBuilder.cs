using System.Text.Json.Nodes;
using Photometallicity.Reporting;

namespace Photometallicity.Pipeline;

/// <summary>Turns summary.json into the summary page's content: inputs, outputs, warnings, key numbers, figures, provenance.</summary>
public static class SummaryPageBuilder
{
    public static SummaryPageData Build(string directory, JsonObject s, IReadOnlyList<FigureEntry> figures)
    {
        double N(JsonNode? n) => RunReport.Num(n);
        var inputs = s["inputs"]!.AsArray().Select(i => new InputFileEntry((string)i!["path"]!, null, (string)i["sha256"]!)).ToList();
        var rows = s["rows"]!.AsObject();
        if (inputs.Count >= 3)
        {
            inputs[0] = inputs[0] with { Role = "config" };
            inputs[1] = inputs[1] with { Role = "broadband catalogue", Rows = (long?)rows["broadband"] };
            inputs[2] = inputs[2] with { Role = "narrow-band catalogue", Rows = (long?)rows["narrowband"] };
            for (int k = 3; k < inputs.Count; k++) inputs[k] = inputs[k] with { Role = "spectroscopic standards" };
        }
        var outputs = Directory.GetFiles(directory).Select(Path.GetFileName).Where(f => f is not null && !f.StartsWith('.')).Order(StringComparer.Ordinal)
            .Select(f => new OutputFileEntry(f!, Describe(f!))).ToList();
        var cm = s["crossmatch"]!.AsObject();
        var cal = s["calibration"]!.AsObject();
        var mem = s["members"]?.AsObject() ?? new JsonObject();
        var mdf = s["mdf"] as JsonObject;
        var off = cm["offset_arcsec"]!.AsArray();
        var offErr = cm["offset_err_arcsec"]!.AsArray();
        var keys = new List<KeyNumber>
        {
            new("Broadband sources", N(rows["broadband"]), null, "", "F0"),
            new("Matched to the narrow band", N(cm["matched"]), null, "", "F0"),
            new("Astrometric offset, delta RA cos Dec (narrow - broad)", N(off[0]), N(offErr[0]), "arcsec"),
            new("Astrometric offset, delta Dec (narrow - broad)", N(off[1]), N(offErr[1]), "arcsec"),
            new("False-match rate, expected", 100 * N(cm["false_match_rate_expected"]), null, "%", "F2"),
            new("False-match rate, measured (shifted catalogue)", 100 * N(cm["false_match_rate_measured"]), null, "%", "F2"),
            new("Calibration standards used", N(cal["standards_used"]), null, "", "F0"),
            new("Calibration standards rejected as outliers", N(cal["standards_rejected"]), null, "", "F0"),
            new("Calibration residual rms", N(cal["rms_dex"]), null, "dex"),
            new("Calibration intrinsic scatter", N(cal["sigma_int_mag"]), null, "mag"),
            new("Calibration: share of standards in the outlier component", N(cal["outlier_fraction"]), null, "", "F3"),
            new("Narrow-band detection complete to blue0", N(s["photometry"]!["narrow_complete_to_blue0_mag"]), null, "mag", "F2"),
            new("Expected members (sum of p_member)", N(mem["expected"]), null, "", "F1"),
            new("Half-light radius", N(mem["half_light_arcmin"]), N(mem["half_light_err_arcmin"]), "arcmin"),
            new("Ellipticity", N(mem["ellipticity"]), N(mem["ellipticity_err"]), ""),
            new("Position angle (east of north)", N(mem["position_angle_deg"]), N(mem["position_angle_err_deg"]), "deg", "F1"),
        };
        if (mdf is not null)
        {
            keys.Add(new("Members' mean [Fe/H]", N(mdf["mean"]), N(mdf["mean_err"]), "dex"));
            keys.Add(new("Members' intrinsic [Fe/H] spread", N(mdf["sigma"]), N(mdf["sigma_err"]), "dex"));
        }
        // How deep the values reach: per bin of red0 - mu, the members' median 16-84% half-width and the share of narrow-band
        // detected members given a value (the `depth` table of summary.json has the rest).
        if (s["depth"] is JsonArray depth)
            foreach (var row in depth.OfType<JsonObject>())
            {
                var bin = row["red0_minus_mu"]!.AsArray();
                string range = $"[{(double)bin[0]!:+0;-0;0}, {(double)bin[1]!:+0;-0;0})";
                keys.Add(new($"Members at red0 - mu in {range}: median [Fe/H] half-width ({N(row["members_expected"]):F0} expected, {100 * N(row["share_with_value"]):F0}% of the detected with a value, {100 * N(row["share_extrapolated"]):F0}% of those extrapolated)",
                    N(row["median_half_width_dex"]), null, "dex", "F2"));
            }
        var warnings = s["warnings"]!.AsArray().Select(w => (string)w!).ToList();
        var prov = s["provenance"]!.AsObject();
        var settings = new List<KeyValuePair<string, string>>
        {
            new("config", (string?)prov["config"] ?? ""),
            new("calibration bootstrap seed", prov["seeds"]?["calibration_bootstrap"]?.ToString() ?? ""),
            new("membership seed", prov["seeds"]?["membership"]?.ToString() ?? ""),
            new("calibration model", (string?)cal["model"] ?? ""),
        };
        var provenance = new ProvenanceInfo((string?)prov["version"] ?? "", (long?)(ulong?)prov["seed"], settings, prov["resolved_config"]?.ToJsonString(RunOutputWriter.JsonOptions));
        return new SummaryPageData("Photometallicity run summary", inputs, outputs, warnings, keys, figures, provenance);
    }

    private static string? Describe(string file) => file switch
    {
        "stars.csv" or "stars.fits" or "stars.parquet" => "one row per broadband source: [Fe/H], membership, status",
        "summary.json" => "key numbers, warnings and provenance (machine-readable)",
        "calibration.json" => "the calibration, reusable by 'assign' in the same filters",
        "calibration_residuals.csv" => "every standard with its verdict and residuals",
        "forecast.csv" => "expected [Fe/H] precision against magnitude",
        "summary.html" => "this page",
        "summary.md" => "this page as Markdown",
        _ => null,
    };
}
