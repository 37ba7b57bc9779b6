using System.Globalization;
using System.Text.Json.Nodes;
using System.Xml.Linq;
using Photometallicity.Catalogues;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Pipeline;

/// <summary>
/// The whole job on the committed invented field (samples/), checked against the demo generator's known truth
/// (samples/truth/), for row conservation, the figures, and determinism across thread counts.
/// </summary>
public class EndToEndTest(SamplesRunFixture run) : IClassFixture<SamplesRunFixture>
{
    private static readonly HashSet<string> Text = ["id", "narrow_id", "status", "src"];

    private Table Stars(string dir) => CatalogueIO.Read(Path.Combine(dir, "stars.csv"), new ReadOptions { TextColumns = Text });

    private JsonObject Summary() => JsonNode.Parse(File.ReadAllText(Path.Combine(run.Out, "summary.json")))!.AsObject();

    private static JsonObject Truth() => JsonNode.Parse(File.ReadAllText(RepoPaths.Samples("truth", "truth.json")))!.AsObject();

    [Fact]
    public void Run_Succeeds()
    {
        Assert.True(run.ExitCode == 0, run.Log);
        Assert.Equal(0, run.OneCoreExitCode);
    }

    [Fact]
    public void StarsCsv_HasEveryBroadbandRowOnceInInputOrder()
    {
        var broad = CatalogueIO.Read(RepoPaths.Samples("broad.csv"), new ReadOptions { TextColumns = Text });
        var stars = Stars(run.Out);
        Assert.Equal(broad.RowCount, stars.RowCount);
        var a = broad.Require("src");
        var b = stars.Require("id");
        for (int i = 0; i < broad.RowCount; i++) Assert.Equal(a.GetString(i), b.GetString(i));
        foreach (var col in new[] { "id", "ra", "dec", "narrow_id", "match_sep_arcsec", "colour0", "index0", "feh", "feh_lo", "feh_hi", "p_member", "status" })
            Assert.True(stars.Contains(col), col);
        var status = stars.Require("status");
        Assert.All(Enumerable.Range(0, stars.RowCount), i => Assert.False(string.IsNullOrEmpty(status.GetString(i))));
    }

    [Fact]
    public void Outputs_AreByteIdenticalOnOneCore()
    {
        foreach (var f in new[] { "stars.csv", "calibration.json", "stars.fits" })
            Assert.True(File.ReadAllBytes(Path.Combine(run.Out, f)).AsSpan().SequenceEqual(File.ReadAllBytes(Path.Combine(run.OneCore, f))), f);
    }

    [Fact]
    public void Figures_AreValidPngAndSvgOfNonTrivialSize()
    {
        foreach (var name in new[] { "colour_index", "calibration_residuals", "cmd", "sky", "mdf" })
        {
            byte[] png = File.ReadAllBytes(Path.Combine(run.Out, "plots", name + ".png"));
            Assert.True(png.Length > 20_000, $"{name}.png has {png.Length} bytes");
            Assert.Equal(new byte[] { 0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A }, png[..8]); // PNG signature (ISO/IEC 15948)
            var svg = XDocument.Load(Path.Combine(run.Out, "plots", name + ".svg"));
            Assert.Equal("svg", svg.Root!.Name.LocalName);
            Assert.True(new FileInfo(Path.Combine(run.Out, "plots", name + ".svg")).Length > 5_000);
        }
        string html = File.ReadAllText(Path.Combine(run.Out, "summary.html"));
        Assert.Contains("data:image/png;base64,", html);
    }

    [Fact]
    public void Summary_RecoversTheInventedTruth()
    {
        var s = Summary();
        var t = Truth();
        var off = s["crossmatch"]!["offset_arcsec"]!.AsArray();
        // The invented offset (narrow minus broad) is recovered to 0.03 arcsec (positions scatter by ~0.06 arcsec).
        Assert.InRange((double)off[0]! - (double)t["OffsetRaCosDecArcsec"]!, -0.03, 0.03);
        Assert.InRange((double)off[1]! - (double)t["OffsetDecArcsec"]!, -0.03, 0.03);

        var truthStars = CatalogueIO.Read(RepoPaths.Samples("truth", "truth_stars.csv"), new ReadOptions { TextColumns = Text });
        int members = Enumerable.Range(0, truthStars.RowCount).Count(i => truthStars.Require("is_member").GetDouble(i) == 1);
        double expected = (double)s["members"]!["expected"]!;
        Assert.InRange(expected / members, 0.93, 1.07);
        var m = s["members"]!;
        Assert.InRange((double)m["half_light_arcmin"]! / (double)t["HalfLightArcmin"]!, 0.85, 1.15);
        Assert.InRange((double)m["position_angle_deg"]! - (double)t["PositionAngleDeg"]!, -10, 10);

        var mdf = s["mdf"]!;
        Assert.InRange((double)mdf["mean"]! - (double)t["MeanFeh"]!, -0.35, 0.35);
        Assert.InRange((double)mdf["sigma"]!, 0.15, 0.6);
        Assert.True((double)s["calibration"]!["rms_dex"]! < 0.5);
    }

    [Fact]
    public void MembershipProbability_RanksMembersAboveForeground()
    {
        var stars = Stars(run.Out);
        var truth = CatalogueIO.Read(RepoPaths.Samples("truth", "truth_stars.csv"), new ReadOptions { TextColumns = Text });
        double[] p = stars.RequireDoubles("p_member");
        bool[] member = Enumerable.Range(0, truth.RowCount).Select(i => truth.Require("is_member").GetDouble(i) == 1).ToArray();
        // AUC by the rank-sum (Mann-Whitney U) statistic (Hanley & McNeil 1982, Radiology 143, 29).
        var order = Enumerable.Range(0, p.Length).Where(i => double.IsFinite(p[i])).OrderBy(i => p[i]).ToArray();
        double rankSum = 0;
        long n1 = 0, n0 = 0;
        for (int r = 0; r < order.Length; r++)
        {
            if (member[order[r]]) { rankSum += r + 1; n1++; } else n0++;
        }
        double auc = (rankSum - n1 * (n1 + 1) / 2.0) / (n1 * (double)n0);
        Assert.True(auc > 0.95, $"AUC {auc.ToString(CultureInfo.InvariantCulture)}");
    }

    [Fact]
    public void AssignAndMembers_WithTheRunsCalibration_ReproduceTheRun()
    {
        using var dir = new TempDir();
        string cal = Path.Combine(run.Out, "calibration.json");
        var a = CliRun.Invoke("assign", RepoPaths.Samples("config.json"), "--calibration", cal, "--out", dir.File("assign"));
        Assert.True(a.ExitCode == 0, a.Error);
        var m = CliRun.Invoke("members", RepoPaths.Samples("config.json"), "--calibration", cal, "--out", dir.File("members"));
        Assert.True(m.ExitCode == 0, m.Error);
        var ran = Stars(run.Out);
        var assigned = Stars(dir.File("assign"));
        foreach (var col in new[] { "feh", "feh_lo", "feh_hi" })
            Assert.Equal(ran.RequireDoubles(col), assigned.RequireDoubles(col));
        Assert.All(assigned.RequireDoubles("p_member"), p => Assert.True(double.IsNaN(p)));
        Assert.Equal(File.ReadAllBytes(Path.Combine(run.Out, "stars.csv")), File.ReadAllBytes(dir.File("members/stars.csv")));
        Assert.True(File.Exists(dir.File("members/summary.html")));
    }
}
