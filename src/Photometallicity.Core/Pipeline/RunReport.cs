using System.Text.Json.Nodes;
using Microsoft.Extensions.Logging;
using Photometallicity.Calibration;
using Photometallicity.Catalogues;
using Photometallicity.Reporting;

namespace Photometallicity.Pipeline;

/// <summary>
/// Writes the figures (plots/*.png, *.svg) and the summary page (summary.html, summary.md) of a run from the files
/// already in its output directory (stars.csv, calibration.json, calibration_residuals.csv, summary.json, and
/// forecast.csv when present), so that `report DIR` rebuilds exactly what `run` drew.
/// </summary>
public static class RunReport
{
    public static IReadOnlyList<string> Write(string directory, ILogger log)
    {
        string Need(string name)
        {
            string p = Path.Combine(directory, name);
            if (!File.Exists(p)) throw new Errors.InputException($"{name} not found: is this the output directory of a run?", directory);
            return p;
        }
        var summary = JsonNode.Parse(File.ReadAllText(Need("summary.json")))!.AsObject();
        // Only the columns the figures draw: the ids and status texts would cost a string per row.
        var stars = CatalogueIO.Read(Need("stars.csv"), new ReadOptions
        {
            Columns = new HashSet<string> { "ra", "dec", "blue0", "red0", "colour0", "index0", "feh", "feh_lo", "feh_hi", "p_member" },
        });
        var model = CalibrationJson.Read(Need("calibration.json"));
        string residualsPath = Path.Combine(directory, "calibration_residuals.csv");
        string plots = Path.Combine(directory, "plots");
        var figures = new List<FigureEntry>();
        var written = new List<string>();
        void Add(FigureFiles f, string caption, string title)
        {
            figures.Add(new FigureEntry(f.PngPath, caption, title));
            written.Add(f.PngPath);
            written.Add(f.SvgPath);
        }

        // The standards: present when the calibration was fitted in this run (not when it was read from a file).
        double[] rc = [], ri = [], rf = [], rd = [];
        bool[] acc = [];
        if (File.Exists(residualsPath))
        {
            var residuals = CatalogueIO.Read(residualsPath, new ReadOptions { TextColumns = new HashSet<string> { "id", "status", "reason" } });
            var status = residuals.Require("status");
            var fitted = Enumerable.Range(0, residuals.RowCount).Where(i => status.GetString(i) != "excluded").ToArray();
            rc = Pick(residuals.RequireDoubles("colour0"), fitted);
            ri = Pick(residuals.RequireDoubles("index0"), fitted);
            rf = Pick(residuals.RequireDoubles("feh_spec"), fitted);
            rd = Pick(residuals.RequireDoubles("residual_dex"), fitted);
            acc = fitted.Select(i => status.GetString(i) == "accepted").ToArray();
        }
        double[] p = stars.ReadOnlyDoubles("p_member");
        // The scatter figures draw at most MaxScatterPoints stars, every k-th row: beyond that the markers only cover
        // one another, and a vector figure of 10^7 markers is gigabytes. Histograms (the MDF) use every star.
        int n = stars.RowCount, step = Math.Max(1, (n + MaxScatterPoints - 1) / MaxScatterPoints);
        int[]? shown = step == 1 ? null : Enumerable.Range(0, (n + step - 1) / step).Select(j => j * step).ToArray();
        double[] S(double[] v) => shown is null ? v : Pick(v, shown);
        string drawn = shown is null ? "" : $" Every {step}th star is drawn ({shown.Length} of {n}).";
        double[] colour = S(stars.ReadOnlyDoubles("colour0")), index = S(stars.ReadOnlyDoubles("index0")), pShown = S(p);

        Add(ColourIndexPlot.Write(new ColourIndexPlotData(rc, ri, acc, IsoCurves(model), colour, index), Path.Combine(plots, "colour_index")),
            "Colour-index diagram: the calibration's iso-[Fe/H] curves over its validity domain, the standards (accepted and rejected) and the field stars." + drawn, "Calibration");
        if (rc.Length > 0)
            Add(CalibrationResidualsPlot.Write(new CalibrationResidualsPlotData(rc, rf, rd, acc, RmsDex: model.RmsDex), Path.Combine(plots, "calibration_residuals")),
                "Calibration residuals in [Fe/H] against colour and against spectroscopic [Fe/H]; rejected standards marked.", "Calibration residuals");

        var mem = summary["members"]!.AsObject();
        string magBand = (string?)mem["magnitude_band"] ?? "blue";
        double[] mag = S(stars.ReadOnlyDoubles(magBand == "red" ? "red0" : "blue0"));
        double[]? ridgeMag = mem["ridge_mag"]?.AsArray().Select(v => v is null ? double.NaN : (double)v).ToArray();
        double[]? ridgeCol = mem["ridge_colour"]?.AsArray().Select(v => v is null ? double.NaN : (double)v).ToArray();
        Add(CmdPlot.Write(new CmdPlotData(colour, mag, pShown, ridgeCol, ridgeMag), Path.Combine(plots, "cmd")),
            "Colour-magnitude diagram coloured by membership probability, with the fitted red-giant locus." + drawn, "Colour-magnitude diagram");

        double ra0 = Num(mem["centre_ra_deg"]), dec0 = Num(mem["centre_dec_deg"]);
        var (xi, eta) = Gnomonic(S(stars.ReadOnlyDoubles("ra")), S(stars.ReadOnlyDoubles("dec")), ra0, dec0);
        var ellipse = double.IsFinite(ra0) ? new HalfLightEllipse(0, 0, Num(mem["half_light_arcmin"]), Num(mem["ellipticity"]), Num(mem["position_angle_deg"])) : null;
        Add(SkyMapPlot.Write(new SkyMapPlotData(xi, eta, pShown, ellipse), Path.Combine(plots, "sky")),
            "Sky map in the tangent plane about the fitted centre (east to the left), coloured by membership probability, with the fitted half-light ellipse." + drawn, "Sky map");

        var mdf = summary["mdf"] as JsonObject;
        double[] feh = stars.ReadOnlyDoubles("feh"), lo = stars.ReadOnlyDoubles("feh_lo"), hi = stars.ReadOnlyDoubles("feh_hi");
        var withFeh = Enumerable.Range(0, stars.RowCount).Where(i => double.IsFinite(feh[i]) && double.IsFinite(p[i])).ToArray();
        if (mdf is not null && withFeh.Length > 0)
            Add(MdfPlot.Write(new MdfPlotData(Pick(feh, withFeh), Pick(p, withFeh), withFeh.Select(i => 0.5 * (hi[i] - lo[i])).ToArray(),
                    Num(mdf["mean"]), Num(mdf["mean_err"]), Num(mdf["sigma"]), Num(mdf["sigma_err"])), Path.Combine(plots, "mdf")),
                "Metallicity distribution of the members: membership-weighted histogram of the per-star posterior medians, the fitted Gaussian (intrinsic spread), and the spread expected from the per-star errors.", "Metallicity distribution");

        string forecastCsv = Path.Combine(directory, "forecast.csv");
        if (File.Exists(forecastCsv) && summary["forecast"] is JsonObject fc)
            Add(ForecastStep.WriteFigure(forecastCsv, Num(fc["precision_dex"]), Path.Combine(plots, "forecast")),
                "Forecast: expected [Fe/H] precision (posterior half-width) of a red giant against its dereddened blue magnitude, from the calibration and the fitted photometric error models; the horizontal line is the requested precision.", "Forecast");

        var page = SummaryPageBuilder.Build(directory, summary, figures);
        string html = Path.Combine(directory, "summary.html"), md = Path.Combine(directory, "summary.md");
        SummaryPage.WriteHtml(page, html);
        SummaryPage.WriteMarkdown(page, md);
        written.Add(html);
        written.Add(md);
        log.LogInformation("report: {Figures} figures and the summary page written", figures.Count);
        return written;
    }

