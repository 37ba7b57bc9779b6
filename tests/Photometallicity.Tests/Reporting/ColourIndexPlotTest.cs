using Photometallicity.Reporting;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Reporting;

public class ColourIndexPlotTest
{
    [Fact]
    public void Write_WritesValidFilesWithCurvesAndStandards()
    {
        using var dir = new TempDir();
        string[] texts = FigureChecks.Valid(ColourIndexPlot.Write(InventedField.ColourIndex(2000), dir.File("ci")));
        Assert.Contains("Colour C₀ (mag)", texts);
        Assert.Contains("Index X₀ (mag)", texts);
        Assert.Contains("standards, accepted (45)", texts);
        Assert.Contains("standards, rejected (5)", texts);
        Assert.Contains("−1.5", texts); // curve labels with a typographic minus
        Assert.Contains("0.0", texts);
    }

    [Fact]
    public void Svg_HundredThousandFieldStars_UnderTwoMegabytes()
    {
        var opt = FigureOptions.Default;
        byte[] svg = FigureRenderer.Svg(FigureRenderer.Single(ColourIndexPlot.Build(InventedField.ColourIndex(100_000), opt.MaxSvgPoints)), opt);
        Assert.True(svg.Length < 2_000_000, $"SVG is {svg.Length} bytes");
        Assert.Contains("vector copy: 20,000 of 100,000 points shown (even subsample)",
            FigureChecks.SvgTexts(System.Xml.Linq.XDocument.Parse(System.Text.Encoding.UTF8.GetString(svg))));
    }

    [Fact]
    public void Write_NoFieldStarsNoRejected_StillWrites()
    {
        using var dir = new TempDir();
        var d = InventedField.ColourIndex(0);
        d = d with { StandardAccepted = d.StandardAccepted.Select(_ => true).ToArray() };
        string[] texts = FigureChecks.Valid(ColourIndexPlot.Write(d, dir.File("ci")));
        Assert.DoesNotContain(texts, t => t.StartsWith("standards, rejected", StringComparison.Ordinal));
    }
}
