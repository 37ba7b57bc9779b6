using System.Globalization;
using System.Text;
using Photometallicity.Catalogues;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.CrossMatch;

/// <summary>The 'match' verb end to end on small invented CSV tables.</summary>
public class MatchCommandTest
{
    private static void WriteCsv(string path, string header, IEnumerable<string> rows) =>
        File.WriteAllText(path, header + "\n" + string.Join("\n", rows) + "\n", new UTF8Encoding(false));

    private static (string Left, string Right) MakeTables(TempDir dir, int n = 400)
    {
        var f = SyntheticField.Make(41, n, 359.99, 10.0, 0.02, 0.5, -0.2, 0.1, 0.7, 40);
        string left = dir.File("broad.csv"), right = dir.File("narrow.csv");
        WriteCsv(left, "src,ra,dec,gmag", Enumerable.Range(0, n).Select(i =>
            string.Create(CultureInfo.InvariantCulture, $"B{i},{f.LeftRa[i]:R},{f.LeftDec[i]:R},{18 + i * 0.001:0.000}")));
        WriteCsv(right, "nid,RAJ,DEJ,hk", Enumerable.Range(0, f.RightRa.Length).Select(i =>
            string.Create(CultureInfo.InvariantCulture, $"{1000 + i},{f.RightRa[i]:R},{f.RightDec[i]:R},{19 + i * 0.001:0.000}")));
        return (left, right);
    }

    [Fact]
    public void Match_WritesEveryLeftRowInOrderWithPartnerColumns()
    {
        using var dir = new TempDir();
        var (left, right) = MakeTables(dir);
        string outPath = dir.File("m.csv");
        var r = CliRun.Invoke("match", left, right, "--radius", "1", "--right-ra", "RAJ", "--right-dec", "DEJ", "--out", outPath);
        Assert.True(r.ExitCode == 0, r.Error);
        var t = CatalogueIO.Read(outPath);
        Assert.Equal(400, t.RowCount);
        Assert.Equal(["src", "ra", "dec", "gmag", "r_nid", "r_RAJ", "r_DEJ", "r_hk", "sep_arcsec", "match_flag"], t.Columns.Select(c => c.Name).ToArray());
        for (int i = 0; i < 400; i++) Assert.Equal($"B{i}", t["src"].GetString(i));
        int matched = 0;
        for (int i = 0; i < 400; i++)
        {
            double flag = t["match_flag"].GetDouble(i);
            bool has = !t["r_nid"].IsMissing(i);
            Assert.Equal(has, flag > 0);
            Assert.Equal(has, double.IsFinite(t["sep_arcsec"].GetDouble(i)));
            if (has) matched++;
        }
        Assert.InRange(matched, 240, 320);
        Assert.Contains("offset", r.Error);
        Assert.Contains("false-match rate expected", r.Error);
        Assert.Contains($"{matched} of 400 LEFT rows matched", r.Error);
    }

    [Fact]
    public void Match_AutoRadiusSaysWhatItChose()
    {
        using var dir = new TempDir();
        var (left, right) = MakeTables(dir);
        var r = CliRun.Invoke("match", left, right, "--radius", "auto", "--right-ra", "RAJ", "--right-dec", "DEJ", "--out", dir.File("m.fits"));
        Assert.True(r.ExitCode == 0, r.Error);
        Assert.Contains("radius", r.Error);
        Assert.Contains("auto:", r.Error);
    }

    [Fact]
    public void Match_WithoutOutWritesCsvToStdout()
    {
        using var dir = new TempDir();
        var (left, right) = MakeTables(dir, 50);
        var r = CliRun.Invoke("match", left, right, "--radius", "1.5", "--right-ra", "RAJ", "--right-dec", "DEJ", "--no-offset", "--right-prefix", "nb_");
        Assert.True(r.ExitCode == 0, r.Error);
        var lines = r.Out.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Equal(51, lines.Length);
        Assert.StartsWith("src,ra,dec,gmag,nb_nid,", lines[0]);
        Assert.Contains("offset not solved", r.Error);
    }

    [Fact]
    public void Match_BadDeclinationIsExit2NamingFileRowColumn()
    {
        using var dir = new TempDir();
        var (left, right) = MakeTables(dir, 20);
        var lines = File.ReadAllLines(left);
        lines[3] = "B2,10.0,95.5,18.0";
        File.WriteAllLines(left, lines);
        var r = CliRun.Invoke("match", left, right, "--radius", "1", "--right-ra", "RAJ", "--right-dec", "DEJ");
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("broad.csv", r.Error);
        Assert.Contains("row 3", r.Error);
        Assert.Contains("'dec'", r.Error);
    }

    [Fact]
    public void Match_MissingColumnAndBadRadiusAreExit2()
    {
        using var dir = new TempDir();
        var (left, right) = MakeTables(dir, 20);
        var r = CliRun.Invoke("match", left, right, "--radius", "1");
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("no column named 'ra'", r.Error);
        Assert.Contains("narrow.csv", r.Error);
        r = CliRun.Invoke("match", left, right, "--radius", "-3", "--right-ra", "RAJ", "--right-dec", "DEJ");
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("--radius", r.Error);
        r = CliRun.Invoke("match", left, right);
        Assert.Equal(2, r.ExitCode);
        Assert.False(File.Exists(dir.File("never.csv")));
    }

    [Fact]
    public void Match_PrefixCollisionIsExit2AndWritesNothing()
    {
        using var dir = new TempDir();
        var (left, _) = MakeTables(dir, 20);
        string right = dir.File("same.csv");
        WriteCsv(right, "src,ra,dec", ["N1,359.99,10.0"]);
        var r = CliRun.Invoke("match", left, right, "--radius", "1", "--right-prefix", "", "--out", dir.File("m.csv"));
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("prefix", r.Error);
        Assert.False(File.Exists(dir.File("m.csv")));
    }

    [Fact]
    public void Help_ExplainsOptionsWithUnits()
    {
        var r = CliRun.Invoke("match", "--help");
        Assert.Equal(0, r.ExitCode);
        foreach (string s in new[] { "--radius", "arcsec", "auto", "--left-ra", "degrees", "--right-prefix", "--no-offset", "match_flag" })
            Assert.Contains(s, r.Out);
    }
}
