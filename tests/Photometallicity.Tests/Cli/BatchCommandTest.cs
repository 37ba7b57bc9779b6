using System.Text;
using Photometallicity.Tests.Support;
using Photometallicity.Tests.Tiling;
using Photometallicity.Tiling;

namespace Photometallicity.Tests.Cli;

/// <summary>The 'batch' verb on a plan.json written with <see cref="TilePlanJson"/> in a scratch directory.</summary>
[System.Runtime.Versioning.UnsupportedOSPlatform("windows")]
public class BatchCommandTest
{
    private static (string Work, string Exe) Setup(TempDir dir)
    {
        string work = Path.Combine(dir.Path, "work dir");
        TilePlanJson.Write(TilePlanSamples.FourTiles(work), TilePlanJson.PathIn(work));
        string exe = dir.File("pm");
        File.WriteAllText(exe, "#!/bin/sh\n");
        File.SetUnixFileMode(exe, UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute);
        return (work, exe);
    }

    [Fact]
    public void Batch_WritesTheScriptsAndSaysWhatItAsksFor()
    {
        using var dir = new TempDir();
        var (work, exe) = Setup(dir);
        var r = CliRun.Invoke("batch", work, "--exe", exe, "--partition", "debug");
        Assert.True(r.ExitCode == 0, r.Error);
        Assert.Equal("", r.Out);
        Assert.True(File.Exists(Path.Combine(work, "slurm", "tiles.sbatch")));
        Assert.True(File.Exists(Path.Combine(work, "slurm", "merge.sbatch")));
        Assert.True(File.Exists(Path.Combine(work, "slurm", "submit.sh")));
        Assert.Contains("4 tiles at HEALPix order 6", r.Error);
        Assert.Contains("array 0-3, per task 2 CPUs, 512 MiB (estimated peak", r.Error);
        Assert.Contains("wall time 00:10:00 (estimated", r.Error);
        Assert.Contains("merge into /data/field one/out", r.Error);
        Assert.Contains($"submit with: '{work}/slurm/submit.sh'", r.Error);
        string tiles = File.ReadAllText(Path.Combine(work, "slurm", "tiles.sbatch"));
        Assert.Contains("#SBATCH --partition=debug\n", tiles);
        Assert.Contains($"exec '{exe}' tile '{work}' --index", tiles);
    }

    [Fact]
    public void Batch_ExplicitRequestsAndARelativeOut()
    {
        using var dir = new TempDir();
        var (work, exe) = Setup(dir);
        string cwd = Environment.CurrentDirectory;
        var r = CliRun.Invoke("batch", work, "--exe", exe, "--mem-per-task", "1500", "--time-per-task", "75", "--cpus-per-task", "1", "--out", "merged");
        Assert.True(r.ExitCode == 0, r.Error);
        Assert.Contains("1 CPU, 1500 MiB (as given), wall time 01:15:00 (as given)", r.Error);
        string tiles = File.ReadAllText(Path.Combine(work, "slurm", "tiles.sbatch"));
        Assert.Contains("#SBATCH --mem=1500M\n", tiles);
        Assert.Contains("#SBATCH --time=01:15:00\n", tiles);
        Assert.Contains("#SBATCH --cpus-per-task=1\n", tiles);
        string merge = File.ReadAllText(Path.Combine(work, "slurm", "merge.sbatch"));
        Assert.Contains($"--out '{Path.Combine(cwd, "merged")}'\n", merge);
        Assert.Contains($"#SBATCH --mem={TaskResources.ForRows(20000, 16233, 1).MemoryMiB}M\n", merge);
    }

    [Fact]
    public void Batch_WithoutExe_RunsThisProgram()
    {
        using var dir = new TempDir();
        var (work, _) = Setup(dir);
        var r = CliRun.Invoke("batch", work);
        Assert.True(r.ExitCode == 0, r.Error);
        Assert.Contains($"exec '{Environment.ProcessPath}'", File.ReadAllText(Path.Combine(work, "slurm", "tiles.sbatch")));
    }

    [Fact]
    public void Batch_NoPlan_Exit2NamingTheFile()
    {
        using var dir = new TempDir();
        var r = CliRun.Invoke("batch", dir.Path, "--exe", "/bin/sh");
        Assert.Equal(2, r.ExitCode);
        Assert.Contains($"error: {Path.Combine(dir.Path, "plan.json")}: no tile plan here", r.Error);
        Assert.Empty(dir.Files());
    }

    [Fact]
    public void Batch_BadPlanKey_Exit2NamingTheKeyAndWritingNothing()
    {
        using var dir = new TempDir();
        var (work, exe) = Setup(dir);
        string plan = TilePlanJson.PathIn(work);
        File.WriteAllText(plan, File.ReadAllText(plan).Replace("\"order\": 6", "\"order\": -1"), new UTF8Encoding(false));
        var r = CliRun.Invoke("batch", work, "--exe", exe);
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("key 'order': -1 is outside [0, 29]", r.Error);
        Assert.False(Directory.Exists(Path.Combine(work, "slurm")));
    }

    [Theory]
    [InlineData("--exe", "/no/such/program", "--exe: no file '/no/such/program'")]
    [InlineData("--cpus-per-task", "0", "--cpus-per-task 0 is outside")]
    [InlineData("--time-per-task", "0", "--time-per-task 0 is outside")]
    [InlineData("--partition", "a b", "--partition 'a b'")]
    public void Batch_BadOption_Exit2NamingIt(string option, string value, string expected)
    {
        using var dir = new TempDir();
        var (work, exe) = Setup(dir);
        var args = new List<string> { "batch", work, option, value };
        if (option != "--exe") args.AddRange(["--exe", exe]);
        var r = CliRun.Invoke([.. args]);
        Assert.Equal(2, r.ExitCode);
        Assert.Contains(expected, r.Error);
        Assert.False(Directory.Exists(Path.Combine(work, "slurm")));
    }

    [Fact]
    public void Batch_ExeNotExecutable_Exit2()
    {
        using var dir = new TempDir();
        var (work, _) = Setup(dir);
        string plain = dir.File("not a program");
        File.WriteAllText(plain, "text");
        File.SetUnixFileMode(plain, UnixFileMode.UserRead | UnixFileMode.UserWrite);
        var r = CliRun.Invoke("batch", work, "--exe", plain);
        Assert.Equal(2, r.ExitCode);
        Assert.Contains($"--exe: '{plain}' is not executable", r.Error);
    }

    [Fact]
    public void Help_ExplainsEveryOptionWithUnits()
    {
        var r = CliRun.Invoke("batch", "--help");
        Assert.Equal(0, r.ExitCode);
        foreach (var o in new[] { "--partition", "--account", "--cpus-per-task", "--mem-per-task", "--time-per-task", "--mem-merge", "--time-merge", "--exe", "--out", "--job-name" })
            Assert.Contains(o, r.Out);
        Assert.Contains("in MiB", r.Out);
        Assert.Contains("in minutes", r.Out);
        Assert.Contains("WORKDIR", r.Out);
    }
}
