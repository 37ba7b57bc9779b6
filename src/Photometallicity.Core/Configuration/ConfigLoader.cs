using System.Text.Json;
using Photometallicity.Errors;
using Photometallicity.Units;

namespace Photometallicity.Configuration;

/// <summary>
/// Reads and validates the JSON config (comments and trailing commas allowed) before any work is done.
/// Unknown keys, missing required keys, wrong types, values out of range and missing files are
/// <see cref="InputException"/>s naming the key or file. Paths are relative to the config file.
/// The defaults are documented in README.md ("Config reference") and here beside each key.
/// </summary>
public static partial class ConfigLoader
{
    private static readonly JsonDocumentOptions Options = new()
    {
        CommentHandling = JsonCommentHandling.Skip,
        AllowTrailingCommas = true,
        MaxDepth = 32,
    };

    public static PipelineConfig Load(string path, string? outputOverride = null)
    {
        string full = System.IO.Path.GetFullPath(path);
        if (!File.Exists(full)) throw new InputException("config file not found", path);
        JsonDocument doc;
        try
        {
            doc = JsonDocument.Parse(File.ReadAllText(full), Options);
        }
        catch (JsonException e)
        {
            throw new InputException($"not valid JSON: {e.Message}", path);
        }
        using (doc)
        {
            var root = new ConfigNode(doc.RootElement, "", path).RequireObject();
            string dir = System.IO.Path.GetDirectoryName(full)!;
            return Parse(root, full, dir, outputOverride);
        }
    }

    private static PipelineConfig Parse(ConfigNode root, string configPath, string dir, string? outputOverride)
    {
        ulong seed = root.Optional("seed")?.AsSeed() ?? 1UL; // default master seed 1
        var broad = Catalogue(root.Required("broadband"), dir);
        var narrow = Catalogue(root.Required("narrowband"), dir);
        string system = root.Optional("photometric_system")?.AsString() ?? "unspecified";

        var bandsNode = root.Required("bands").RequireObject();
        var blue = Band(bandsNode.Required("blue"), "blue", dir);
        var red = Band(bandsNode.Required("red"), "red", dir);
        var nb = Band(bandsNode.Required("narrow"), "narrow", dir);
        bandsNode.RejectUnknown();

        var reddening = Reddening(root.Optional("reddening"));
        var cross = CrossMatch(root.Optional("crossmatch"));
        var index = Index(root.Optional("index"));
        var (standards, clusters) = Standards(root.Required("standards"), dir, cross);
        var calibration = Calibration(root.Optional("calibration"), seed);
        var metallicity = Metallicity(root.Optional("metallicity"));
        var target = Target(root.Required("target"));
        var membership = Membership(root.Optional("membership"), dir);
        var forecast = Forecast(root.Optional("forecast"));
        var output = Output(root.Optional("output"), dir, outputOverride);
        root.RejectUnknown();

        return new PipelineConfig
        {
            ConfigPath = configPath,
            Seed = seed,
            Broadband = broad,
            Narrowband = narrow,
            PhotometricSystem = system,
            Blue = blue,
            Red = red,
            Narrow = nb,
            Reddening = reddening,
            CrossMatch = cross,
            Index = index,
            Standards = standards,
            ClusterStandards = clusters,
            Calibration = calibration,
            Metallicity = metallicity,
            Target = target,
            Membership = membership,
            Forecast = forecast,
            Output = output,
        };
    }

    private static string ExistingFile(ConfigNode node, string dir)
    {
        string rel = node.AsString();
        string full = System.IO.Path.GetFullPath(System.IO.Path.Combine(dir, rel));
        if (!File.Exists(full)) throw new InputException($"config key '{node.Path}': file not found: {rel} (looked at {full})", node.File);
        return full;
    }

    private static CatalogueConfig Catalogue(ConfigNode n, string dir)
    {
        n.RequireObject();
        var c = new CatalogueConfig(
            ExistingFile(n.Required("path"), dir),
            n.Optional("id")?.AsString(),
            n.Optional("ra")?.AsString() ?? "ra",
            n.Optional("dec")?.AsString() ?? "dec",
            n.Optional("flag")?.AsString(),
            n.Optional("missing") is { } m ? m.Items().Select(i => i.AsNumber()).ToArray() : [],
            n.Optional("extension")?.AsString());
        n.RejectUnknown();
        return c;
    }

