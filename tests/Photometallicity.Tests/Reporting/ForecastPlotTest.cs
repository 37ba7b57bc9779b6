using Photometallicity.Reporting;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Reporting;

public class ForecastPlotTest
{
    [Fact]
    public void Write_LabelsCurvesAndRequestedPrecision()
    {
        using var dir = new TempDir();
        string[] texts = FigureChecks.Valid(ForecastPlot.Write(InventedField.Forecast(), dir.File("fc")));
        Assert.Contains("σ[Fe/H] (dex)", texts);
        Assert.Contains("Magnitude (mag)", texts);
        Assert.Contains("requested precision 0.20 dex", texts);
        Assert.Contains(texts, t => t.StartsWith("C₀ = 0.8 mag (reaches 0.20 dex at ", StringComparison.Ordinal));
    }

    [Fact]
    public void Crossing_InterpolatesLinearly()
    {
        // 0.1 at 20 mag and 0.3 at 22 mag: 0.2 is reached half-way, at 21 mag.
        Assert.Equal(21.0, ForecastPlot.Crossing([19, 20, 22], [0.05, 0.1, 0.3], 0.2)!.Value, 12);
        Assert.Null(ForecastPlot.Crossing([19, 20], [0.05, 0.1], 0.2));
    }

    [Fact]
    public void Write_DashedLinesInSvg_AreCutIntoSegments()
    {
        using var dir = new TempDir();
        var files = ForecastPlot.Write(InventedField.Forecast(), dir.File("fc"));
        string svg = File.ReadAllText(files.SvgPath);
        Assert.DoesNotContain("stroke-dasharray", svg); // dashes are geometry, not an effect the SVG back end drops
        var dashed = FigureChecks.Svg(files.SvgPath).Descendants(System.Xml.Linq.XName.Get("path", "http://www.w3.org/2000/svg"))
            .Select(p => (string?)p.Attribute("d") ?? "").Where(d => d.Count(ch => ch == 'M') > 20);
        Assert.NotEmpty(dashed);
    }
}
