using Photometallicity.Reporting;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Reporting;

public class CalibrationResidualsPlotTest
{
    [Fact]
    public void Write_TwoPanelsInOneFigure()
    {
        using var dir = new TempDir();
        string[] texts = FigureChecks.Valid(CalibrationResidualsPlot.Write(InventedField.Residuals(), dir.File("res")));
        Assert.Contains("(a) against colour", texts);
        Assert.Contains("(b) against [Fe/H]", texts);
        Assert.Contains("Colour C₀ (mag)", texts);
        Assert.Contains("spectroscopic [Fe/H] (dex)", texts);
        Assert.Contains("Δ[Fe/H] = calibrated − spectroscopic (dex)", texts);
        Assert.Contains("± rms = 0.100 dex", texts);
        Assert.Contains("rejected (5)", texts);
    }

    [Fact]
    public void Build_PanelsShareTheResidualRange()
    {
        var figure = CalibrationResidualsPlot.Build(InventedField.Residuals());
        var plots = figure.Subplots.GetPlots();
        Assert.Equal(2, plots.Length);
        var a = plots[0].Axes.GetLimits();
        var b = plots[1].Axes.GetLimits();
        Assert.Equal(a.Bottom, b.Bottom);
        Assert.Equal(a.Top, b.Top);
        Assert.Equal(-a.Top, a.Bottom);
    }
}
