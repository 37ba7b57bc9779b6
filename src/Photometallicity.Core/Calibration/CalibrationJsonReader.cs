using System.Text.Json;
using Photometallicity.Errors;

namespace Photometallicity.Calibration;

/// <summary>
/// Reads calibration.json written by <see cref="CalibrationJson"/>. Every problem is an
/// <see cref="InputException"/> naming the file and the key (dotted path) and what is wrong; unknown top-level
/// keys are errors (a misspelt key is not silently ignored); the "fit" diagnostics are not read.
/// </summary>
public static class CalibrationJsonReader
{
    private static readonly string[] TopKeys = ["format", "format_version", "filters", "model", "domain", "extrapolation", "quality", "ensemble", "provenance", "fit"];

    public static CalibrationModel Read(string path)
    {
        byte[] bytes;
        try { bytes = File.ReadAllBytes(path); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException($"cannot read the calibration file: {e.Message}", file: path, inner: e);
        }
        JsonDocument doc;
        try { doc = JsonDocument.Parse(bytes); }
        catch (JsonException e)
        {
            throw new InputException($"not valid JSON (line {e.LineNumber + 1}): {e.Message}", file: path, inner: e);
        }
        using (doc) return Parse(doc.RootElement, path);
    }

    private static CalibrationModel Parse(JsonElement root, string file)
    {
        var r = new Reader(file);
        if (root.ValueKind != JsonValueKind.Object) throw r.Error("(root)", "must be a JSON object");
        foreach (var prop in root.EnumerateObject())
            if (!TopKeys.Contains(prop.Name)) throw r.Error(prop.Name, $"unknown key (known: {string.Join(", ", TopKeys)})");
        if (r.Str(root, "format", "") != CalibrationJson.FormatName) throw r.Error("format", $"must be \"{CalibrationJson.FormatName}\"");
        int version = r.Int(root, "format_version", "");
        if (version is < 1 or > CalibrationJson.FormatVersion) throw r.Error("format_version", $"version {version} is not supported (this program reads versions 1 to {CalibrationJson.FormatVersion})");

        var fo = r.Obj(root, "filters", "");
        var filters = new FilterSet(r.Str(fo, "system", "filters"), r.Str(fo, "blue_band", "filters"), r.Str(fo, "red_band", "filters"),
            r.Str(fo, "narrow_band", "filters"), r.Dbl(fo, "colour_coefficient", "filters"), r.Dbl(fo, "blue_extinction", "filters"),
            r.Dbl(fo, "red_extinction", "filters"), r.Dbl(fo, "narrow_extinction", "filters"));

        var mo = r.Obj(root, "model", "");
        string kind = mo.TryGetProperty("kind", out _) ? r.Str(mo, "kind", "model") : "polynomial";
        IIndexBasis basis;
        if (kind == "polynomial")
        {
            int degree = r.Int(mo, "degree", "model");
            if (degree < 1 || degree > 4) throw r.Error("model.degree", $"{degree} is outside [1, 4]");
            double cs = r.Dbl(mo, "colour_scale", "model"), fs = r.Dbl(mo, "feh_scale", "model");
            if (!(cs > 0)) throw r.Error("model.colour_scale", "must be positive");
            if (!(fs > 0)) throw r.Error("model.feh_scale", "must be positive");
            basis = new PolynomialBasis2D(degree, r.Dbl(mo, "colour_centre", "model"), cs, r.Dbl(mo, "feh_centre", "model"), fs);
        }
        else if (kind is "monotone" or "separable")
        {
            int cd = r.Int(mo, "colour_degree", "model");
            if (cd < 1 || cd > 3) throw r.Error("model.colour_degree", $"{cd} is outside [1, 3]");
            double cLo = r.Dbl(mo, "colour_lo", "model"), cHi = r.Dbl(mo, "colour_hi", "model");
            if (!(cHi > cLo)) throw r.Error("model.colour_hi", "must be above colour_lo");
            double fLo = r.Dbl(mo, "feh_lo", "model"), fHi = r.Dbl(mo, "feh_hi", "model");
            if (!(fHi > fLo)) throw r.Error("model.feh_hi", "must be above feh_lo");
            var knotsEl = r.Arr(mo, "feh_knots", "model");
            var knots = r.DoubleArray(knotsEl, "model.feh_knots", knotsEl.GetArrayLength());
            for (int k = 0; k < knots.Length; k++)
                if (!(knots[k] > (k == 0 ? fLo : knots[k - 1]) && knots[k] < fHi)) throw r.Error($"model.feh_knots[{k}]", "knots must increase strictly inside (feh_lo, feh_hi)");
            var ramps = new MonotoneRamps(fLo, fHi, knots);
            if (kind == "monotone") basis = new MonotoneBasis(cd, cLo, cHi, ramps);
            else
            {
                double gamma = r.Dbl(mo, "gamma", "model");
                if (!(gamma > -1)) throw r.Error("model.gamma", "must be above -1 (the amplitude ratio 1 + gamma must be positive)");
                basis = new SeparableBasis(cd, cLo, cHi, ramps, gamma);
            }
        }
        else throw r.Error("model.kind", $"\"{kind}\" is not a model kind (known: polynomial, monotone, separable)");
        int p = basis.Count;
        var coef = r.Doubles(mo, "coefficients", "model", p);
        var cov = r.Doubles(mo, "coefficient_covariance", "model", p * p);
        double sigma = r.Dbl(mo, "sigma_int_mag", "model");
        if (!(sigma >= 0)) throw r.Error("model.sigma_int_mag", "must not be negative");

        var dom = r.Obj(root, "domain", "");
        var hull = r.Pairs(dom, "hull", "domain");
        if (hull.Count == 0) throw r.Error("domain.hull", "must hold at least one point");
        var excluded = r.Pairs(dom, "excluded_colours", "domain");

        Extrapolation? extra = null;
        double outlierFraction = mo.TryGetProperty("outlier_fraction", out _) ? r.DblOrNaN(mo, "outlier_fraction", "model") : double.NaN;

        var q = r.Obj(root, "quality", "");
        var en = r.Obj(root, "ensemble", "");
        var members = r.Arr(en, "coefficients", "ensemble");
        var ens = new double[members.GetArrayLength()][];
        int m = 0;
        foreach (var row in members.EnumerateArray())
        {
            ens[m] = r.DoubleArray(row, $"ensemble.coefficients[{m}]", p);
            m++;
        }
        var ensSigma = r.Doubles(en, "sigma_int_mag", "ensemble", ens.Length);
        if (r.Int(en, "size", "ensemble") != ens.Length) throw r.Error("ensemble.size", $"does not match the {ens.Length} members listed");

        if (root.TryGetProperty("extrapolation", out _))
        {
            var xo = r.Obj(root, "extrapolation", "");
            var sc = r.Doubles(xo, "support_colour", "extrapolation", 2);
            var sf = r.Doubles(xo, "support_feh", "extrapolation", 2);
            if (!(sc[1] >= sc[0])) throw r.Error("extrapolation.support_colour", "must be [low, high]");
            if (!(sf[1] >= sf[0])) throw r.Error("extrapolation.support_feh", "must be [low, high]");
            double kc = r.Dbl(xo, "kappa_colour", "extrapolation"), kf = r.Dbl(xo, "kappa_feh", "extrapolation");
            if (!(kc >= 0)) throw r.Error("extrapolation.kappa_colour", "must not be negative");
            if (!(kf >= 0)) throw r.Error("extrapolation.kappa_feh", "must not be negative");
            var za = r.Arr(xo, "z", "extrapolation");
            if (za.GetArrayLength() != ens.Length) throw r.Error("extrapolation.z", $"has {za.GetArrayLength()} draws for {ens.Length} ensemble members");
            var z = new double[ens.Length][];
            int zi = 0;
            foreach (var row in za.EnumerateArray()) { z[zi] = r.DoubleArray(row, $"extrapolation.z[{zi}]", 4); zi++; }
            double kc2 = xo.TryGetProperty("kappa_colour2", out _) ? r.Dbl(xo, "kappa_colour2", "extrapolation") : 0.0;
            if (!(kc2 >= 0)) throw r.Error("extrapolation.kappa_colour2", "must not be negative");
            extra = new Extrapolation(new ValidityDomain(hull, []), kc, kf, z) { KappaColour2 = kc2 }; // the support is the domain's hull; support_colour/_feh are its box, for reading
        }

        var prov = new SortedDictionary<string, string>(StringComparer.Ordinal);
        var po = r.Obj(root, "provenance", "");
        foreach (var kv in po.EnumerateObject())
        {
            if (kv.Value.ValueKind != JsonValueKind.String) throw r.Error($"provenance.{kv.Name}", "must be a string");
            prov[kv.Name] = kv.Value.GetString()!;
        }

        return new CalibrationModel
        {
            Basis = basis,
            Coefficients = coef,
            CoefficientCovariance = cov,
            SigmaInt = sigma,
            EnsembleCoefficients = ens,
            EnsembleSigmaInt = ensSigma,
            Domain = new ValidityDomain(hull, excluded),
            Extrapolation = extra,
            OutlierFraction = outlierFraction,
            Filters = filters,
            RmsIndex = r.DblOrNaN(q, "rms_index_mag", "quality"),
            RmsDex = r.DblOrNaN(q, "rms_dex", "quality"),
            StandardsUsed = r.Int(q, "standards_used", "quality"),
            StandardsRejected = r.Int(q, "standards_rejected", "quality"),
            Provenance = prov,
        };
    }

