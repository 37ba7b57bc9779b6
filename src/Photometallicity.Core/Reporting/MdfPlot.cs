using System.Globalization;
using Photometallicity.Errors;
using ScottPlot;

namespace Photometallicity.Reporting;

/// <summary>Input of <see cref="MdfPlot"/>: the stars with their weights and the fitted distribution.</summary>
/// <param name="FehDex">[Fe/H] of each star (e.g. its posterior median), dex; NaN stars are left out.</param>
/// <param name="Weight">Weight of each star in the histogram (its membership probability), in [0, 1].</param>
/// <param name="FehErrorDex">Per-star 1-sigma [Fe/H] error, dex (e.g. half the 16-84 % interval).</param>
/// <param name="MeanDex">Fitted mean [Fe/H] of the members, dex.</param>
/// <param name="MeanErrDex">Its 1-sigma uncertainty, dex.</param>
/// <param name="SigmaDex">Fitted intrinsic [Fe/H] spread, dex.</param>
/// <param name="SigmaErrDex">Its 1-sigma uncertainty, dex.</param>
public sealed record MdfPlotData(
    double[] FehDex,
    double[] Weight,
    double[] FehErrorDex,
    double MeanDex,
    double MeanErrDex,
    double SigmaDex,
    double SigmaErrDex)
{
    /// <summary>Histogram bin width, dex; null: 0.1 dex (a common choice, no source), widened to keep at most 80 bins.</summary>
    public double? BinWidthDex { get; init; }

    public string? Title { get; init; } = "Metallicity distribution of the members";
}

/// <summary>
/// The members' metallicity distribution: the histogram of [Fe/H] weighted by membership probability, the
/// fitted intrinsic Gaussian N(mean, sigma) and the Gaussian expected for the observed values,
/// N(mean, sqrt(sigma^2 + e^2)) with e the weighted median per-star error, both scaled to the histogram
/// (sum of weights x bin width); the median per-star error is also drawn as a bar of +-e about the mean.
/// </summary>
public static class MdfPlot
{
    public static FigureFiles Write(MdfPlotData data, string pathWithoutExtension, FigureOptions? options = null)
    {
        Validate(data);
        return FigureRenderer.Write(pathWithoutExtension, options, _ => FigureRenderer.Single(Build(data)));
    }

    internal static void Validate(MdfPlotData d)
    {
        ArgumentNullException.ThrowIfNull(d);
        Guard.SameLength(d.FehDex.Length, d.Weight.Length, nameof(d.FehDex), nameof(d.Weight));
        Guard.SameLength(d.FehDex.Length, d.FehErrorDex.Length, nameof(d.FehDex), nameof(d.FehErrorDex));
        if (!double.IsFinite(d.MeanDex) || !double.IsFinite(d.MeanErrDex) || !double.IsFinite(d.SigmaDex) || !double.IsFinite(d.SigmaErrDex))
            throw new ArgumentException("The fitted mean, sigma and their errors must be finite.");
        if (d.SigmaDex < 0) throw new ArgumentOutOfRangeException(nameof(d.SigmaDex), d.SigmaDex, "SigmaDex must be >= 0.");
        if (d.BinWidthDex is double w && !(w > 0 && double.IsFinite(w))) throw new ArgumentOutOfRangeException(nameof(d.BinWidthDex), w, "BinWidthDex must be > 0.");
    }