    private static BandConfig Band(ConfigNode n, string name, string dir)
    {
        n.RequireObject();
        var fromNode = n.Required("from");
        var from = fromNode.AsString() switch
        {
            "broadband" => CatalogueSide.Broadband,
            "narrowband" => CatalogueSide.Narrowband,
            var s => throw fromNode.Error($"'{s}' is not a catalogue; use \"broadband\" or \"narrowband\""),
        };
        var ext = Extinction(n.Required("extinction"), dir);
        var b = new BandConfig(
            name,
            from,
            n.Required("mag").AsString(),
            n.Required("err").AsString(),
            ext,
            n.Optional("zero_point")?.AsNumber(-5, 5) ?? 0.0,   // mag added to the catalogue magnitude; default 0
            n.Optional("max_error")?.AsNumber(0.001, 10) ?? 0.3, // mag; larger errors flag the star; default 0.3 (common practice)
            "");
        b = b with { Filter = n.Optional("filter")?.AsString() ?? b.MagColumn }; // filter name; default: the magnitude column's name
        n.RejectUnknown();
        return b;
    }

    private static ExtinctionSpec Extinction(ConfigNode n, string dir)
    {
        if (n.IsKind(JsonValueKind.Number)) return new ExtinctionSpec(n.AsNumber(0, 20), null, "fitzpatrick99", 3.1, null);
        if (!n.IsKind(JsonValueKind.Object)) throw n.Error("expected a number (A_band / E(B-V)) or an object { \"curve\": ..., \"law\": ..., \"rv\": ... }");
        var spec = new ExtinctionSpec(
            null,
            ExistingFile(n.Required("curve"), dir),
            LawName(n.Optional("law")),
            n.Optional("rv")?.AsNumber(1.5, 7.0) ?? 3.1,           // default R_V = 3.1, the diffuse-ISM average (Cardelli et al. 1989)
            n.Optional("teff")?.AsNumber(2000, 60000));
        n.RejectUnknown();
        return spec;
    }

    private static string LawName(ConfigNode? n)
    {
        if (n is null) return "fitzpatrick99";
        string s = n.AsString().ToLowerInvariant();
        return s is "ccm89" or "odonnell94" or "fitzpatrick99" ? s
            : throw n.Error($"unknown extinction law '{s}'; the known laws are ccm89, odonnell94, fitzpatrick99");
    }

    private static ReddeningConfig Reddening(ConfigNode? n)
    {
        if (n is null) return new ReddeningConfig(null, 0.0, null, null);
        n.RequireObject();
        var r = new ReddeningConfig(
            n.Optional("column")?.AsString(),
            n.Optional("value")?.AsNumber(0, 10),
            n.Optional("error_column")?.AsString(),
            n.Optional("error")?.AsNumber(0, 10));
        n.RejectUnknown();
        if ((r.Column is null) == (r.Value is null)) throw n.Error("give exactly one of \"column\" (per-star E(B-V)) or \"value\" (one E(B-V) for all stars)");
        if (r.ErrorColumn is not null && r.Error is not null) throw n.Error("give at most one of \"error_column\" and \"error\"");
        return r;
    }

    private static CrossMatchConfig CrossMatch(ConfigNode? n)
    {
        if (n is null) return new CrossMatchConfig(1.0, false, true, false);
        n.RequireObject();
        double? radius = 1.0; // arcsec; default 1.0
        bool auto = false;
        if (n.Optional("radius_arcsec") is { } rn)
        {
            if (rn.IsKind(JsonValueKind.String) && rn.AsString() == "auto") { auto = true; radius = null; }
            else radius = rn.AsNumber(0.01, 60);
        }
        var c = new CrossMatchConfig(radius, auto, n.Optional("solve_offset")?.AsBool() ?? true, n.Optional("solve_rotation")?.AsBool() ?? false);
        n.RejectUnknown();
        return c;
    }

    private static IndexConfig Index(ConfigNode? n)
    {
        if (n is null) return new IndexConfig(1.0, null, null);
        n.RequireObject();
        double k = n.Optional("colour_coefficient")?.AsNumber(-10, 10) ?? 1.0; // default k = 1 (invented default; set it for your filters)
        double? lo = null, hi = null;
        if (n.Optional("colour_range") is { } cr)
        {
            var v = cr.Items().Select(i => i.AsNumber()).ToArray();
            if (v.Length != 2 || !(v[0] < v[1])) throw cr.Error("expected [min, max] with min < max (mag)");
            lo = v[0]; hi = v[1];
        }
        n.RejectUnknown();
        return new IndexConfig(k, lo, hi);
    }

