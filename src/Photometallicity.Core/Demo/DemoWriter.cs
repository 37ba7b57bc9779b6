using System.Globalization;
using System.Text.Json;
using Photometallicity.Catalogues;

namespace Photometallicity.Demo;

/// <summary>Writes the invented demo field and its config into a directory.</summary>
public static class DemoWriter
{
    /// <summary>Writes broad.csv, narrow.csv, standards.csv, truth/ and config.json; returns the config path.</summary>
    public static string Write(DemoField field, string directory, ulong seed)
    {
        Directory.CreateDirectory(directory);
        DemoFilters.WriteTo(directory);
        CatalogueIO.Write(field.Broadband, Path.Combine(directory, "broad.csv"));
        CatalogueIO.Write(field.Narrowband, Path.Combine(directory, "narrow.csv"));
        CatalogueIO.Write(field.Standards, Path.Combine(directory, "standards.csv"));
        CatalogueIO.Write(field.StarTruth, Path.Combine(directory, "truth", "truth_stars.csv"));
        AtomicFile.WriteAllText(Path.Combine(directory, "truth", "truth.json"),
            JsonSerializer.Serialize(field.Truth, new JsonSerializerOptions { WriteIndented = true }) + "\n");
        string config = Path.Combine(directory, "config.json");
        AtomicFile.WriteAllText(config, ConfigText(field.Truth, seed));
        return config;
    }

    public static string ConfigText(DemoTruth t, ulong seed)
    {
        var ci = CultureInfo.InvariantCulture;
        string F(double v) => v.ToString("R", ci);
        return $$"""
        // Config of the INVENTED demonstration field "{{DemoTruth.GalaxyName}}".
        // Every number, name, coordinate and filter here is invented; no real object or instrument.
        {
          "seed": {{seed}},
          "photometric_system": "invented-demo-AB",
          "broadband":  { "path": "broad.csv",  "id": "src", "ra": "ra", "dec": "dec", "missing": [99.999] },
          "narrowband": { "path": "narrow.csv", "id": "nid", "ra": "ra", "dec": "dec" },
          "bands": {
            // extinction: A_band / E(B-V), a number or computed from the (invented) filter curve
            "blue":   { "from": "broadband",  "mag": "b480", "err": "b480_err", "filter": "invented-b480",
                        "extinction": { "curve": "filters/invented_blue_b480.csv", "law": "fitzpatrick99", "rv": 3.1 } },
            "red":    { "from": "broadband",  "mag": "r770", "err": "r770_err", "filter": "invented-r770",
                        "extinction": { "curve": "filters/invented_red_r770.csv", "law": "fitzpatrick99", "rv": 3.1 } },
            "narrow": { "from": "narrowband", "mag": "n395", "err": "n395_err", "filter": "invented-n395",
                        "extinction": { "curve": "filters/invented_narrow_n395.csv", "law": "fitzpatrick99", "rv": 3.1 } }
          },
          "reddening":   { "column": "ebv", "error": 0.005 },
          "crossmatch":  { "radius_arcsec": 1.0, "solve_offset": true },
          "index":       { "colour_coefficient": {{F(t.ColourCoefficient)}} },   // X = (narrow - blue) - k (blue - red)
          "standards":   [ { "path": "standards.csv", "id": "star", "ra": "ra", "dec": "dec",
                             "feh": "feh_spec", "feh_err": "feh_spec_err" } ],
          "calibration": { "bootstrap": 300 },
          "target":      { "ra": {{F(t.CentreRaDeg)}}, "dec": {{F(t.CentreDecDeg)}}, "distance_modulus": {{F(t.DistanceModulus)}}, "half_light_arcmin": 3.0 },
          "membership":  { "use_metallicity": true },
          "output":      { "directory": "out", "formats": ["csv", "fits"] }
        }

        """;
    }
}
