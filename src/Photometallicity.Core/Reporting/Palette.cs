using ScottPlot;

namespace Photometallicity.Reporting;

/// <summary>
/// Colours of every figure. Categorical colours are the colour-blind-safe set of Okabe &amp; Ito (2008,
/// "Color Universal Design", https://jfly.uni-koeln.de/color/), as tabulated by Wong (2011, Nature Methods 8,
/// 441, Fig. 2); hex values recalled from memory. Lines carrying different meanings also differ in pattern or
/// marker, so that no figure relies on hue alone. Continuous quantities (membership probability, [Fe/H] of the
/// iso-metallicity curves) use viridis (van der Walt &amp; Smith 2015, matplotlib's default map, designed to be
/// perceptually uniform and legible under the common colour-vision deficiencies) as ScottPlot implements it,
/// restricted to its darker 90 % so that the top of the scale stays visible on white.
/// </summary>
public static class Palette
{
    public static readonly Color Black = Color.FromHex("#000000");
    public static readonly Color Orange = Color.FromHex("#E69F00");
    public static readonly Color SkyBlue = Color.FromHex("#56B4E9");
    public static readonly Color BluishGreen = Color.FromHex("#009E73");
    public static readonly Color Yellow = Color.FromHex("#F0E442");
    public static readonly Color Blue = Color.FromHex("#0072B2");
    public static readonly Color Vermillion = Color.FromHex("#D55E00");
    public static readonly Color ReddishPurple = Color.FromHex("#CC79A7");

    /// <summary>Background points (field stars, stars without a membership probability).</summary>
    public static readonly Color Faint = Color.FromHex("#9A9A9A");

    /// <summary>Curve colours in order of use (yellow left out: too pale for lines on white).</summary>
    public static readonly Color[] Series = [Blue, Vermillion, BluishGreen, ReddishPurple, Orange, SkyBlue, Black];

    /// <summary>Line patterns cycled alongside <see cref="Series"/>.</summary>
    public static readonly LinePattern[] Patterns = [LinePattern.Solid, LinePattern.Dashed, LinePattern.DenselyDashed, LinePattern.Dotted];

    /// <summary>Marker shapes cycled alongside <see cref="Series"/>.</summary>
    public static readonly MarkerShape[] Markers =
        [MarkerShape.FilledCircle, MarkerShape.FilledSquare, MarkerShape.FilledTriangleUp, MarkerShape.FilledDiamond,
         MarkerShape.OpenCircle, MarkerShape.OpenSquare, MarkerShape.OpenTriangleUp];

    /// <summary>The continuous colour scale (see the type summary).</summary>
    public static IColormap Continuous { get; } = new TruncatedColormap(new ScottPlot.Colormaps.Viridis(), 0.0, 0.9);

    public static Color SeriesColour(int i) => Series[i % Series.Length];

    public static LinePattern SeriesPattern(int i) => Patterns[i % Patterns.Length];

    public static MarkerShape SeriesMarker(int i) => Markers[i % Markers.Length];

    /// <summary>A colour map restricted to the part [from, to] of another.</summary>
    private sealed class TruncatedColormap(IColormap inner, double from, double to) : IColormap
    {
        public string Name => $"{inner.Name} [{from:0.##}, {to:0.##}]";

        public Color GetColor(double position) => inner.GetColor(from + (to - from) * Math.Clamp(position, 0, 1));
    }
}
