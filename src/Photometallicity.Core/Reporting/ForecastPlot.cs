using System.Globalization;
using Photometallicity.Errors;
using ScottPlot;

namespace Photometallicity.Reporting;

/// <summary>One forecast curve: the expected [Fe/H] precision against magnitude for one case (e.g. one colour).</summary>
/// <param name="Label">Legend text, e.g. "C₀ = 1.2 mag".</param>
/// <param name="MagnitudeMag">Magnitudes, mag.</param>
/// <param name="SigmaFehDex">Expected 1-sigma [Fe/H] error at each magnitude, dex.</param>
public sealed record ForecastCurve(string Label, double[] MagnitudeMag, double[] SigmaFehDex);

/// <summary>Input of <see cref="ForecastPlot"/>.</summary>
/// <param name="Curves">The curves, drawn in order with distinct colour, line pattern and marker.</param>
/// <param name="RequestedPrecisionDex">A precision to mark with a horizontal line, dex (or null).</param>
public sealed record ForecastPlotData(IReadOnlyList<ForecastCurve> Curves, double? RequestedPrecisionDex = null)
{
    public string MagnitudeLabel { get; init; } = "Magnitude (mag)";
    public string? Title { get; init; } = "Forecast [Fe/H] precision";
}

/// <summary>
/// sigma[Fe/H] against magnitude for one or more curves, with the requested precision as a horizontal line;
/// where a curve crosses it, the crossing magnitude (linear interpolation between samples) is marked and
/// given in the legend.
/// </summary>
public static class ForecastPlot
{
    public static FigureFiles Write(ForecastPlotData data, string pathWithoutExtension, FigureOptions? options = null)
    {
        Validate(data);
        return FigureRenderer.Write(pathWithoutExtension, options, _ => FigureRenderer.Single(Build(data)));
    }

    internal static void Validate(ForecastPlotData d)
    {
        ArgumentNullException.ThrowIfNull(d);
        ArgumentNullException.ThrowIfNull(d.Curves);
        foreach (var c in d.Curves) Guard.SameLength(c.MagnitudeMag.Length, c.SigmaFehDex.Length, $"curve '{c.Label}' magnitudes", "sigmas");
        if (d.RequestedPrecisionDex is double p && !(p > 0 && double.IsFinite(p)))
            throw new ArgumentOutOfRangeException(nameof(d.RequestedPrecisionDex), p, "RequestedPrecisionDex must be > 0.");
    }

    internal static Plot Build(ForecastPlotData d)
    {
        var plot = FigureStyle.NewPlot();
        var xs = new List<double>();
        var ys = new List<double>();
        for (int k = 0; k < d.Curves.Count; k++)
        {
            var c = d.Curves[k];
            int[] ok = PointThinning.Finite(c.MagnitudeMag.Length, c.MagnitudeMag, c.SigmaFehDex).OrderBy(i => c.MagnitudeMag[i]).ToArray();
            if (ok.Length == 0) continue;
            double[] m = PointThinning.Take(c.MagnitudeMag, ok), s = PointThinning.Take(c.SigmaFehDex, ok);
            var line = new PatternLine(m, s, Palette.SeriesColour(k), 2.5f, Palette.SeriesPattern(k)) { LegendText = c.Label };
            plot.Add.Plottable(line);
            if (m.Length <= 40) plot.Add.Markers(m, s, Palette.SeriesMarker(k), 9, Palette.SeriesColour(k));
            if (d.RequestedPrecisionDex is double target && Crossing(m, s, target) is double at)
            {
                line.LegendText = string.Create(CultureInfo.InvariantCulture, $"{c.Label} (reaches {ValueFormat.Num(target, "0.00")} dex at {ValueFormat.Num(at, "0.0")} mag)");
                var mark = plot.Add.Marker(at, target, MarkerShape.OpenCircle, 16, Palette.SeriesColour(k));
                mark.MarkerLineWidth = 2.5f;
            }
            xs.AddRange(m);
            ys.AddRange(s);
        }
        var (xMin, xMax) = FigureStyle.PaddedRange(xs);
        if (d.RequestedPrecisionDex is double p)
        {
            plot.Add.Plottable(new PatternLine([xMin, xMax], [p, p], Palette.Black, 2, LinePattern.Dashed)
            {
                LegendText = $"requested precision {ValueFormat.Num(p, "0.00")} dex",
            });
            ys.Add(p);
        }
        var (_, yMax) = FigureStyle.PaddedRange(ys, 0.08);
        plot.Axes.SetLimits(xMin, xMax, 0, Math.Max(yMax, 0.05));
        plot.XLabel(d.MagnitudeLabel);
        plot.YLabel("σ[Fe/H] (dex)");
        plot.ShowLegend(Alignment.UpperLeft);
        FigureStyle.Finish(plot, d.Title);
        return plot;
    }

    /// <summary>The first magnitude (samples sorted by magnitude) where sigma rises through the target, or null.</summary>
    internal static double? Crossing(double[] mag, double[] sigma, double target)
    {
        for (int i = 1; i < mag.Length; i++)
        {
            if (sigma[i - 1] <= target && sigma[i] > target)
            {
                double f = (target - sigma[i - 1]) / (sigma[i] - sigma[i - 1]);
                return mag[i - 1] + f * (mag[i] - mag[i - 1]);
            }
        }
        return null;
    }
}
