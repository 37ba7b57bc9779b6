using System.Globalization;
using Photometallicity.Errors;
using ScottPlot;

namespace Photometallicity.Reporting;

/// <summary>Input of <see cref="CalibrationResidualsPlot"/>: one entry per calibration standard.</summary>
/// <param name="Colour">Dereddened colour C0 of each standard, mag.</param>
/// <param name="FehSpectroscopic">Spectroscopic [Fe/H] of each standard, dex.</param>
/// <param name="ResidualDex">Residual of each standard, dex (by default calibrated minus spectroscopic [Fe/H]).</param>
/// <param name="Accepted">Whether each standard was kept by the outlier treatment.</param>
/// <param name="ResidualErrorDex">1-sigma error bar of each residual, dex (or null for none).</param>
/// <param name="RmsDex">Root-mean-square residual of the accepted standards, dex, drawn as a band (or null).</param>
public sealed record CalibrationResidualsPlotData(
    double[] Colour,
    double[] FehSpectroscopic,
    double[] ResidualDex,
    bool[] Accepted,
    double[]? ResidualErrorDex = null,
    double? RmsDex = null)
{
    public string ColourLabel { get; init; } = "Colour C₀ (mag)";
    public string FehLabel { get; init; } = "spectroscopic [Fe/H] (dex)";
    public string ResidualLabel { get; init; } = "Δ[Fe/H] = calibrated − spectroscopic (dex)";
}

/// <summary>
/// Calibration residuals in two side-by-side panels sharing the residual axis: (a) against colour,
/// (b) against spectroscopic [Fe/H]. Accepted standards are filled circles with error bars, rejected ones
/// crosses; zero and the +-rms band are drawn.
/// </summary>
public static class CalibrationResidualsPlot
{
    public static FigureFiles Write(CalibrationResidualsPlotData data, string pathWithoutExtension, FigureOptions? options = null)
    {
        Validate(data);
        return FigureRenderer.Write(pathWithoutExtension, options, _ => Build(data));
    }

    internal static void Validate(CalibrationResidualsPlotData d)
    {
        ArgumentNullException.ThrowIfNull(d);
        int n = d.Colour.Length;
        Guard.SameLength(n, d.FehSpectroscopic.Length, nameof(d.Colour), nameof(d.FehSpectroscopic));
        Guard.SameLength(n, d.ResidualDex.Length, nameof(d.Colour), nameof(d.ResidualDex));
        Guard.SameLength(n, d.Accepted.Length, nameof(d.Colour), nameof(d.Accepted));
        if (d.ResidualErrorDex is not null) Guard.SameLength(n, d.ResidualErrorDex.Length, nameof(d.Colour), nameof(d.ResidualErrorDex));
        if (d.RmsDex is double r && !(r >= 0 && double.IsFinite(r))) throw new ArgumentOutOfRangeException(nameof(d.RmsDex), r, "RmsDex must be finite and >= 0.");
    }

    internal static Multiplot Build(CalibrationResidualsPlotData d)
    {
        var left = Panel(d, d.Colour, d.ColourLabel, "(a) against colour", first: true);
        var right = Panel(d, d.FehSpectroscopic, d.FehLabel, "(b) against [Fe/H]", first: false);

        // One residual range for both panels, symmetric about zero.
        double reach = 0;
        for (int i = 0; i < d.ResidualDex.Length; i++)
        {
            double r = d.ResidualDex[i], e = d.ResidualErrorDex?[i] ?? 0;
            if (double.IsFinite(r)) reach = Math.Max(reach, Math.Abs(r) + (double.IsFinite(e) ? e : 0));
        }
        if (d.RmsDex is double rms) reach = Math.Max(reach, rms);
        reach = reach > 0 ? reach * 1.12 : 0.5;
        left.Axes.SetLimitsY(-reach, reach);
        right.Axes.SetLimitsY(-reach, reach);

        var figure = new Multiplot(left);
        figure.Subplots.Add(right);
        figure.Layout = new ScottPlot.MultiplotLayouts.Columns();
        return figure;
    }

    private static Plot Panel(CalibrationResidualsPlotData d, double[] x, string xLabel, string title, bool first)
    {
        var plot = FigureStyle.NewPlot();
        int[] ok = PointThinning.Finite(x.Length, x, d.ResidualDex);
        int[] acc = ok.Where(i => d.Accepted[i]).ToArray();
        int[] rej = ok.Where(i => !d.Accepted[i]).ToArray();

        var zero = plot.Add.HorizontalLine(0, 1.5f, Palette.Black.WithAlpha(0.6), LinePattern.Solid);
        zero.ExcludeFromLegend = true;
        if (d.RmsDex is double rms && rms > 0)
        {
            var band = plot.Add.VerticalSpan(-rms, rms, Palette.SkyBlue.WithAlpha(0.3));
            band.LegendText = string.Create(CultureInfo.InvariantCulture, $"± rms = {rms:0.000} dex");
        }
        if (d.ResidualErrorDex is not null && acc.Length > 0)
        {
            double[] e = acc.Select(i => double.IsFinite(d.ResidualErrorDex[i]) ? d.ResidualErrorDex[i] : 0).ToArray();
            var bars = plot.Add.ErrorBar(PointThinning.Take(x, acc), PointThinning.Take(d.ResidualDex, acc), e);
            bars.Color = Palette.Black.WithAlpha(0.55);
            bars.LineWidth = 1.2f;
            bars.CapSize = 4;
        }
        var a = plot.Add.Markers(PointThinning.Take(x, acc), PointThinning.Take(d.ResidualDex, acc), MarkerShape.FilledCircle, 10, Palette.Black);
        a.LegendText = $"accepted ({acc.Length})";
        if (rej.Length > 0)
        {
            var r = plot.Add.Markers(PointThinning.Take(x, rej), PointThinning.Take(d.ResidualDex, rej), MarkerShape.Eks, 13, Palette.Vermillion);
            r.MarkerLineWidth = 2.5f;
            r.LegendText = $"rejected ({rej.Length})";
        }
        var (xMin, xMax) = FigureStyle.PaddedRange(ok.Select(i => x[i]), 0.06);
        plot.Axes.SetLimitsX(xMin, xMax);
        plot.XLabel(xLabel);
        if (first)
        {
            plot.YLabel(d.ResidualLabel); // the right panel shares the axis
            plot.ShowLegend(Alignment.UpperLeft);
        }
        else plot.HideLegend();
        FigureStyle.Finish(plot, title);
        return plot;
    }
}
