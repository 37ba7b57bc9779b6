using ScottPlot;

namespace Photometallicity.Reporting;

/// <summary>
/// The common look of every figure: text sizes in pixels chosen for a 1200 x 900 px figure printed at
/// 8 x 6 inch (16 px at 150 dpi is about 7.7 pt; no text is smaller than 14 px, about 6.7 pt, near the
/// minimum journals commonly ask for: common practice, no single source), a plain frame, a faint grid,
/// legends with an opaque background.
/// </summary>
internal static class FigureStyle
{
    public const float TitleSize = 22;
    public const float AxisLabelSize = 20;
    public const float TickLabelSize = 16;
    public const float LegendSize = 16;
    public const float NoteSize = 14;

    /// <summary>Creates a plot whose text uses the bundled font (registered as ScottPlot's default first).</summary>
    public static Plot NewPlot()
    {
        ReportFonts.EnsureRegistered();
        return new Plot();
    }

    /// <summary>Applies sizes and colours; call after every axis and colour bar has been added.</summary>
    public static void Finish(Plot plot, string? title)
    {
        if (title is not null) plot.Title(title, TitleSize);
        plot.Axes.Title.Label.FontName = ReportFonts.FamilyName;
        plot.Axes.Title.Label.Bold = true;
        foreach (var axis in plot.Axes.GetAxes())
        {
            axis.Label.FontSize = AxisLabelSize;
            axis.Label.FontName = ReportFonts.FamilyName;
            axis.Label.Bold = false;
            axis.TickLabelStyle.FontSize = TickLabelSize;
            axis.TickLabelStyle.FontName = ReportFonts.FamilyName;
            axis.MajorTickStyle.Length = 7;
            axis.MajorTickStyle.Width = 1.2f;
            axis.MinorTickStyle.Length = 3.5f;
            axis.FrameLineStyle.Width = 1.2f;
            axis.FrameLineStyle.Color = Colors.Black;
        }
        foreach (var bar in plot.Axes.GetPanels().OfType<ScottPlot.Panels.ColorBar>())
        {
            bar.Axis.Label.FontSize = AxisLabelSize;
            bar.Axis.Label.FontName = ReportFonts.FamilyName;
            bar.Axis.Label.Bold = false;
            bar.Axis.TickLabelStyle.FontSize = TickLabelSize;
            bar.Axis.TickLabelStyle.FontName = ReportFonts.FamilyName;
        }
        plot.Grid.MajorLineColor = Colors.Black.WithAlpha(0.08);
        plot.Legend.FontSize = LegendSize;
        plot.Legend.FontName = ReportFonts.FamilyName;
        plot.Legend.SetBestFontOnEachRender = false;
        plot.Legend.BackgroundColor = Colors.White.WithAlpha(0.9);
        plot.Legend.OutlineColor = Colors.Black.WithAlpha(0.3);
    }

    /// <summary>Notes on the figure that the vector copy shows a subsample (and the PNG all points).</summary>
    public static void AddThinningNote(Plot plot, int shown, int total)
    {
        if (shown >= total) return;
        var note = plot.Add.Annotation(string.Create(System.Globalization.CultureInfo.InvariantCulture,
            $"vector copy: {shown:N0} of {total:N0} points shown (even subsample)"), Alignment.LowerLeft);
        note.LabelFontSize = NoteSize;
        note.LabelFontName = ReportFonts.FamilyName;
        note.LabelBackgroundColor = Colors.White.WithAlpha(0.85);
        note.LabelBorderColor = Colors.Transparent;
        note.LabelShadowColor = Colors.Transparent;
        note.LabelFontColor = Colors.Black.WithAlpha(0.75);
    }

    /// <summary>Axis limits [min, max] of the finite values, padded by a fraction of the range.</summary>
    public static (double Min, double Max) PaddedRange(IEnumerable<double> values, double padFraction = 0.04)
    {
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        foreach (double v in values)
        {
            if (!double.IsFinite(v)) continue;
            if (v < lo) lo = v;
            if (v > hi) hi = v;
        }
        if (lo > hi) return (0, 1);
        double span = hi - lo;
        double pad = span > 0 ? span * padFraction : Math.Max(Math.Abs(lo) * 0.05, 0.5);
        return (lo - pad, hi + pad);
    }
}
