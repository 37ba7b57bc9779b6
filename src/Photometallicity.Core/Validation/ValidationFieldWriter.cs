using System.Globalization;
using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Nodes;
using Photometallicity.Catalogues;
using Photometallicity.Demo;
using Photometallicity.Numerics;

namespace Photometallicity.Validation;

/// <summary>
/// Generates one invented validation field with <see cref="DemoGenerator"/> (a <see cref="DemoVariant"/>) and writes its
/// inputs (in the field's own column layout), its config and its truth into a directory:
/// broad.csv, narrow.csv, standards.csv (with the truth columns truth_bad, truth_feh), clusterK_*.csv for cluster
/// fields, filters/, config.json, truth/truth_stars.csv, truth/truth.json and truth/validation_truth.json.
/// </summary>
public static class ValidationFieldWriter
{
    /// <summary>Writes the field; returns the config path.</summary>
    public static string Write(ValidationField f, string dir, ulong seed)
    {
        ulong fieldSeed = Seeds.Derive(seed, "validation-field:" + f.Name);
        var law = IndexLaws.Of(f.Law);
        var truth = new DemoTruth
        {
            CentreRaDeg = f.RaDeg,
            CentreDecDeg = f.DecDeg,
            DistanceModulus = f.DistanceModulus,
            MeanFeh = f.MeanFeh,
            SigmaFeh = f.SigmaFeh,
        };
        truth = truth with { NarrowDepth5 = NarrowDepth5(f, truth, law) };
        var variant = new DemoVariant
        {
            GiantIndex = law,
            Standards = f.Standards switch
            {
                StandardsSource.Bright => StandardsSelection.Bright,
                StandardsSource.Spread => StandardsSelection.Spread,
                _ => StandardsSelection.None,
            },
            StandardsCount = f.StandardsCount,
            BadShare = f.Standards == StandardsSource.Cluster ? 0 : f.BadShare,
        };
        var field = DemoGenerator.Generate(f.Stars, fieldSeed, truth, variant);

        Directory.CreateDirectory(dir);
        DemoFilters.WriteTo(dir);
        CatalogueIO.Write(Renamed(field.Broadband, f.Columns.BroadMap), Path.Combine(dir, "broad.csv"));
        CatalogueIO.Write(Renamed(field.Narrowband, f.Columns.NarrowMap), Path.Combine(dir, "narrow.csv"));
        if (f.Standards != StandardsSource.Cluster)
            CatalogueIO.Write(Renamed(field.Standards, f.Columns.StandardsMap), Path.Combine(dir, "standards.csv"));
        else
            InventedClusters.WriteAll(dir, law, f.Columns, fieldSeed);
        CatalogueIO.Write(field.StarTruth, Path.Combine(dir, "truth", "truth_stars.csv"));
        AtomicFile.WriteAllText(Path.Combine(dir, "truth", "truth.json"),
            JsonSerializer.Serialize(field.Truth, new JsonSerializerOptions { WriteIndented = true }) + "\n");
        AtomicFile.WriteAllText(Path.Combine(dir, "truth", "validation_truth.json"), TruthJson(f, field).ToJsonString(new JsonSerializerOptions { WriteIndented = true, Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping }) + "\n");
        string config = Path.Combine(dir, "config.json");
        AtomicFile.WriteAllText(config, ConfigText(f, truth, fieldSeed));
        return config;
    }

    /// <summary>
    /// The narrow band's 5-sigma depth (apparent mag): shallow puts S/N = 7 on a member at red0 = mu + 1 with the MDF's
    /// mean [Fe/H] and the field's mean reddening; deep is 1.5 mag deeper (S/N about 28 there).
    /// </summary>
    public static double NarrowDepth5(ValidationField f, DemoTruth t, Func<double, double, double> law)
    {
        double feh = f.MeanFeh;
        // absolute blue magnitude whose red magnitude is +1 on the invented branch: bisection (red = blue - colour rises with blue)
        double lo = -3, hi = 6;
        for (int it = 0; it < 60; it++)
        {
            double mid = 0.5 * (lo + hi);
            if (mid - DemoTruth.GiantColour(mid, feh) < 1.0) lo = mid; else hi = mid;
        }
        double absB = 0.5 * (lo + hi), c0 = DemoTruth.GiantColour(absB, feh);
        double narrow = t.DistanceModulus + absB + law(c0, feh) + t.ColourCoefficient * c0 + t.ExtinctionCoefficients[2] * t.MeanEbv;
        double shallow = narrow + 2.5 * Math.Log10(7.0 / 5.0);
        return Math.Round(f.Depth == NarrowDepth.Shallow ? shallow : shallow + 1.5, 3);
    }

    private static Table Renamed(Table t, IReadOnlyDictionary<string, string> map)
    {
        var r = new Table(t.RowCount, t.Source);
        foreach (var c in t.Columns) r.Add(map.TryGetValue(c.Name, out var n) ? c.Rename(n) : c);
        return r;
    }

