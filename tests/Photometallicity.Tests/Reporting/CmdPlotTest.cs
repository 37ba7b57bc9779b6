using Photometallicity.Reporting;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Reporting;

public class CmdPlotTest
{
    [Fact]
    public void Write_WritesValidPngAndSvgWithAxisLabels()
    {
        using var dir = new TempDir();
        var files = CmdPlot.Write(InventedField.Cmd(3000), dir.File("cmd"));
        Assert.Equal(dir.File("cmd.png"), files.PngPath);
        Assert.Equal(dir.File("cmd.svg"), files.SvgPath);
        string[] texts = FigureChecks.Valid(files);
        Assert.Contains("Colour C₀ (mag)", texts);
        Assert.Contains("Magnitude (mag)", texts);
        Assert.Contains("membership probability p_member", texts);
        Assert.Contains("red-giant locus", texts);
        Assert.DoesNotContain(texts, t => t.StartsWith("vector copy", StringComparison.Ordinal)); // 3000 < cap: nothing thinned
        Assert.Equal(["cmd.png", "cmd.svg"], dir.Files()); // no temporary files left
    }

    [Fact]
    public void Write_MoreStarsThanTheSvgCap_SvgThinnedAndSaysSo()
    {
        using var dir = new TempDir();
        var files = CmdPlot.Write(InventedField.Cmd(30_000), dir.File("cmd"));
        string[] texts = FigureChecks.Valid(files);
        Assert.Contains("vector copy: 20,000 of 30,000 points shown (even subsample)", texts);
    }

    [Fact]
    public void Svg_HundredThousandStars_UnderTwoMegabytes()
    {
        var opt = FigureOptions.Default;
        byte[] svg = FigureRenderer.Svg(FigureRenderer.Single(CmdPlot.Build(InventedField.Cmd(100_000), opt.MaxSvgPoints)), opt);
        Assert.True(svg.Length < 2_000_000, $"SVG is {svg.Length} bytes");
    }

    [Fact]
    public void Write_MagnitudeAxis_BrightAtTop()
    {
        var plot = CmdPlot.Build(InventedField.Cmd(500), maxPoints: null);
        var limits = plot.Axes.GetLimits();
        Assert.True(limits.Bottom > limits.Top, $"bottom {limits.Bottom} should be the faint end, top {limits.Top} the bright end");
    }

    [Fact]
    public void Write_SameDataTwice_IdenticalBytes()
    {
        using var dir = new TempDir();
        var a = CmdPlot.Write(InventedField.Cmd(5000), dir.File("a"));
        var b = CmdPlot.Write(InventedField.Cmd(5000), dir.File("b"));
        Assert.Equal(File.ReadAllBytes(a.PngPath), File.ReadAllBytes(b.PngPath));
        Assert.Equal(File.ReadAllBytes(a.SvgPath), File.ReadAllBytes(b.SvgPath));
    }

    [Fact]
    public void Write_LengthsDiffer_ThrowsNamingArrays()
    {
        var d = new CmdPlotData([1, 2], [20, 21, 22], [0.5, 0.5]);
        var e = Assert.Throws<ArgumentException>(() => CmdPlot.Write(d, Path.Combine(Path.GetTempPath(), "never")));
        Assert.Contains("Colour", e.Message);
        Assert.Contains("Magnitude", e.Message);
    }
}