    internal static Plot Build(MdfPlotData d)
    {
        var plot = FigureStyle.NewPlot();
        int[] rows = Enumerable.Range(0, d.FehDex.Length)
            .Where(i => double.IsFinite(d.FehDex[i]) && double.IsFinite(d.Weight[i]) && d.Weight[i] > 0).ToArray();
        double medianErr = WeightedMedian(rows.Where(i => double.IsFinite(d.FehErrorDex[i])).ToArray(), d.FehErrorDex, d.Weight);
        double lo = d.MeanDex - 4 * Math.Max(d.SigmaDex, 0.05), hi = d.MeanDex + 4 * Math.Max(d.SigmaDex, 0.05);
        foreach (int i in rows) { lo = Math.Min(lo, d.FehDex[i]); hi = Math.Max(hi, d.FehDex[i]); }

        double width = d.BinWidthDex ?? 0.1;
        if ((hi - lo) / width > 80) width = (hi - lo) / 80;
        double start = Math.Floor(lo / width) * width;
        int nBins = Math.Max(1, (int)Math.Ceiling((hi - start) / width));
        var sums = new double[nBins];
        double total = 0;
        foreach (int i in rows)
        {
            int b = Math.Clamp((int)Math.Floor((d.FehDex[i] - start) / width), 0, nBins - 1);
            sums[b] += d.Weight[i];
            total += d.Weight[i];
        }
        var bars = new List<Bar>(nBins);
        for (int b = 0; b < nBins; b++)
            bars.Add(new Bar
            {
                Position = start + (b + 0.5) * width, Value = sums[b], Size = width,
                FillColor = Palette.SkyBlue.WithAlpha(0.55), LineColor = Palette.Blue, LineWidth = 1,
            });
        var hist = plot.Add.Bars(bars);
        hist.LegendText = string.Create(CultureInfo.InvariantCulture, $"members, weighted by p_member (Σp = {total:0.0})");

        double scale = total * width, peak = sums.Length > 0 ? sums.Max() : 0;
        var xs = Enumerable.Range(0, 401).Select(k => lo + (hi - lo) * k / 400.0).ToArray();
        if (d.SigmaDex > 0)
            peak = Math.Max(peak, AddGaussian(plot, xs, d.MeanDex, d.SigmaDex, scale, Palette.Blue, LinePattern.Solid,
                string.Create(CultureInfo.InvariantCulture, $"intrinsic: N(mean, σ = {d.SigmaDex:0.00} dex)")));
        if (double.IsFinite(medianErr))
        {
            double observed = Math.Sqrt(d.SigmaDex * d.SigmaDex + medianErr * medianErr);
            peak = Math.Max(peak, AddGaussian(plot, xs, d.MeanDex, observed, scale, Palette.Vermillion, LinePattern.Dashed,
                string.Create(CultureInfo.InvariantCulture, $"observed: √(σ² + e²) = {observed:0.00} dex")));
            double y = 0.15 * Math.Max(peak, 1);
            var bar = plot.Add.Line(d.MeanDex - medianErr, y, d.MeanDex + medianErr, y);
            bar.LineColor = Palette.Black;
            bar.LineWidth = 3;
            bar.MarkerShape = MarkerShape.VerticalBar;
            bar.MarkerSize = 14;
            bar.MarkerLineWidth = 3;
            bar.MarkerColor = Palette.Black;
            bar.LegendText = string.Create(CultureInfo.InvariantCulture, $"median per-star error e = ±{medianErr:0.00} dex");
        }
        double top = Math.Max(peak, 1) * 1.35;
        plot.Add.Plottable(new PatternLine([d.MeanDex, d.MeanDex], [0, top], Palette.Black, 2, LinePattern.DenselyDashed) { LegendText = "mean" });

        plot.Axes.SetLimits(lo - width, hi + width, 0, top);
        plot.XLabel("[Fe/H] (dex)");
        plot.YLabel("Σ p_member per bin (stars)");
        plot.ShowLegend(Alignment.UpperLeft);
        // Each number to the precision its uncertainty supports (two significant digits of the error; ValueFormat.Format).
        var (mv, me) = ValueFormat.Format(new KeyNumber("mean", d.MeanDex, d.MeanErrDex, "dex"));
        var (sv, se) = ValueFormat.Format(new KeyNumber("sigma", d.SigmaDex, d.SigmaErrDex, "dex"));
        string title = $"⟨[Fe/H]⟩ = {mv} ± {me} dex, σ = {sv} ± {se} dex";
        FigureStyle.Finish(plot, d.Title is null ? title : d.Title + "\n" + title);
        return plot;
    }

    /// <summary>Adds count-scaled N(mean, sd) and returns its peak height.</summary>
    private static double AddGaussian(Plot plot, double[] xs, double mean, double sd, double scale, Color colour, LinePattern pattern, string label)
    {
        double norm = scale / (sd * Math.Sqrt(2 * Math.PI));
        var ys = xs.Select(x => norm * Math.Exp(-0.5 * Math.Pow((x - mean) / sd, 2))).ToArray();
        plot.Add.Plottable(new PatternLine(xs, ys, colour, 3, pattern) { LegendText = label });
        return norm;
    }

    /// <summary>Weighted median: the smallest value whose cumulative weight reaches half the total (NaN if none).</summary>
    internal static double WeightedMedian(int[] rows, double[] values, double[] weights)
    {
        if (rows.Length == 0) return double.NaN;
        var sorted = rows.OrderBy(i => values[i]).ThenBy(i => i).ToArray();
        double total = sorted.Sum(i => weights[i]), run = 0;
        foreach (int i in sorted)
        {
            run += weights[i];
            if (run >= 0.5 * total) return values[i];
        }
        return values[sorted[^1]];
    }
}
