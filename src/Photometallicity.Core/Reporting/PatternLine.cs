using ScottPlot;
using SkiaSharp;

namespace Photometallicity.Reporting;

/// <summary>
/// A polyline whose dash pattern is cut into separate segments here rather than by a Skia path effect: Skia's
/// SVG back end does not support path effects (it draws such lines solid and complains on stderr), so dashes
/// made this way look the same in PNG and SVG. The legend symbol is drawn the same way.
/// </summary>
internal sealed class PatternLine(double[] xs, double[] ys, Color colour, float widthPx, LinePattern pattern) : IPlottable
{
    public IAxes Axes { get; set; } = new ScottPlot.Axes();

    public bool IsVisible { get; set; } = true;

    public string? LegendText { get; set; }

    public IEnumerable<LegendItem> LegendItems => LegendText is null
        ? LegendItem.None
        : LegendItem.Single(new LegendItem
        {
            LabelText = LegendText,
            MarkerStyle = new MarkerStyle(MarkerShape.FilledSquare, 26, colour) { CustomRenderer = new Symbol(this) },
            LineStyle = LineStyle.None,
        });

    public AxisLimits GetAxisLimits() => xs.Length == 0
        ? AxisLimits.NoLimits
        : new AxisLimits(xs.Where(double.IsFinite).DefaultIfEmpty(0).Min(), xs.Where(double.IsFinite).DefaultIfEmpty(0).Max(),
            ys.Where(double.IsFinite).DefaultIfEmpty(0).Min(), ys.Where(double.IsFinite).DefaultIfEmpty(0).Max());

    public void Render(RenderPack rp)
    {
        var pts = new List<SKPoint>(xs.Length);
        for (int i = 0; i < xs.Length; i++)
            if (double.IsFinite(xs[i]) && double.IsFinite(ys[i])) pts.Add(new SKPoint(Axes.GetPixelX(xs[i]), Axes.GetPixelY(ys[i])));
        Draw(rp.Canvas, pts);
    }

    private void Draw(SKCanvas canvas, List<SKPoint> pts)
    {
        if (pts.Count < 2) return;
        using var path = new SKPath();
        float[]? intervals = pattern.Intervals;
        if (intervals is null || intervals.Length < 2 || intervals.Any(v => !(v > 0))) AddSolid(path, pts);
        else AddDashed(path, pts, intervals);
        using var paint = new SKPaint
        {
            Color = colour.ToSKColor(), Style = SKPaintStyle.Stroke, StrokeWidth = widthPx,
            StrokeCap = SKStrokeCap.Butt, StrokeJoin = SKStrokeJoin.Round, IsAntialias = true,
        };
        canvas.DrawPath(path, paint);
    }

    private static void AddSolid(SKPath path, List<SKPoint> pts)
    {
        path.MoveTo(pts[0]);
        for (int i = 1; i < pts.Count; i++) path.LineTo(pts[i]);
    }

    /// <summary>Walks the polyline, alternating pen down / pen up over the pattern's on/off lengths (px).</summary>
    internal static void AddDashed(SKPath path, IReadOnlyList<SKPoint> pts, float[] intervals)
    {
        int k = 0;
        float left = intervals[0];
        bool on = true;
        path.MoveTo(pts[0]);
        for (int i = 1; i < pts.Count; i++)
        {
            SKPoint a = pts[i - 1], b = pts[i];
            float seg = SKPoint.Distance(a, b), pos = 0;
            while (seg - pos > left)
            {
                pos += left;
                var p = new SKPoint(a.X + (b.X - a.X) * pos / seg, a.Y + (b.Y - a.Y) * pos / seg);
                if (on) path.LineTo(p); else path.MoveTo(p);
                on = !on;
                k = (k + 1) % intervals.Length;
                left = intervals[k];
            }
            left -= seg - pos;
            if (on) path.LineTo(b);
        }
    }

    /// <summary>The legend symbol: a short horizontal stretch of the same line.</summary>
    private sealed class Symbol(PatternLine line) : IMarker
    {
        public void Render(SKCanvas canvas, ScottPlot.Paint paint, Pixel center, float size, MarkerStyle markerStyle)
        {
            float half = Math.Max(size, 20) / 2;
            line.Draw(canvas, [new SKPoint(center.X - half, center.Y), new SKPoint(center.X + half, center.Y)]);
        }
    }
}
