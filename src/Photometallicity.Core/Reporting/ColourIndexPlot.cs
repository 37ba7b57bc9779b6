using System.Globalization;
using Photometallicity.Errors;
using ScottPlot;

namespace Photometallicity.Reporting;

/// <summary>One curve of constant [Fe/H] of a calibration, sampled along colour.</summary>
/// <param name="FehDex">The [Fe/H] of the curve, dex.</param>
/// <param name="Colour">Dereddened colour C0 along the curve, mag.</param>
/// <param name="Index">Dereddened index X0 along the curve, mag.</param>
public sealed record IsoMetallicityCurve(double FehDex, double[] Colour, double[] Index);

/// <summary>Input of <see cref="ColourIndexPlot"/>.</summary>
/// <param name="StandardColour">C0 of each calibration standard, mag.</param>
/// <param name="StandardIndex">X0 of each calibration standard, mag.</param>
/// <param name="StandardAccepted">Whether each standard was kept by the outlier treatment.</param>
/// <param name="Curves">The calibration's iso-[Fe/H] curves.</param>
/// <param name="FieldColour">C0 of the field stars drawn as faint background (or null).</param>
/// <param name="FieldIndex">X0 of the field stars (or null), same length as <paramref name="FieldColour"/>.</param>
public sealed record ColourIndexPlotData(
    double[] StandardColour,
    double[] StandardIndex,
    bool[] StandardAccepted,
    IReadOnlyList<IsoMetallicityCurve> Curves,
    double[]? FieldColour = null,
    double[]? FieldIndex = null)
{
    public string ColourLabel { get; init; } = "Colour C₀ (mag)";
    public string IndexLabel { get; init; } = "Index X₀ (mag)";
    public string? Title { get; init; } = "Colour-index diagram and calibration";
}

/// <summary>
/// The colour-index diagram: the calibration's iso-[Fe/H] curves (coloured along the continuous scale and
/// labelled with their [Fe/H] at the red end), the standards (accepted: filled circles; rejected: crosses)
/// and optionally the field stars as faint background points.
/// </summary>
public static class ColourIndexPlot
{
    public static FigureFiles Write(ColourIndexPlotData data, string pathWithoutExtension, FigureOptions? options = null)
    {
        Validate(data);
        return FigureRenderer.Write(pathWithoutExtension, options, cap => FigureRenderer.Single(Build(data, cap)));
    }

    internal static void Validate(ColourIndexPlotData d)
    {
        ArgumentNullException.ThrowIfNull(d);
        Guard.SameLength(d.StandardColour.Length, d.StandardIndex.Length, nameof(d.StandardColour), nameof(d.StandardIndex));
        Guard.SameLength(d.StandardColour.Length, d.StandardAccepted.Length, nameof(d.StandardColour), nameof(d.StandardAccepted));
        ArgumentNullException.ThrowIfNull(d.Curves);
        foreach (var c in d.Curves) Guard.SameLength(c.Colour.Length, c.Index.Length, $"curve [Fe/H] = {c.FehDex} colour", "index");
        if ((d.FieldColour is null) != (d.FieldIndex is null)) throw new ArgumentException("FieldColour and FieldIndex must be given together.");
        if (d.FieldColour is not null) Guard.SameLength(d.FieldColour.Length, d.FieldIndex!.Length, nameof(d.FieldColour), nameof(d.FieldIndex));
    }

    internal static Plot Build(ColourIndexPlotData d, int? maxPoints)
    {
        var plot = FigureStyle.NewPlot();
        var xs = new List<double>();
        var ys = new List<double>();
        if (d.FieldColour is not null)
        {
            int[] finite = PointThinning.Finite(d.FieldColour.Length, d.FieldColour, d.FieldIndex);
            int[] rows = PointThinning.Thin(finite, maxPoints);
            plot.Add.Plottable(new DotCloud(PointThinning.Take(d.FieldColour, rows), PointThinning.Take(d.FieldIndex!, rows),
                Palette.Faint.WithAlpha(0.35), 2.5f) { LegendText = "field stars" });
            FigureStyle.AddThinningNote(plot, rows.Length, finite.Length);
        }

        AddCurves(plot, d.Curves, xs, ys);

        int[] ok = PointThinning.Finite(d.StandardColour.Length, d.StandardColour, d.StandardIndex);
        int[] accepted = ok.Where(i => d.StandardAccepted[i]).ToArray();
        int[] rejected = ok.Where(i => !d.StandardAccepted[i]).ToArray();
        var acc = plot.Add.Markers(PointThinning.Take(d.StandardColour, accepted), PointThinning.Take(d.StandardIndex, accepted),
            MarkerShape.FilledCircle, 10, Palette.Black);
        acc.LegendText = $"standards, accepted ({accepted.Length})";
        if (rejected.Length > 0)
        {
            var rej = plot.Add.Markers(PointThinning.Take(d.StandardColour, rejected), PointThinning.Take(d.StandardIndex, rejected),
                MarkerShape.Eks, 13, Palette.Vermillion);
            rej.MarkerLineWidth = 2.5f;
            rej.LegendText = $"standards, rejected ({rejected.Length})";
        }
        xs.AddRange(ok.Select(i => d.StandardColour[i]));
        ys.AddRange(ok.Select(i => d.StandardIndex[i]));

        var (xMin, xMax) = FigureStyle.PaddedRange(xs, 0.06);
        var (yMin, yMax) = FigureStyle.PaddedRange(ys, 0.05);
        double labelRoom = (xMax - xMin) * 0.07; // space for the [Fe/H] labels at the red end
        plot.Axes.SetLimits(xMin, xMax + labelRoom, yMin, yMax);
        plot.XLabel(d.ColourLabel);
        plot.YLabel(d.IndexLabel);
        plot.ShowLegend(Alignment.UpperLeft);
        FigureStyle.Finish(plot, d.Title);
        return plot;
    }

    private static void AddCurves(Plot plot, IReadOnlyList<IsoMetallicityCurve> curves, List<double> xs, List<double> ys)
    {
        if (curves.Count == 0) return;
        double fMin = curves.Min(c => c.FehDex), fMax = curves.Max(c => c.FehDex);
        bool first = true;
        foreach (var c in curves.OrderBy(c => c.FehDex))
        {
            int[] ok = PointThinning.Finite(c.Colour.Length, c.Colour, c.Index).OrderBy(i => c.Colour[i]).ToArray();
            if (ok.Length < 2) continue;
            double t = fMax > fMin ? (c.FehDex - fMin) / (fMax - fMin) : 0.5;
            var colour = Palette.Continuous.GetColor(t);
            double[] cx = PointThinning.Take(c.Colour, ok), cy = PointThinning.Take(c.Index, ok);
            var line = plot.Add.ScatterLine(cx, cy, colour);
            line.LineWidth = 2.5f;
            if (first) line.LegendText = "iso-[Fe/H] curves (dex)";
            first = false;
            var label = plot.Add.Text(" " + ValueFormat.Num(c.FehDex, "+0.0;−0.0;0.0"), cx[^1], cy[^1]);
            label.LabelFontSize = FigureStyle.TickLabelSize;
            label.LabelFontName = ReportFonts.FamilyName;
            label.LabelFontColor = colour;
            label.LabelBold = true;
            label.LabelAlignment = Alignment.MiddleLeft;
            xs.AddRange(cx);
            ys.AddRange(cy);
        }
    }
}
