using System.Globalization;
using System.Text.Json;
using Photometallicity.Catalogues;

namespace Photometallicity.Calibration;

/// <summary>
/// calibration.json: the model (filters, basis, coefficients, covariance, intrinsic scatter, validity domain,
/// bootstrap ensemble, provenance) and, when a fit result is given, its diagnostics under "fit" (ignored when
/// read back). Keys are written in a fixed order and doubles in round-trip form ("R"), so the same model gives
/// the same bytes; NaN and infinities are written as null. Read with <see cref="CalibrationJsonReader"/>.
/// </summary>
public static class CalibrationJson
{
    public const string FormatName = "photometallicity-calibration";
    public const int FormatVersion = 2;

    public static void Write(CalibrationModel model, CalibrationResult? result, string path) =>
        AtomicFile.Write(path, s => Write(model, result, s));

    public static void Write(CalibrationModel model, CalibrationResult? result, Stream stream)
    {
        using var w = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true, NewLine = "\n", Encoder = System.Text.Encodings.Web.JavaScriptEncoder.UnsafeRelaxedJsonEscaping });
        w.WriteStartObject();
        w.WriteString("format", FormatName);
        w.WriteNumber("format_version", FormatVersion);

        var f = model.Filters;
        w.WriteStartObject("filters");
        w.WriteString("system", f.System);
        w.WriteString("blue_band", f.BlueBand);
        w.WriteString("red_band", f.RedBand);
        w.WriteString("narrow_band", f.NarrowBand);
        Num(w, "colour_coefficient", f.ColourCoefficient);
        Num(w, "blue_extinction", f.BlueExtinction);
        Num(w, "red_extinction", f.RedExtinction);
        Num(w, "narrow_extinction", f.NarrowExtinction);
        w.WriteEndObject();

        w.WriteStartObject("model");
        switch (model.Basis)
        {
            case PolynomialBasis2D b:
                w.WriteString("kind", "polynomial");
                w.WriteString("form", "index0 = sum_k coefficients[k] * u^i v^j, u = (colour0 - colour_centre) / colour_scale, v = ([Fe/H] - feh_centre) / feh_scale");
                w.WriteNumber("degree", b.Degree);
                Num(w, "colour_centre", b.ColourCentre);
                Num(w, "colour_scale", b.ColourScale);
                Num(w, "feh_centre", b.FehCentre);
                Num(w, "feh_scale", b.FehScale);
                break;
            case MonotoneBasis b:
                w.WriteString("kind", "monotone");
                w.WriteString("form", "index0 = sum_a p_a u^a + sum_j max(0, alpha_j (1 - t) + beta_j t) I_j([Fe/H]), t = (colour0 - colour_lo) / (colour_hi - colour_lo), u = 2 t - 1 (tangent continuation outside [-1, 1]); I_j quadratic I-splines on the knots [feh_lo x3, feh_knots, feh_hi x3] (Ramsay 1988), tangent continuation outside [feh_lo, feh_hi]; coefficients in the order p_0..p_d, alpha_1..alpha_J, beta_1..beta_J");
                MonotoneFields(w, b.ColourDegree, b.ColourLo, b.ColourHi, b.Ramps);
                break;
            case SeparableBasis b:
                w.WriteString("kind", "separable");
                w.WriteString("form", "index0 = sum_a p_a u^a + a(t) sum_j w_j I_j([Fe/H]), a(t) = 1 + gamma t (exponential continuation from the edges outside [0, 1]), t = (colour0 - colour_lo) / (colour_hi - colour_lo), u = 2 t - 1 (tangent continuation outside [-1, 1]); I_j quadratic I-splines on the knots [feh_lo x3, feh_knots, feh_hi x3] (Ramsay 1988), tangent continuation outside [feh_lo, feh_hi]; coefficients in the order p_0..p_d, w_1..w_J");
                MonotoneFields(w, b.ColourDegree, b.ColourLo, b.ColourHi, b.Ramps);
                Num(w, "gamma", b.Gamma);
                break;
            default:
                throw new InvalidOperationException($"no file form for the model {model.Basis.Describe}");
        }
        w.WriteStartArray("terms");
        foreach (var t in model.Basis.TermNames()) w.WriteStringValue(t);
        w.WriteEndArray();
        Arr(w, "coefficients", model.Coefficients);
        Arr(w, "coefficient_covariance", model.CoefficientCovariance);
        Num(w, "sigma_int_mag", model.SigmaInt);
        Num(w, "outlier_fraction", model.OutlierFraction);
        w.WriteEndObject();

        if (model.Extrapolation is { } x)
        {
            w.WriteStartObject("extrapolation");
            w.WriteString("form", "the support is domain.hull (support_colour and support_feh are its bounding box); beyond it a star's index variance grows by the smaller of (kappa_colour * d_colour + kappa_colour2 * d_colour^2)^2 and (kappa_feh * (f(F) - f(F_edge)))^2; ensemble member m's draw moves its index by (kappa_colour * d_colour + kappa_colour2 * d_colour^2) * z[m][0 blue | 1 red] beyond the standards' colours and scales its change beyond the hull's [Fe/H] by exp(kappa_feh * z[m][2 metal-poor | 3 metal-rich])");
            Arr(w, "support_colour", [x.ColourLo, x.ColourHi]);
            Arr(w, "support_feh", [x.FehLo, x.FehHi]);
            Num(w, "kappa_colour", x.KappaColour);
            Num(w, "kappa_colour2", x.KappaColour2);
            Num(w, "kappa_feh", x.KappaFeh);
            w.WriteStartArray("z");
            foreach (var z in x.Z) { w.WriteStartArray(); foreach (var v in z) Val(w, v); w.WriteEndArray(); }
            w.WriteEndArray();
            w.WriteEndObject();
        }

        w.WriteStartObject("domain");
        w.WriteStartArray("hull");
        foreach (var (c, fe) in model.Domain.Hull) { w.WriteStartArray(); Val(w, c); Val(w, fe); w.WriteEndArray(); }
        w.WriteEndArray();
        w.WriteStartArray("excluded_colours");
        foreach (var (lo, hi) in model.Domain.ExcludedColours) { w.WriteStartArray(); Val(w, lo); Val(w, hi); w.WriteEndArray(); }
        w.WriteEndArray();
        w.WriteEndObject();

        w.WriteStartObject("quality");
        Num(w, "rms_index_mag", model.RmsIndex);
        Num(w, "rms_dex", model.RmsDex);
        w.WriteNumber("standards_used", model.StandardsUsed);
        w.WriteNumber("standards_rejected", model.StandardsRejected);
        w.WriteEndObject();

        w.WriteStartObject("ensemble");
        w.WriteNumber("size", model.EnsembleCoefficients.Length);
        w.WriteStartArray("coefficients");
        foreach (var e in model.EnsembleCoefficients) { w.WriteStartArray(); foreach (var v in e) Val(w, v); w.WriteEndArray(); }
        w.WriteEndArray();
        Arr(w, "sigma_int_mag", model.EnsembleSigmaInt);
        w.WriteEndObject();

        w.WriteStartObject("provenance");
        foreach (var kv in model.Provenance.OrderBy(kv => kv.Key, StringComparer.Ordinal)) w.WriteString(kv.Key, kv.Value);
        w.WriteEndObject();

        if (result is not null) WriteFit(w, result);
        w.WriteEndObject();
        w.Flush();
    }

    private static void WriteFit(Utf8JsonWriter w, CalibrationResult r)
    {
        w.WriteStartObject("fit");
        w.WriteString("model_reason", r.DegreeReason);
        w.WriteStartArray("cv_forms");
        foreach (var f in r.CvScores)
        {
            w.WriteStartObject();
            w.WriteString("form", f.Form);
            w.WriteNumber("coefficients", f.Coefficients);
            Num(w, "cv_mean_log_likelihood", f.Score);
            Num(w, "cv_mean_log_likelihood_error", f.StandardError);
            if (f.Failure is not null) w.WriteString("not_fitted", f.Failure);
            w.WriteEndObject();
        }
        w.WriteEndArray();
        Num(w, "cv_rms_index_mag", r.CvRmsIndex);
        Num(w, "cv_rms_dex", r.CvRmsDex);
        Num(w, "outlier_fraction", r.OutlierFraction);
        Num(w, "sigma_int_maximum_likelihood_mag", r.SigmaIntMaximumLikelihood);
        w.WriteStartArray("notes");
        foreach (var n in r.Notes) w.WriteStringValue(n);
        w.WriteEndArray();
        w.WriteNumber("fit_passes", r.FitPasses);
        w.WriteNumber("bootstrap_redrawn", r.BootstrapRedrawn);
        Arr(w, "bootstrap_standard_errors", r.BootstrapStandardErrors);
        w.WriteStartArray("standards");
        foreach (var v in r.PerStandard)
        {
            w.WriteStartObject();
            w.WriteString("id", v.Id);
            w.WriteString("status", StatusCode(v.Status));
            w.WriteString("reason", v.Reason);
            Num(w, "residual_index_mag", v.ResidualIndex);
            Num(w, "residual_sigma", v.ResidualSigma);
            Num(w, "residual_dex", v.ResidualDex);
            Num(w, "cv_residual_index_mag", v.CvResidualIndex);
            Num(w, "cv_residual_dex", v.CvResidualDex);
            Num(w, "p_outlier", v.POutlier);
            w.WriteEndObject();
        }
        w.WriteEndArray();
        w.WriteEndObject();
    }

    /// <summary>Status codes as written: accepted, outlier, unusable, logg.</summary>
    public static string StatusCode(StandardStatus s) => s switch
    {
        StandardStatus.Accepted => "accepted",
        StandardStatus.RejectedOutlier => "outlier",
        StandardStatus.Unusable => "unusable",
        StandardStatus.RejectedLogG => "logg",
        _ => throw new ArgumentOutOfRangeException(nameof(s)),
    };

    /// <summary>Reads a calibration file (see <see cref="CalibrationJsonReader.Read"/>).</summary>
    public static CalibrationModel Read(string path) => CalibrationJsonReader.Read(path);

    /// <summary>The fields the monotone and separable models share: colour degree and range, ramps' range and knots.</summary>
    private static void MonotoneFields(Utf8JsonWriter w, int colourDegree, double colourLo, double colourHi, MonotoneRamps ramps)
    {
        w.WriteNumber("colour_degree", colourDegree);
        Num(w, "colour_lo", colourLo);
        Num(w, "colour_hi", colourHi);
        Num(w, "feh_lo", ramps.Lo);
        Num(w, "feh_hi", ramps.Hi);
        Arr(w, "feh_knots", ramps.Knots);
    }

    private static void Num(Utf8JsonWriter w, string key, double v)
    {
        w.WritePropertyName(key);
        Val(w, v);
    }

    private static void Val(Utf8JsonWriter w, double v)
    {
        if (double.IsFinite(v)) w.WriteRawValue(v.ToString("R", CultureInfo.InvariantCulture), skipInputValidation: true);
        else w.WriteNullValue();
    }

    private static void Arr(Utf8JsonWriter w, string key, IEnumerable<double> values)
    {
        w.WriteStartArray(key);
        foreach (var v in values) Val(w, v);
        w.WriteEndArray();
    }
}
