using System.Globalization;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Pipeline;

/// <summary>A narrow-band catalogue that matches nothing leaves no usable standard: exit 2, the reasons counted, nothing written.</summary>
public class StandardsExclusionTest
{
    [Fact]
    public void Run_NarrowBandFromAnotherField_ExitsTwoWithTheReasons()
    {
        using var dir = new TempDir();
        foreach (var f in Directory.GetFiles(RepoPaths.Samples(), "*", SearchOption.AllDirectories))
        {
            string dst = Path.Combine(dir.Path, Path.GetRelativePath(RepoPaths.Samples(), f));
            Directory.CreateDirectory(Path.GetDirectoryName(dst)!);
            File.Copy(f, dst);
        }
        var lines = File.ReadAllLines(dir.File("narrow.csv"));
        for (int i = 1; i < lines.Length; i++)
        {
            var cells = lines[i].Split(',');
            cells[2] = (double.Parse(cells[2], CultureInfo.InvariantCulture) + 1.0).ToString("R", CultureInfo.InvariantCulture); // dec moved 1 deg
            lines[i] = string.Join(',', cells);
        }
        File.WriteAllLines(dir.File("narrow.csv"), lines);
        var r = CliRun.Invoke("run", dir.File("config.json"), "--out", dir.File("out"));
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("error: only 0 of ", r.Error);
        Assert.Contains("standards can enter the calibration (at least 7 are needed); left out before the fit: ", r.Error);
        Assert.Contains(" x photometry not usable (no_narrow_match)", r.Error);
        Assert.False(Directory.Exists(dir.File("out")) && Directory.EnumerateFiles(dir.File("out"), "*", SearchOption.AllDirectories).Any());
    }

    /// <summary>Degenerate standards are an input problem: exit 2 naming it, nothing written.</summary>
    [Theory]
    [InlineData("one_feh", "all one [Fe/H]")]
    [InlineData("mostly_wrong", "more than half")]
    [InlineData("three", "needs at least 7 standards")]
    public void Run_DegenerateStandards_ExitTwoNamingWhyAndWriteNothing(string kind, string message)
    {
        using var dir = new TempDir();
        foreach (var f in Directory.GetFiles(RepoPaths.Samples(), "*", SearchOption.AllDirectories))
        {
            string dst = Path.Combine(dir.Path, Path.GetRelativePath(RepoPaths.Samples(), f));
            Directory.CreateDirectory(Path.GetDirectoryName(dst)!);
            File.Copy(f, dst);
        }
        var lines = File.ReadAllLines(dir.File("standards.csv")).ToList();
        var header = lines[0].Split(',');
        int feh = Array.IndexOf(header, "feh_spec");
        var rng = new Photometallicity.Numerics.Rng(17);
        for (int i = 1; i < lines.Count; i++)
        {
            var cells = lines[i].Split(',');
            double v = double.Parse(cells[feh], CultureInfo.InvariantCulture);
            if (kind == "one_feh") v = -1.5;
            // Two in three standards wrong by 0.5-1.2 dex either way.
            if (kind == "mostly_wrong" && i % 3 != 0) v += (rng.NextDouble() < 0.5 ? -1 : 1) * (0.5 + 0.7 * rng.NextDouble());
            cells[feh] = v.ToString("R", CultureInfo.InvariantCulture);
            lines[i] = string.Join(',', cells);
        }
        if (kind == "three") lines = lines.Take(4).ToList();
        File.WriteAllLines(dir.File("standards.csv"), lines);
        var r = CliRun.Invoke("run", dir.File("config.json"), "--out", dir.File("out"));
        Assert.True(r.ExitCode == 2, r.Error);
        Assert.True(r.Error.Contains(message), r.Error[^Math.Min(600, r.Error.Length)..]);
        Assert.False(Directory.Exists(dir.File("out")) && Directory.EnumerateFiles(dir.File("out"), "*", SearchOption.AllDirectories).Any());
    }
}
