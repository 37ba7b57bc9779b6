using System.Text;
using Photometallicity.Catalogues;
using ScottPlot;
using SkiaSharp;

namespace Photometallicity.Reporting;

/// <summary>
/// Renders a figure (one or more ScottPlot plots laid out by a <see cref="Multiplot"/>) to PNG and SVG bytes,
/// and writes figures: both files are rendered in memory first and then each is written atomically, so a
/// failure leaves neither file half-written.
/// </summary>
internal static partial class FigureRenderer
{
    /// <summary>
    /// Writes <c>path.png</c> (all points) and <c>path.svg</c> (scatter thinned to
    /// <see cref="FigureOptions.MaxSvgPoints"/>). <paramref name="build"/> gets the point cap (null: no cap).
    /// </summary>
    public static FigureFiles Write(string pathWithoutExtension, FigureOptions? options, Func<int?, Multiplot> build)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(pathWithoutExtension);
        var opt = options ?? FigureOptions.Default;
        opt.Validate();
        byte[] png = Png(build(null), opt);
        byte[] svg = Svg(build(opt.MaxSvgPoints), opt);
        var files = new FigureFiles(pathWithoutExtension + ".png", pathWithoutExtension + ".svg");
        AtomicFile.WriteAllBytes(files.PngPath, png);
        AtomicFile.WriteAllBytes(files.SvgPath, svg);
        return files;
    }

    public static byte[] Png(Multiplot figure, FigureOptions opt)
    {
        var info = new SKImageInfo(opt.WidthPx, opt.HeightPx, SKColorType.Rgba8888, SKAlphaType.Premul);
        using var surface = SKSurface.Create(info) ?? throw new InvalidOperationException("Could not create a raster surface.");
        surface.Canvas.Clear(SKColors.White);
        figure.Render(surface.Canvas, new PixelRect(new PixelSize(opt.WidthPx, opt.HeightPx)));
        using var image = surface.Snapshot();
        using var data = image.Encode(SKEncodedImageFormat.Png, 100);
        return PngDensity.WithDpi(data.ToArray(), opt.Dpi);
    }

    public static byte[] Svg(Multiplot figure, FigureOptions opt)
    {
        using var buffer = new MemoryStream();
        using (var canvas = SKSvgCanvas.Create(new SKRect(0, 0, opt.WidthPx, opt.HeightPx), buffer))
        {
            figure.Render(canvas, new PixelRect(new PixelSize(opt.WidthPx, opt.HeightPx)));
        }
        // Skia names the typeface's own family; add fallbacks for viewers without DejaVu Sans.
        string xml = Encoding.UTF8.GetString(buffer.ToArray())
            .Replace($"font-family=\"{ReportFonts.TypefaceFamily}\"", $"font-family=\"{ReportFonts.TypefaceFamily}, Verdana, sans-serif\"");
        return Encoding.UTF8.GetBytes(RenumberClipIds(xml));
    }

    /// <summary>
    /// Skia numbers clip paths from a process-wide counter ("cl_1a0"), so the same figure drawn twice would
    /// differ; renumber them in order of first appearance so that the SVG depends on the figure alone.
    /// </summary>
    internal static string RenumberClipIds(string xml)
    {
        var map = new Dictionary<string, string>(StringComparer.Ordinal);
        return ClipId().Replace(xml, m =>
        {
            string old = m.Groups[2].Value;
            if (!map.TryGetValue(old, out var fresh)) map[old] = fresh = "pm" + map.Count.ToString(System.Globalization.CultureInfo.InvariantCulture);
            return m.Groups[1].Value + "cl_" + fresh + m.Groups[3].Value;
        });
    }

    [System.Text.RegularExpressions.GeneratedRegex("(id=\"|url\\(#)cl_([0-9A-Za-z]+)(\"|\\))")]
    private static partial System.Text.RegularExpressions.Regex ClipId();

    /// <summary>A figure of one plot.</summary>
    public static Multiplot Single(Plot plot) => new(plot);
}