    private static (IReadOnlyList<StandardSetConfig>, IReadOnlyList<ClusterStandardConfig>) Standards(ConfigNode n, string dir, CrossMatchConfig cross)
    {
        var list = new List<StandardSetConfig>();
        var clusters = new List<ClusterStandardConfig>();
        foreach (var s in n.Items())
        {
            s.RequireObject();
            string kind = s.Optional("kind")?.AsString() ?? "stars"; // default: a list of individual stars
            if (kind == "cluster") { clusters.Add(ClusterStandard(s, dir)); continue; }
            if (kind != "stars") throw s.Required("kind").Error($"unknown kind of standard set '{kind}'; use \"stars\" (a list of individual stars) or \"cluster\" (a cluster field)");
            string path = ExistingFile(s.Required("path"), dir);
            list.Add(new StandardSetConfig(
                path,
                s.Optional("id")?.AsString(),
                s.Optional("ra")?.AsString() ?? "ra",
                s.Optional("dec")?.AsString() ?? "dec",
                s.Required("feh").AsString(),
                s.Required("feh_err").AsString(),
                s.Optional("logg")?.AsString(),
                s.Optional("match_radius_arcsec")?.AsNumber(0.01, 60) ?? cross.RadiusArcsec ?? 1.0,
                s.Optional("name")?.AsString() ?? System.IO.Path.GetFileNameWithoutExtension(path)));
            s.RejectUnknown();
        }
        if (list.Count + clusters.Count == 0) throw n.Error("at least one standard set is needed to calibrate the index");
        var names = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        foreach (var c in clusters)
            if (!names.Add(c.Name.Replace(" ", "", StringComparison.Ordinal))) throw new InputException($"config key '{c.Key}.name': cluster '{c.Name}' is listed twice among the standards", n.File);
        return (list, clusters);
    }

    private static CalibrationConfig Calibration(ConfigNode? n, ulong seed)
    {
        if (n is null) return new CalibrationConfig(1000, seed, null, 2, null, 2);
        n.RequireObject();
        var c = new CalibrationConfig(
            n.Optional("bootstrap")?.AsInt(0, 100000) ?? 1000,       // resamples; default 1000
            n.Optional("seed")?.AsSeed() ?? seed,                     // default: the master seed
            n.Optional("degree")?.AsInt(1, 4),                        // colour degree (polynomial: total degree); default: by cross-validation
            n.Optional("max_degree")?.AsInt(1, 4) ?? 2,
            n.Optional("knots")?.AsInt(0, 4),                         // interior [Fe/H] knots; default: chosen by cross-validation
            n.Optional("max_knots")?.AsInt(0, 4) ?? 2)
        {
            GiantMaxLogG = n.Optional("giant_max_logg")?.AsNumber(0, 6) ?? 3.5, // giants/dwarfs boundary; common practice
            Monotone = n.Optional("model") is { } mn ? mn.AsString() switch
            {
                "monotone" => true,
                "polynomial" => false,
                var other => throw mn.Error($"must be \"monotone\" or \"polynomial\", not \"{other}\""),
            } : true,
            Outliers = n.Optional("outliers")?.AsBool() ?? true,
        };
        n.RejectUnknown();
        int maxDeg = c.Monotone ? 3 : 4;
        if (c.Degree > maxDeg || c.MaxDegree > maxDeg) throw n.Error($"degree and max_degree go up to {maxDeg} for the {(c.Monotone ? "monotone" : "polynomial")} model");
        return c;
    }

    private static MetallicityConfig Metallicity(ConfigNode? n)
    {
        if (n is null) return new MetallicityConfig(-4.5, 1.0, 0.01, null, null);
        n.RequireObject();
        var m = new MetallicityConfig(
            n.Optional("grid_min")?.AsNumber(-6, 0) ?? -4.5,
            n.Optional("grid_max")?.AsNumber(-2, 2) ?? 1.0,
            n.Optional("grid_step")?.AsNumber(0.001, 0.1) ?? 0.01,
            n.Optional("prior_mean")?.AsNumber(-6, 2),
            n.Optional("prior_sigma")?.AsNumber(0.01, 10))
        {
            StrictDomain = n.Optional("domain") is { } dn ? dn.AsString() switch
            {
                "extrapolate" => false,
                "hull" => true,
                var other => throw dn.Error($"must be \"extrapolate\" or \"hull\", not \"{other}\""),
            } : false,
            ColourReach = n.Optional("colour_reach")?.AsNumber(0, 3) ?? Photometallicity.Metallicity.MetallicityOptions.DefaultColourReach,
        };
        n.RejectUnknown();
        if (!(m.GridMin < m.GridMax)) throw n.Error($"grid_min ({m.GridMin}) must be below grid_max ({m.GridMax})");
        if ((m.PriorMean is null) != (m.PriorSigma is null)) throw n.Error("give both prior_mean and prior_sigma for a Gaussian prior, or neither for a flat prior");
        return m;
    }

