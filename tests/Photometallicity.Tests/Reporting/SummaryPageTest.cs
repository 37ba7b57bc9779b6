using System.Text.RegularExpressions;
using Photometallicity.Errors;
using Photometallicity.Reporting;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Reporting;

public class SummaryPageTest
{
    private const string Hostile = "<script>alert('x')</script> & \"quotes\" | *bold* [link](http://evil.example)";

    private static SummaryPageData Data(TempDir dir)
    {
        var mdf = MdfPlot.Write(InventedField.Mdf(), dir.File("plots/mdf"));
        var fc = ForecastPlot.Write(InventedField.Forecast(), dir.File("plots/forecast"));
        File.WriteAllText(dir.File("broad.csv"), "id,ra,dec\n1,2,3\n");
        return new SummaryPageData(
            "Invented galaxy " + Hostile,
            [InputFileEntry.FromFile(dir.File("broad.csv"), 1, "broadband " + Hostile)],
            [new OutputFileEntry("stars.csv", "one row per input star " + Hostile)],
            ["warning one " + Hostile, "warning two"],
            [new KeyNumber("mean [Fe/H] " + Hostile, -1.5123, 0.0123, "dex"), new KeyNumber("expected members", 2196.04, null, ""),
             new KeyNumber("offset", 0.0321, 0.0009, "arcsec", "0.0000")],
            [new FigureEntry(mdf.PngPath, "Metallicity distribution " + Hostile, "MDF"), new FigureEntry(fc.PngPath, "Forecast", null)],
            new ProvenanceInfo("0.1.0", 7, [new("seed.calibration", "12345")], "{ \"x\": 1 }\n" + Hostile))
        { Subtitle = Hostile };
    }

    [Fact]
    public void WriteHtml_EmbedsEveryFigureAsPngDataUri()
    {
        using var dir = new TempDir();
        var d = Data(dir);
        SummaryPage.WriteHtml(d, dir.File("summary.html"));
        string html = File.ReadAllText(dir.File("summary.html"));
        var uris = Regex.Matches(html, "src=\"data:image/png;base64,([A-Za-z0-9+/=]+)\"");
        Assert.Equal(2, uris.Count);
        for (int i = 0; i < 2; i++)
            Assert.Equal(File.ReadAllBytes(d.Figures[i].PngPath), Convert.FromBase64String(uris[i].Groups[1].Value));
        Assert.Contains("<strong>Figure 1. MDF.</strong>", html);
    }

    [Fact]
    public void WriteHtml_HostileText_IsEncodedEverywhere()
    {
        using var dir = new TempDir();
        SummaryPage.WriteHtml(Data(dir), dir.File("summary.html"));
        string html = File.ReadAllText(dir.File("summary.html"));
        Assert.DoesNotContain("<script", html, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("href=", html);
        Assert.Contains("&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt; &amp; &quot;quotes&quot;", html);
        // every occurrence of the hostile string (title twice, subtitle, warning, key number, caption,
        // input role, output, config) is encoded
        Assert.Equal(9, Regex.Matches(html, "&lt;script&gt;").Count);
    }

    [Fact]
    public void WriteHtml_SelfContained()
    {
        using var dir = new TempDir();
        SummaryPage.WriteHtml(Data(dir), dir.File("summary.html"));
        string html = File.ReadAllText(dir.File("summary.html"));
        Assert.DoesNotContain("<link", html);
        Assert.DoesNotContain("@import", html);
        Assert.DoesNotMatch("src=\"(?!data:)", html);
        Assert.DoesNotContain("url(", html);
        Assert.StartsWith("<!DOCTYPE html>", html);
    }

    [Fact]
    public void WriteHtml_SectionsAndNumbers()
    {
        using var dir = new TempDir();
        var d = Data(dir);
        SummaryPage.WriteHtml(d, dir.File("summary.html"));
        string html = File.ReadAllText(dir.File("summary.html"));
        foreach (var h in new[] { "Warnings", "Key numbers", "Figures", "Inputs", "Outputs", "Provenance" })
            Assert.Contains($"<h2>{h}</h2>", html);
        Assert.Contains("<td class=\"num\">−1.512</td><td class=\"num\">± 0.012</td><td>dex</td>", html);
        Assert.Contains("<td class=\"num\">0.0321</td><td class=\"num\">± 0.0009</td><td>arcsec</td>", html);
        Assert.Contains(d.Inputs[0].Sha256, html);
        Assert.Matches("^[0-9a-f]{64}$", d.Inputs[0].Sha256);
        Assert.Contains("<li>warning two</li>", html);
        Assert.Contains("<tr><th>master seed</th><td>7</td></tr>", html);
    }

    [Fact]
    public void WriteHtml_SameDataTwice_IdenticalFiles()
    {
        using var dir = new TempDir();
        var d = Data(dir);
        SummaryPage.WriteHtml(d, dir.File("a.html"));
        SummaryPage.WriteHtml(d, dir.File("b.html"));
        Assert.Equal(File.ReadAllBytes(dir.File("a.html")), File.ReadAllBytes(dir.File("b.html")));
    }

    [Fact]
    public void WriteHtml_MissingFigure_NamesTheFile()
    {
        using var dir = new TempDir();
        var d = Data(dir) with { Figures = [new FigureEntry(dir.File("plots/none.png"), "gone")] };
        var e = Assert.Throws<InputException>(() => SummaryPage.WriteHtml(d, dir.File("summary.html")));
        Assert.Contains("none.png", e.Message);
        Assert.False(File.Exists(dir.File("summary.html")));
    }

    [Fact]
    public void WriteMarkdown_LinksFiguresRelativeAndEscapesText()
    {
        using var dir = new TempDir();
        SummaryPage.WriteMarkdown(Data(dir), dir.File("summary.md"));
        string md = File.ReadAllText(dir.File("summary.md"));
        Assert.Contains("](plots/mdf.png)", md);
        Assert.Contains("](plots/forecast.png)", md);
        // raw text only inside the indented code block of the configuration, where Markdown shows it verbatim
        Assert.All(md.Split('\n').Where(l => l.Contains("<script", StringComparison.Ordinal)), l => Assert.StartsWith("    ", l));
        string prose = string.Join('\n', md.Split('\n').Where(l => !l.StartsWith("    ", StringComparison.Ordinal)));
        Assert.DoesNotMatch(@"(?<!\\)\]\(http", prose); // outside the code block the hostile link is escaped: \[link\](...
        Assert.Contains("\\[link\\]", md);
        Assert.Contains("\\| \\*bold\\*", md);
        Assert.Contains("| mean \\[Fe/H\\] ", md);
        Assert.Contains("| −1.512 | ± 0.012 | dex |", md);
        Assert.Contains("- **Warning:** warning two", md);
    }

    [Theory]
    [InlineData(-1.5123, 0.0123, "−1.512", "0.012")]
    [InlineData(22.456, 0.15, "22.46", "0.15")]
    [InlineData(1234.6, 56.0, "1235", "56")]
    [InlineData(0.29, 0.015, "0.290", "0.015")]
    public void Format_RoundsUncertaintyToTwoSignificantFigures(double value, double unc, string v, string u)
    {
        Assert.Equal((v, u), ValueFormat.Format(new KeyNumber("x", value, unc, "")));
    }

    [Fact]
    public void Format_NotFinite_IsNotAvailable()
    {
        Assert.Equal(("n/a", "n/a"), ValueFormat.Format(new KeyNumber("x", double.NaN, 0.1, "dex")));
        Assert.Equal(("0.5", ""), ValueFormat.Format(new KeyNumber("x", 0.5, null, "")));
    }
}
