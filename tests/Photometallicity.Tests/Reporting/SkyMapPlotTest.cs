using Photometallicity.Reporting;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Reporting;

public class SkyMapPlotTest
{
    [Fact]
    public void Write_WritesValidFilesWithEllipseLegend()
    {
        using var dir = new TempDir();
        string[] texts = FigureChecks.Valid(SkyMapPlot.Write(InventedField.Sky(4000), dir.File("sky")));
        Assert.Contains("ξ (arcmin), east to the left", texts);
        Assert.Contains("η (arcmin), north up", texts);
        Assert.Contains(texts, t => t.StartsWith("half-light ellipse: r_h = 4.00′, e = 0.30, PA = 35°", StringComparison.Ordinal));
    }

    [Fact]
    public void Build_EastToTheLeft()
    {
        var plot = SkyMapPlot.Build(InventedField.Sky(500), maxPoints: null);
        var limits = plot.Axes.GetLimits();
        Assert.True(limits.Left > limits.Right, $"left {limits.Left} should be the larger xi (east)");
    }

    [Fact]
    public void Svg_HundredThousandStars_UnderTwoMegabytes()
    {
        var opt = FigureOptions.Default;
        byte[] svg = FigureRenderer.Svg(FigureRenderer.Single(SkyMapPlot.Build(InventedField.Sky(100_000), opt.MaxSvgPoints)), opt);
        Assert.True(svg.Length < 2_000_000, $"SVG is {svg.Length} bytes");
        Assert.Contains("vector copy: 20,000 of 100,000 points shown (even subsample)",
            FigureChecks.SvgTexts(System.Xml.Linq.XDocument.Parse(System.Text.Encoding.UTF8.GetString(svg))));
    }

    // Position angle convention: measured from north (+eta) through east (+xi), as for the IAU position angle
    // (e.g. Green 1985, Spherical Astronomy, section 12.2 on position angles, recalled from memory).
    [Theory]
    [InlineData(0.0)]
    [InlineData(35.0)]
    [InlineData(90.0)]
    [InlineData(150.0)]
    public void Outline_PointsLieOnTheEllipse(double paDeg)
    {
        var e = new HalfLightEllipse(1.5, -2.0, 4.0, 0.4, paDeg);
        var (xi, eta) = e.Outline(101);
        double pa = paDeg * Math.PI / 180, a = 4.0, b = 0.6 * 4.0;
        for (int k = 0; k < xi.Length; k++)
        {
            double dx = xi[k] - 1.5, dy = eta[k] + 2.0;
            double major = dx * Math.Sin(pa) + dy * Math.Cos(pa);   // along the major axis
            double minor = dx * Math.Cos(pa) - dy * Math.Sin(pa);   // perpendicular to it
            Assert.Equal(1.0, major * major / (a * a) + minor * minor / (b * b), 9);
        }
        // The far end of the major axis (t = 0) lies at PA: for PA = 90 deg, due east (+xi).
        Assert.Equal(1.5 + a * Math.Sin(pa), xi[0], 12);
        Assert.Equal(-2.0 + a * Math.Cos(pa), eta[0], 12);
    }

    [Fact]
    public void Write_BadEllipticity_Throws()
    {
        var d = InventedField.Sky(10) with { Ellipse = new HalfLightEllipse(0, 0, 2, 1.2, 0) };
        Assert.Throws<ArgumentOutOfRangeException>(() => SkyMapPlot.Write(d, Path.Combine(Path.GetTempPath(), "never")));
    }
}