    private sealed class Reader(string file)
    {
        public InputException Error(string key, string what) => new($"key '{key}': {what}.", file: file);

        private static string Path(string parent, string key) => parent.Length == 0 ? key : $"{parent}.{key}";

        private JsonElement Get(JsonElement o, string key, string parent)
        {
            if (!o.TryGetProperty(key, out var v)) throw Error(Path(parent, key), "is missing");
            return v;
        }

        public JsonElement Obj(JsonElement o, string key, string parent)
        {
            var v = Get(o, key, parent);
            return v.ValueKind == JsonValueKind.Object ? v : throw Error(Path(parent, key), "must be an object");
        }

        public JsonElement Arr(JsonElement o, string key, string parent)
        {
            var v = Get(o, key, parent);
            return v.ValueKind == JsonValueKind.Array ? v : throw Error(Path(parent, key), "must be an array");
        }

        public string Str(JsonElement o, string key, string parent)
        {
            var v = Get(o, key, parent);
            return v.ValueKind == JsonValueKind.String ? v.GetString()! : throw Error(Path(parent, key), "must be a string");
        }

        public int Int(JsonElement o, string key, string parent)
        {
            var v = Get(o, key, parent);
            return v.ValueKind == JsonValueKind.Number && v.TryGetInt32(out int i) ? i : throw Error(Path(parent, key), "must be an integer");
        }

