using ScottPlot;

namespace Photometallicity.Reporting;

/// <summary>
/// Scatter coloured (and optionally sized) by a value in [0, 1], drawn as one marker group per value bin
/// (low values first, so high values lie on top), with a colour bar. Rows whose value is not finite are drawn
/// as small faint points under the rest.
/// </summary>
internal static class ColourScale
{
    public const int Bins = 20;

    private sealed class UnitRange(IColormap map) : IHasColorAxis
    {
        public IColormap Colormap { get; set; } = map;

        public ScottPlot.Range GetRange() => new(0, 1);
    }

    /// <summary>Adds the scatter of the given rows and a colour bar on the right labelled <paramref name="label"/>.</summary>
    public static void AddScatter(Plot plot, double[] x, double[] y, double[] value, int[] rows, string label,
        float minSize, float maxSize, string? unknownLegend)
    {
        var binned = new List<int>[Bins];
        for (int b = 0; b < Bins; b++) binned[b] = new List<int>();
        var unknown = new List<int>();
        foreach (int i in rows)
        {
            double v = value[i];
            if (!double.IsFinite(v)) { unknown.Add(i); continue; }
            binned[Math.Clamp((int)(Math.Clamp(v, 0, 1) * Bins), 0, Bins - 1)].Add(i);
        }
        if (unknown.Count > 0)
        {
            var m = new DotCloud(PointThinning.Take(x, [.. unknown]), PointThinning.Take(y, [.. unknown]), Palette.Faint.WithAlpha(0.6), minSize) { LegendText = unknownLegend };
            plot.Add.Plottable(m);
        }
        for (int b = 0; b < Bins; b++)
        {
            if (binned[b].Count == 0) continue;
            double centre = (b + 0.5) / Bins;
            var colour = Palette.Continuous.GetColor(centre);
            float size = (float)(minSize + (maxSize - minSize) * centre);
            plot.Add.Plottable(new DotCloud(PointThinning.Take(x, [.. binned[b]]), PointThinning.Take(y, [.. binned[b]]), colour.WithAlpha(0.85), size));
        }
        var bar = plot.Add.ColorBar(new UnitRange(Palette.Continuous), Edge.Right);
        bar.Label = label;
        bar.Width = 24;
        bar.Axis.SetTicks([0, 0.2, 0.4, 0.6, 0.8, 1.0], ["0", "0.2", "0.4", "0.6", "0.8", "1"]);
    }
}
