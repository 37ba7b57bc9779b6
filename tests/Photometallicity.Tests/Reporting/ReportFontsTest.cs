using System.Text;
using Photometallicity.Reporting;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Reporting;

public class ReportFontsTest
{
    [Fact]
    public void EnsureRegistered_DefaultFontIsTheBundledDejaVu()
    {
        var reg = ReportFonts.EnsureRegistered();
        Assert.Equal(ReportFonts.FamilyName, ScottPlot.Fonts.Default);
        foreach (bool bold in new[] { false, true })
        {
            var typeface = ScottPlot.Fonts.GetTypeface(ReportFonts.FamilyName, bold, false);
            Assert.Equal("DejaVu Sans", typeface.FamilyName);
            Assert.Equal(bold, typeface.IsBold);
            // glyphs the figures use: subscript zero, sigma, minus sign, prime, degree, angle brackets
            foreach (char c in "C₀σ−′°⟨⟩√²Δξη")
                Assert.NotEqual(0, typeface.GetGlyph(c));
        }
        Assert.True(File.Exists(reg.RegularPath));
        Assert.True(File.Exists(reg.BoldPath));
    }

    [Fact]
    public void EnsureRegistered_ManyThreads_OneRegistration()
    {
        var results = new ReportFonts.FontRegistration[16];
        Parallel.For(0, results.Length, i => results[i] = ReportFonts.EnsureRegistered());
        Assert.All(results, r => Assert.Same(results[0], r));
    }

    [Fact]
    public void ExtractedFonts_MatchTheShippedFiles()
    {
        var reg = ReportFonts.EnsureRegistered();
        string dir = Path.Combine(RepoPaths.Root, "src", "Photometallicity.Core", "Reporting", "Fonts");
        Assert.Equal(File.ReadAllBytes(Path.Combine(dir, "DejaVuSans.ttf")), File.ReadAllBytes(reg.RegularPath));
        Assert.Equal(File.ReadAllBytes(Path.Combine(dir, "DejaVuSans-Bold.ttf")), File.ReadAllBytes(reg.BoldPath));
        Assert.Contains("Bitstream", Encoding.UTF8.GetString(ReportFonts.ReadResource("LICENSE-DejaVu.txt")));
    }

    [Fact]
    public void Labels_ActuallyDrawPixels()
    {
        // The same figure with and without its labels must differ: where no font resolves, text draws nothing.
        var d = InventedField.Cmd(300);
        var withText = FigureRenderer.Png(FigureRenderer.Single(CmdPlot.Build(d, null)), FigureOptions.Default);
        var blank = d with { ColourLabel = "", MagnitudeLabel = "", Title = null };
        var withoutText = FigureRenderer.Png(FigureRenderer.Single(CmdPlot.Build(blank, null)), FigureOptions.Default);
        Assert.NotEqual(withText, withoutText);
    }
}