    /// <summary>Iso-[Fe/H] curves of the best fit, drawn only where the validity domain covers them.</summary>
    private static IReadOnlyList<IsoMetallicityCurve> IsoCurves(CalibrationModel model)
    {
        var d = model.Domain;
        var curves = new List<IsoMetallicityCurve>();
        for (double f = Math.Ceiling(d.FehMin * 2) / 2; f <= d.FehMax + 1e-9; f += 0.5)
        {
            var c = new List<double>();
            var x = new List<double>();
            for (int k = 0; k <= 200; k++)
            {
                double col = d.ColourMin + (d.ColourMax - d.ColourMin) * k / 200.0;
                if (!d.Contains(col, f)) continue;
                c.Add(col);
                x.Add(model.Evaluate(col, f));
            }
            if (c.Count >= 2) curves.Add(new IsoMetallicityCurve(Math.Round(f, 2), c.ToArray(), x.ToArray()));
        }
        return curves;
    }

    /// <summary>Most stars a scatter figure draws (program's choice).</summary>
    public const int MaxScatterPoints = 200_000;

    internal static double Num(JsonNode? n) => n is null ? double.NaN : (double)n;

    private static double[] Pick(double[] v, int[] rows) => rows.Select(i => v[i]).ToArray();

    /// <summary>Standard coordinates (arcmin, xi towards east) about the fitted centre; NaN where a star cannot be projected.</summary>
    private static (double[] Xi, double[] Eta) Gnomonic(double[] ra, double[] dec, double ra0Deg, double dec0Deg)
    {
        var plane = new Membership.TangentPlane(Units.SkyPosition.FromDegrees(ra0Deg, dec0Deg));
        var xi = new double[ra.Length];
        var eta = new double[ra.Length];
        for (int i = 0; i < ra.Length; i++) plane.TryProject(ra[i], dec[i], out xi[i], out eta[i]);
        return (xi, eta);
    }
}
