namespace Photometallicity.Reporting;

/// <summary>
/// Size and density of a written figure. The defaults make an 8 x 6 inch figure at 150 dpi (1200 x 900 px),
/// legible at full journal-page width, and an SVG light enough to open (a scatter of 10^5 points is one SVG
/// element each, about 7.6 MB; the SVG shows an even subsample of at most <see cref="MaxSvgPoints"/> per
/// scatter and says so on the figure, the PNG always shows every point).
/// </summary>
public sealed record FigureOptions
{
    public static FigureOptions Default { get; } = new();

    /// <summary>Width in pixels of the PNG (and in SVG user units).</summary>
    public int WidthPx { get; init; } = 1200;

    /// <summary>Height in pixels of the PNG (and in SVG user units).</summary>
    public int HeightPx { get; init; } = 900;

    /// <summary>Resolution recorded in the PNG (pHYs chunk), dots per inch.</summary>
    public double Dpi { get; init; } = 150;

    /// <summary>Most points a single scatter may draw in the SVG.</summary>
    public int MaxSvgPoints { get; init; } = 20000;

    internal void Validate()
    {
        if (WidthPx < 200 || WidthPx > 10000) throw new ArgumentOutOfRangeException(nameof(WidthPx), WidthPx, "WidthPx must be in [200, 10000].");
        if (HeightPx < 200 || HeightPx > 10000) throw new ArgumentOutOfRangeException(nameof(HeightPx), HeightPx, "HeightPx must be in [200, 10000].");
        if (!(Dpi >= 10 && Dpi <= 2400)) throw new ArgumentOutOfRangeException(nameof(Dpi), Dpi, "Dpi must be in [10, 2400].");
        if (MaxSvgPoints < 100) throw new ArgumentOutOfRangeException(nameof(MaxSvgPoints), MaxSvgPoints, "MaxSvgPoints must be at least 100.");
    }
}
