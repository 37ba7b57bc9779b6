using Photometallicity.Tests.Support;
using Photometallicity.Tiling;

namespace Photometallicity.Tests.Tiling;

/// <summary>A tiled run refuses inputs that changed after the split, and a broken plan, with exit code 2 and a message naming the file.</summary>
public class TilePlanChecksTest
{
    private static string CopySamples(TempDir dir)
    {
        string to = dir.File("field");
        foreach (var f in Directory.GetFiles(RepoPaths.Samples(), "*", SearchOption.AllDirectories))
        {
            string dest = Path.Combine(to, Path.GetRelativePath(RepoPaths.Samples(), f));
            Directory.CreateDirectory(Path.GetDirectoryName(dest)!);
            File.Copy(f, dest);
        }
        return Path.Combine(to, "config.json");
    }

    [Fact]
    public void ChangedConfigOrCatalogue_AfterTheSplit_IsRefused()
    {
        using var dir = new TempDir();
        string config = CopySamples(dir), work = dir.File("work");
        var s = CliRun.Invoke("split", config, "--order", "6", "--out", work);
        Assert.True(s.ExitCode == 0, s.Error);

        File.AppendAllText(config, "\n// edited after the split\n");
        var t = CliRun.Invoke("tile", work, "--index", "0");
        Assert.Equal(2, t.ExitCode);
        Assert.Contains("changed after the split", t.Error);
        Assert.Contains("config.json", t.Error);

        var m = CliRun.Invoke("merge", work, "--out", dir.File("merged"));
        Assert.Equal(2, m.ExitCode);
        Assert.False(Directory.Exists(dir.File("merged")));
    }

    [Fact]
    public void BrokenPlan_NamesTheKey()
    {
        using var dir = new TempDir();
        string config = CopySamples(dir), work = dir.File("work");
        Assert.Equal(0, CliRun.Invoke("split", config, "--order", "6", "--out", work).ExitCode);
        string plan = Path.Combine(work, TilePlan.FileName);
        File.WriteAllText(plan, File.ReadAllText(plan).Replace("\"owned_rows\"", "\"owned\""));
        var t = CliRun.Invoke("tile", work, "--index", "0");
        Assert.Equal(2, t.ExitCode);
        Assert.Contains("tiles[0]", t.Error);

        File.Delete(plan);
        var m = CliRun.Invoke("merge", work);
        Assert.Equal(2, m.ExitCode);
        Assert.Contains("no tile plan here", m.Error);
    }

    [Fact]
    public void Split_RefusesAnOrderWithTilesNarrowerThanTheMargin()
    {
        using var dir = new TempDir();
        var r = CliRun.Invoke("split", RepoPaths.Samples("config.json"), "--order", "21", "--out", dir.File("work"));
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("use a lower order", r.Error);
        Assert.False(File.Exists(Path.Combine(dir.File("work"), TilePlan.FileName)));
    }
}