        public double Dbl(JsonElement o, string key, string parent) => Number(Get(o, key, parent), Path(parent, key));

        public double DblOrNaN(JsonElement o, string key, string parent)
        {
            var v = Get(o, key, parent);
            return v.ValueKind == JsonValueKind.Null ? double.NaN : Number(v, Path(parent, key));
        }

        private double Number(JsonElement v, string path) =>
            v.ValueKind == JsonValueKind.Number && v.TryGetDouble(out double d) && double.IsFinite(d) ? d : throw Error(path, "must be a finite number");

        public double[] Doubles(JsonElement o, string key, string parent, int length) => DoubleArray(Arr(o, key, parent), Path(parent, key), length);

        public double[] DoubleArray(JsonElement a, string path, int length)
        {
            if (a.ValueKind != JsonValueKind.Array) throw Error(path, "must be an array");
            if (a.GetArrayLength() != length) throw Error(path, $"has {a.GetArrayLength()} values, {length} expected");
            var x = new double[length];
            int i = 0;
            foreach (var e in a.EnumerateArray()) { x[i] = Number(e, $"{path}[{i}]"); i++; }
            return x;
        }

        public List<(double, double)> Pairs(JsonElement o, string key, string parent)
        {
            var a = Arr(o, key, parent);
            var list = new List<(double, double)>();
            int i = 0;
            foreach (var e in a.EnumerateArray())
            {
                var pair = DoubleArray(e, $"{Path(parent, key)}[{i}]", 2);
                list.Add((pair[0], pair[1]));
                i++;
            }
            return list;
        }
    }
}
