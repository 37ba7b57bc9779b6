using Photometallicity.Errors;
using ScottPlot;

namespace Photometallicity.Reporting;

/// <summary>Input of <see cref="CmdPlot"/>: one entry per star; NaN where a value does not exist.</summary>
/// <param name="Colour">Dereddened colour of each star (mag).</param>
/// <param name="Magnitude">Dereddened magnitude of each star (mag).</param>
/// <param name="PMember">Membership probability in [0, 1]; NaN draws the star as a faint "no p_member" point.</param>
/// <param name="LocusColour">Colour along the red-giant locus (mag), or null for none.</param>
/// <param name="LocusMagnitude">Magnitude along the red-giant locus (mag), same length as <paramref name="LocusColour"/>.</param>
public sealed record CmdPlotData(
    double[] Colour,
    double[] Magnitude,
    double[] PMember,
    double[]? LocusColour = null,
    double[]? LocusMagnitude = null)
{
    public string ColourLabel { get; init; } = "Colour C₀ (mag)";
    public string MagnitudeLabel { get; init; } = "Magnitude (mag)";
    public string LocusLabel { get; init; } = "red-giant locus";
    public string? Title { get; init; } = "Colour-magnitude diagram";
}

/// <summary>
/// The colour-magnitude diagram: colour on x, magnitude on y with bright stars at the top, stars coloured and
/// sized by membership probability (colour bar on the right), the red-giant locus as a line.
/// </summary>
public static class CmdPlot
{
    public static FigureFiles Write(CmdPlotData data, string pathWithoutExtension, FigureOptions? options = null)
    {
        Validate(data);
        return FigureRenderer.Write(pathWithoutExtension, options, cap => FigureRenderer.Single(Build(data, cap)));
    }

    internal static void Validate(CmdPlotData d)
    {
        ArgumentNullException.ThrowIfNull(d);
        Guard.SameLength(d.Colour.Length, d.Magnitude.Length, nameof(d.Colour), nameof(d.Magnitude));
        Guard.SameLength(d.Colour.Length, d.PMember.Length, nameof(d.Colour), nameof(d.PMember));
        if ((d.LocusColour is null) != (d.LocusMagnitude is null))
            throw new ArgumentException("LocusColour and LocusMagnitude must be given together.");
        if (d.LocusColour is not null) Guard.SameLength(d.LocusColour.Length, d.LocusMagnitude!.Length, nameof(d.LocusColour), nameof(d.LocusMagnitude));
    }

    internal static Plot Build(CmdPlotData d, int? maxPoints)
    {
        var plot = FigureStyle.NewPlot();
        int[] finite = PointThinning.Finite(d.Colour.Length, d.Colour, d.Magnitude);
        int[] rows = PointThinning.Thin(finite, maxPoints);
        ColourScale.AddScatter(plot, d.Colour, d.Magnitude, d.PMember, rows, "membership probability p_member",
            minSize: 2.5f, maxSize: 6f, unknownLegend: "no p_member");
        FigureStyle.AddThinningNote(plot, rows.Length, finite.Length);

        var (xMin, xMax) = FigureStyle.PaddedRange(finite.Select(i => d.Colour[i]));
        var (yMin, yMax) = FigureStyle.PaddedRange(finite.Select(i => d.Magnitude[i]));
        if (d.LocusColour is not null)
        {
            int[] ok = PointThinning.Finite(d.LocusColour.Length, d.LocusColour, d.LocusMagnitude);
            double[] lx = PointThinning.Take(d.LocusColour, ok), ly = PointThinning.Take(d.LocusMagnitude!, ok);
            plot.Add.Plottable(new PatternLine(lx, ly, Palette.Vermillion, 3, LinePattern.Dashed) { LegendText = d.LocusLabel });
            if (finite.Length == 0)
            {
                (xMin, xMax) = FigureStyle.PaddedRange(lx);
                (yMin, yMax) = FigureStyle.PaddedRange(ly);
            }
        }
        plot.XLabel(d.ColourLabel);
        plot.YLabel(d.MagnitudeLabel);
        plot.Axes.SetLimits(xMin, xMax, yMax, yMin); // bottom = faint, top = bright
        plot.ShowLegend(Alignment.UpperLeft);
        FigureStyle.Finish(plot, d.Title);
        return plot;
    }
}