    private static TargetConfig Target(ConfigNode n)
    {
        n.RequireObject();
        double ra = n.Required("ra").AsNumber(0, 360);
        if (ra >= 360) throw n.Required("ra").Error("RA must be below 360 deg");
        double dec = n.Required("dec").AsNumber(-90, 90);
        var t = new TargetConfig(
            SkyPosition.FromDegrees(ra, dec),
            n.Required("distance_modulus").AsNumber(0, 40),
            n.Optional("half_light_arcmin")?.AsNumber(0.01, 600),
            ProfileName(n.Optional("profile")));
        n.RejectUnknown();
        return t;
    }

    private static string ProfileName(ConfigNode? n)
    {
        if (n is null) return "plummer";
        string s = n.AsString().ToLowerInvariant();
        return s is "plummer" or "exponential" ? s : throw n.Error($"unknown profile '{s}'; use plummer or exponential");
    }

    private static MembershipConfig Membership(ConfigNode? n, string dir)
    {
        if (n is null) return new MembershipConfig(true, 3.0, "red");
        n.RequireObject();
        var m = new MembershipConfig(
            n.Optional("use_metallicity")?.AsBool() ?? true,
            n.Optional("outer_radius_multiple")?.AsNumber(1.5, 50) ?? 3.0,
            n.Optional("magnitude_band")?.AsString() ?? "red")
        {
            PmRaColumn = n.Optional("pm_ra")?.AsString(),
            PmDecColumn = n.Optional("pm_dec")?.AsString(),
            PmRaErrColumn = n.Optional("pm_ra_err")?.AsString(),
            PmDecErrColumn = n.Optional("pm_dec_err")?.AsString(),
            ParallaxColumn = n.Optional("parallax")?.AsString(),
            ParallaxErrColumn = n.Optional("parallax_err")?.AsString(),
            FiducialPath = n.Optional("fiducial") is { } fn ? ExistingFile(fn, dir) : null,
        };
        n.RejectUnknown();
        if (m.MagnitudeBand is not ("blue" or "red")) throw n.Error($"magnitude_band '{m.MagnitudeBand}' must be \"blue\" or \"red\"");
        string?[] pm = [m.PmRaColumn, m.PmDecColumn, m.PmRaErrColumn, m.PmDecErrColumn];
        if (pm.Any(c => c is not null) && pm.Any(c => c is null))
            throw n.Error("proper motions need all four of pm_ra, pm_dec, pm_ra_err, pm_dec_err (columns of the broadband catalogue, mas/yr)");
        if ((m.ParallaxColumn is null) != (m.ParallaxErrColumn is null))
            throw n.Error("a parallax needs both parallax and parallax_err (columns of the broadband catalogue, mas)");
        return m;
    }

    private static ForecastConfig Forecast(ConfigNode? n)
    {
        if (n is null) return new ForecastConfig(0.2, [0.8, 1.0, 1.2], -1.5);
        n.RequireObject();
        var f = new ForecastConfig(
            n.Optional("precision_dex")?.AsNumber(0.01, 2) ?? 0.2,
            n.Optional("colours") is { } c ? c.Items().Select(i => i.AsNumber(-2, 5)).ToArray() : [0.8, 1.0, 1.2],
            n.Optional("feh")?.AsNumber(-5, 1) ?? -1.5);
        n.RejectUnknown();
        return f;
    }

    private static OutputConfig Output(ConfigNode? n, string dir, string? outputOverride)
    {
        string d = "out";
        string[] formats = ["csv"];
        bool plots = true;
        if (n is not null)
        {
            n.RequireObject();
            d = n.Optional("directory")?.AsString() ?? d;
            if (n.Optional("formats") is { } fn)
            {
                formats = fn.Items().Select(i => i.AsString().ToLowerInvariant()).ToArray();
                foreach (var f in formats)
                    if (f is not ("csv" or "fits" or "parquet")) throw fn.Error($"unknown output format '{f}'; use csv, fits, parquet");
                if (!formats.Contains("csv")) formats = ["csv", .. formats];
            }
            plots = n.Optional("plots")?.AsBool() ?? true;
            n.RejectUnknown();
        }
        string outDir = outputOverride is not null ? System.IO.Path.GetFullPath(outputOverride) : System.IO.Path.GetFullPath(System.IO.Path.Combine(dir, d));
        return new OutputConfig(outDir, formats.Distinct().ToArray(), plots);
    }
}
