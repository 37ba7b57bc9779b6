using System.Globalization;
using System.Text.Json.Nodes;
using Photometallicity.Calibration;
using Photometallicity.Catalogues;
using Photometallicity.Forecast;
using Photometallicity.Reporting;

namespace Photometallicity.Pipeline;

/// <summary>What a forecast asks: the giants' colours and [Fe/H], the target's distance and the precision wanted.</summary>
public sealed record ForecastRequest(IReadOnlyList<double> Colours, double FehDex, double PrecisionDex, double DistanceModulus, double? ReferenceBlueMag = null);

/// <summary>The three forecast products: precision against magnitude, the faintest giant reaching the precision, the depth each band needs.</summary>
public sealed record ForecastProducts(IReadOnlyList<PrecisionPoint> Curve, IReadOnlyList<LimitingMagnitude> Limits, IReadOnlyList<DepthRequirement> Depths, double ReferenceBlueMag);

/// <summary>
/// Runs the precision forecast from a calibration and per-band error models and writes forecast.csv (sigma[Fe/H]
/// against blue magnitude for each colour), forecast_limits.csv, forecast_depths.csv and its figure.
/// </summary>
public static class ForecastStep
{
    public static ForecastProducts Run(CalibrationModel model, BandErrorModels errors, ForecastRequest request)
    {
        var forecaster = new PrecisionForecaster(model, errors, new ForecastOptions());
        double bright = Math.Floor((request.DistanceModulus - 3.0) * 10) / 10;
        double faint = Math.Ceiling((errors.Blue.Depth5Sigma + 0.5) * 10) / 10;
        var mags = new List<double>();
        for (double m = bright; m <= faint + 1e-9; m += 0.1) mags.Add(Math.Round(m, 2));
        var curve = forecaster.PrecisionGrid(mags, request.Colours, [request.FehDex]);
        var limits = request.Colours.Select(c => forecaster.FaintestMagnitude(request.DistanceModulus, c, request.FehDex, request.PrecisionDex)).ToList();
        double reference = request.ReferenceBlueMag ?? request.DistanceModulus + 1.0;
        var depths = new List<DepthRequirement>();
        foreach (var c in request.Colours)
            foreach (var band in new[] { ForecastBand.Blue, ForecastBand.Red, ForecastBand.Narrow })
                depths.Add(forecaster.RequiredDepth(band, reference, c, request.FehDex, request.PrecisionDex));
        return new ForecastProducts(curve, limits, depths, reference);
    }

    public static IReadOnlyList<string> Write(ForecastProducts f, string directory, double precisionDex)
    {
        string a = Path.Combine(directory, "forecast.csv"), b = Path.Combine(directory, "forecast_limits.csv"), c = Path.Combine(directory, "forecast_depths.csv");
        CatalogueIO.Write(ForecastTable.ToTable(f.Curve), a);
        CatalogueIO.Write(ForecastTable.ToTable(f.Limits), b);
        CatalogueIO.Write(ForecastTable.ToTable(f.Depths), c);
        var fig = WriteFigure(a, precisionDex, Path.Combine(directory, "plots", "forecast"));
        return [a, b, c, fig.PngPath, fig.SvgPath];
    }

    /// <summary>The forecast figure from forecast.csv: sigma[Fe/H] against blue magnitude, one curve per colour (status Ok rows).</summary>
    public static FigureFiles WriteFigure(string forecastCsv, double precisionDex, string pathWithoutExtension)
    {
        var t = CatalogueIO.Read(forecastCsv, new ReadOptions { TextColumns = new HashSet<string> { "status" } });
        double[] mag = t.RequireDoubles("blue_mag"), col = t.RequireDoubles("colour0"), feh = t.RequireDoubles("feh"), sig = t.RequireDoubles("sigma_feh");
        // Only model stars whose posterior lies well inside the calibration's domain: where it is cut by the domain's
        // edge its width says more about the domain than about the photometry.
        var status = t.Require("status");
        var curves = Enumerable.Range(0, t.RowCount).Where(i => status.GetString(i) == "Ok").GroupBy(i => col[i]).OrderBy(g => g.Key).Select(g => new ForecastCurve(
            $"C0 = {g.Key.ToString("F2", CultureInfo.InvariantCulture)} mag, [Fe/H] = {feh[g.First()].ToString("F1", CultureInfo.InvariantCulture)}",
            g.Select(i => mag[i]).ToArray(), g.Select(i => sig[i]).ToArray())).ToList();
        return ForecastPlot.Write(new ForecastPlotData(curves, precisionDex) { MagnitudeLabel = "Dereddened blue magnitude (mag)" }, pathWithoutExtension);
    }

    public static JsonObject Summary(ForecastProducts f, ForecastRequest request) => new()
    {
        ["precision_dex"] = request.PrecisionDex,
        ["feh"] = request.FehDex,
        ["distance_modulus"] = request.DistanceModulus,
        ["faintest_blue0_mag"] = new JsonArray(f.Limits.Select(l => (JsonNode)new JsonObject
        {
            ["colour0"] = l.Colour,
            ["apparent"] = SummaryBuilder.N(l.BlueApparent),
            ["absolute"] = SummaryBuilder.N(l.BlueAbsolute),
            ["status"] = l.Status.ToString(),
        }).ToArray()),
        ["depths_needed_at_blue0_mag"] = f.ReferenceBlueMag,
        ["depths_needed"] = new JsonArray(f.Depths.Select(d => (JsonNode)new JsonObject
        {
            ["colour0"] = d.Colour,
            ["band"] = d.Band.ToString().ToLowerInvariant(),
            ["depth_5sigma_mag"] = SummaryBuilder.N(d.RequiredDepth5Sigma),
            ["current_depth_5sigma_mag"] = SummaryBuilder.N(d.CurrentDepth5Sigma),
            ["status"] = d.Status.ToString(),
        }).ToArray()),
    };
}