    private static JsonObject TruthJson(ValidationField f, DemoField field)
    {
        var st = field.StarTruth;
        var isMember = st["is_member"];
        var feh = st["feh_true"];
        var m = new List<double>();
        for (int i = 0; i < st.RowCount; i++)
            if (isMember.GetDouble(i) != 0) m.Add(feh.GetDouble(i));
        double mean = m.Average();
        double sd = Math.Sqrt(m.Sum(x => (x - mean) * (x - mean)) / (m.Count - 1));
        int nStd = f.Standards == StandardsSource.Cluster ? 0 : field.Standards.RowCount;
        int nBad = 0;
        if (nStd > 0) { var tb = field.Standards["truth_bad"]; for (int i = 0; i < nStd; i++) nBad += tb.GetDouble(i) != 0 ? 1 : 0; }
        var o = new JsonObject
        {
            ["note"] = "EVERYTHING IN THIS FIELD IS INVENTED (galaxy, position, filters, index law, numbers).",
            ["field"] = f.Name,
            ["galaxy"] = f.Galaxy,
            ["index_law"] = IndexLaws.Name(f.Law),
            ["index_law_formula"] = IndexLaws.Formula(f.Law),
            ["standards"] = f.StandardsName,
            ["standards_count"] = nStd,
            ["bad_standards"] = nBad,
            ["bad_share"] = nStd > 0 ? (double)nBad / nStd : 0.0,
            ["depth"] = f.DepthName,
            ["narrow_depth5"] = field.Truth.NarrowDepth5,
            ["distance_modulus"] = f.DistanceModulus,
            ["ra"] = f.RaDeg,
            ["dec"] = f.DecDeg,
            ["columns"] = f.Columns.Name,
            ["standards_id_column"] = f.Columns.StdId,
            ["members"] = m.Count,
            ["mdf_mean_true"] = Math.Round(mean, 5),
            ["mdf_sigma_true"] = Math.Round(sd, 5),
        };
        if (f.Standards == StandardsSource.Cluster)
        {
            var arr = new JsonArray();
            foreach (var c in InventedClusters.All)
                arr.Add(new JsonObject { ["name"] = c.Name, ["feh"] = c.Feh, ["feh_err"] = c.FehErr });
            o["clusters"] = arr;
        }
        return o;
    }

    public static string ConfigText(ValidationField f, DemoTruth t, ulong seed)
    {
        var ci = CultureInfo.InvariantCulture;
        string F(double v) => v.ToString("R", ci);
        var c = f.Columns;
        string standards = f.Standards == StandardsSource.Cluster
            ? InventedClusters.ConfigEntries(c)
            : $$"""    { "path": "standards.csv", "id": "{{c.StdId}}", "ra": "{{c.StdRa}}", "dec": "{{c.StdDec}}", "feh": "{{c.StdFeh}}", "feh_err": "{{c.StdFehErr}}" }""";
        return $$"""
        // Config of the INVENTED validation field "{{f.Name}}" ({{f.Galaxy}}).
        // Every number, name, coordinate and filter here is invented; no real object or instrument.
        {
          "seed": {{seed}},
          "photometric_system": "invented-demo-AB",
          "broadband":  { "path": "broad.csv",  "id": "{{c.BroadId}}", "ra": "{{c.BroadRa}}", "dec": "{{c.BroadDec}}", "missing": [99.999] },
          "narrowband": { "path": "narrow.csv", "id": "{{c.NarrowId}}", "ra": "{{c.NarrowRa}}", "dec": "{{c.NarrowDec}}" },
          "bands": {
            "blue":   { "from": "broadband",  "mag": "{{c.Blue}}", "err": "{{c.BlueErr}}", "filter": "invented-b480",
                        "extinction": { "curve": "filters/invented_blue_b480.csv", "law": "fitzpatrick99", "rv": 3.1 } },
            "red":    { "from": "broadband",  "mag": "{{c.Red}}", "err": "{{c.RedErr}}", "filter": "invented-r770",
                        "extinction": { "curve": "filters/invented_red_r770.csv", "law": "fitzpatrick99", "rv": 3.1 } },
            "narrow": { "from": "narrowband", "mag": "{{c.Narrow}}", "err": "{{c.NarrowErr}}", "filter": "invented-n395",
                        "extinction": { "curve": "filters/invented_narrow_n395.csv", "law": "fitzpatrick99", "rv": 3.1 } }
          },
          "reddening":   { "column": "{{c.Ebv}}", "error": 0.005 },
          "crossmatch":  { "radius_arcsec": 1.0, "solve_offset": true },
          "index":       { "colour_coefficient": {{F(t.ColourCoefficient)}} },
          "standards":   [
        {{standards}}
          ],
          "calibration": { "bootstrap": {{f.Bootstrap}} },
          "target":      { "ra": {{F(t.CentreRaDeg)}}, "dec": {{F(t.CentreDecDeg)}}, "distance_modulus": {{F(t.DistanceModulus)}}, "half_light_arcmin": 3.0 },
          "membership":  { "use_metallicity": true },
          "output":      { "directory": "out", "formats": ["csv"], "plots": false }
        }

        """;
    }
}
