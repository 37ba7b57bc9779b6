using Photometallicity.Reporting;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Reporting;

/// <summary>Figures of fields with no usable stars still come out whole (axes, labels), never half-written.</summary>
public class EmptyInputTest
{
    [Fact]
    public void CmdPlot_AllValuesMissing_WritesValidFigure()
    {
        using var dir = new TempDir();
        double[] nan = [double.NaN, double.NaN];
        string[] texts = FigureChecks.Valid(CmdPlot.Write(new CmdPlotData(nan, nan, nan), dir.File("cmd")), 1200, 900);
        Assert.Contains("Magnitude (mag)", texts);
    }

    [Fact]
    public void SkyMapPlot_NoStars_WritesValidFigure()
    {
        using var dir = new TempDir();
        FigureChecks.Valid(SkyMapPlot.Write(new SkyMapPlotData([], [], [], new HalfLightEllipse(0, 0, 3, 0.2, 10)), dir.File("sky")));
    }

    [Fact]
    public void MdfPlot_NoMembers_WritesValidFigure()
    {
        using var dir = new TempDir();
        string[] texts = FigureChecks.Valid(MdfPlot.Write(new MdfPlotData([-1.0], [0.0], [0.1], -1.2, 0.1, 0.2, 0.1), dir.File("mdf")));
        Assert.DoesNotContain(texts, t => t.StartsWith("median per-star error", StringComparison.Ordinal));
    }

    [Fact]
    public void ForecastPlot_NoCurves_WritesValidFigure()
    {
        using var dir = new TempDir();
        FigureChecks.Valid(ForecastPlot.Write(new ForecastPlotData([], 0.1), dir.File("fc")));
    }
}
