using ScottPlot;
using SkiaSharp;

namespace Photometallicity.Reporting;

/// <summary>
/// Many round points of one colour and size, drawn as a single path of near-zero-length round-capped strokes.
/// In SVG this is one element of about 30 bytes per point instead of ScottPlot's two ellipse elements of about
/// 115 bytes each (SVG 1.1, section 11.4: a round cap strokes a zero-length subpath as a dot; the 0.01 px
/// segment keeps the dot in viewers that skip zero-length subpaths).
/// </summary>
internal sealed class DotCloud(double[] xs, double[] ys, Color colour, float diameterPx) : IPlottable
{
    public IAxes Axes { get; set; } = new ScottPlot.Axes();

    public bool IsVisible { get; set; } = true;

    public string? LegendText { get; set; }

    public int Count => xs.Length;

    public IEnumerable<LegendItem> LegendItems => LegendText is null
        ? LegendItem.None
        : LegendItem.Single(new LegendItem
        {
            LabelText = LegendText,
            MarkerStyle = new MarkerStyle(MarkerShape.FilledCircle, Math.Max(diameterPx, 8), colour),
            LineStyle = LineStyle.None,
        });

    public AxisLimits GetAxisLimits()
    {
        if (xs.Length == 0) return AxisLimits.NoLimits;
        double x0 = double.PositiveInfinity, x1 = double.NegativeInfinity, y0 = double.PositiveInfinity, y1 = double.NegativeInfinity;
        for (int i = 0; i < xs.Length; i++)
        {
            x0 = Math.Min(x0, xs[i]); x1 = Math.Max(x1, xs[i]);
            y0 = Math.Min(y0, ys[i]); y1 = Math.Max(y1, ys[i]);
        }
        return new AxisLimits(x0, x1, y0, y1);
    }

    public void Render(RenderPack rp)
    {
        if (xs.Length == 0) return;
        using var path = new SKPath();
        for (int i = 0; i < xs.Length; i++)
        {
            float px = Axes.GetPixelX(xs[i]);
            float py = Axes.GetPixelY(ys[i]);
            path.MoveTo(px, py);
            path.LineTo(px + 0.01f, py);
        }
        using var paint = new SKPaint
        {
            Color = colour.ToSKColor(),
            Style = SKPaintStyle.Stroke,
            StrokeWidth = diameterPx,
            StrokeCap = SKStrokeCap.Round,
            IsAntialias = true,
        };
        rp.Canvas.DrawPath(path, paint);
    }
}
