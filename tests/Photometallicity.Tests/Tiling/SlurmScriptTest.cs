using Photometallicity.Errors;
using Photometallicity.Tests.Support;
using Photometallicity.Tiling;

namespace Photometallicity.Tests.Tiling;

/// <summary>
/// The Slurm scripts: their #SBATCH requests, and what bash itself makes of them (the words each command line
/// gives the program, the order and arguments of the sbatch calls, with a stand-in sbatch on PATH).
/// </summary>
[System.Runtime.Versioning.UnsupportedOSPlatform("windows")]
public class SlurmScriptTest
{
    // A work directory whose path needs quoting in bash (space, ', $, #) and escaping in sbatch patterns (%).
    private const string Awkward = "field it's $HOME #1 50%";

    private static SlurmOptions Options(string exe) => new() { Executable = [exe] };

    private static string[] SbatchLines(string text) => text.Split('\n').Where(l => l.StartsWith("#SBATCH ", StringComparison.Ordinal)).ToArray();

    [Fact]
    public void TilesText_OneArrayTaskPerTileWithTheEstimatedRequest()
    {
        using var dir = new TempDir();
        var plan = TilePlanSamples.FourTiles(dir.Path);
        string text = SlurmScript.TilesText(plan, Options("/opt/pm/photometallicity"));
        var est = TaskResources.ForRows(9700, 7000, 2); // tile 2 is the largest in both kinds of rows
        Assert.Equal(
        [
            "#SBATCH --job-name=photometallicity-tiles",
            "#SBATCH --array=0-3",
            "#SBATCH --cpus-per-task=2",
            $"#SBATCH --mem={est.MemoryMiB}M",
            "#SBATCH --time=00:10:00",
            $"#SBATCH --output=\"{dir.Path}/slurm/logs/tile-%a.out\"",
        ], SbatchLines(text));
        Assert.Equal(512, est.MemoryMiB);
        Assert.StartsWith("#!/bin/bash\n", text);
        Assert.Contains("\nset -euo pipefail\n", text);
        Assert.EndsWith($"\nexec '/opt/pm/photometallicity' tile '{dir.Path}' --index \"${{SLURM_ARRAY_TASK_ID}}\"\n", text);
        // sbatch reads #SBATCH lines only before the first command.
        Assert.True(text.IndexOf("#SBATCH", StringComparison.Ordinal) < text.IndexOf("\nset ", StringComparison.Ordinal));
        Assert.True(text.LastIndexOf("#SBATCH", StringComparison.Ordinal) < text.IndexOf("\nset ", StringComparison.Ordinal));
    }

    [Fact]
    public void TilesText_OneTile_IsTheArrayZeroToZero()
    {
        using var dir = new TempDir();
        var plan = TilePlanSamples.FourTiles(dir.Path) with { Tiles = [TilePlanSamples.Tile(0, 7, 5, 5, 5)] };
        Assert.Contains("#SBATCH --array=0-0\n", SlurmScript.TilesText(plan, Options("/x/pm")));
    }

    [Fact]
    public void Texts_CarryPartitionAccountCpusAndExplicitRequests()
    {
        using var dir = new TempDir();
        var plan = TilePlanSamples.FourTiles(dir.Path);
        var o = Options("/x/pm") with
        {
            Partition = "short,long", Account = "proj-42", CpusPerTask = 4, TileMemoryMiB = 3000, TileWallMinutes = 90,
            MergeWallMinutes = 2000, JobName = "vellum",
        };
        var tiles = SbatchLines(SlurmScript.TilesText(plan, o));
        Assert.Contains("#SBATCH --job-name=vellum-tiles", tiles);
        Assert.Contains("#SBATCH --cpus-per-task=4", tiles);
        Assert.Contains("#SBATCH --mem=3000M", tiles);
        Assert.Contains("#SBATCH --time=01:30:00", tiles);
        Assert.Contains("#SBATCH --partition=short,long", tiles);
        Assert.Contains("#SBATCH --account=proj-42", tiles);
        var merge = SbatchLines(SlurmScript.MergeText(plan, o));
        Assert.Contains("#SBATCH --job-name=vellum-merge", merge);
        Assert.Contains("#SBATCH --time=1-09:20:00", merge);
        Assert.Contains($"#SBATCH --mem={TaskResources.ForRows(20000, 16233, 4).MemoryMiB}M", merge);
        Assert.Contains("#SBATCH --partition=short,long", merge);
        Assert.DoesNotContain(merge, l => l.StartsWith("#SBATCH --array", StringComparison.Ordinal));
        Assert.DoesNotContain(SbatchLines(SlurmScript.TilesText(plan, Options("/x/pm"))), l => l.Contains("--partition") || l.Contains("--account"));
    }

    [Fact]
    public void MergeText_MergesIntoThePlanOutputUnlessTold()
    {
        using var dir = new TempDir();
        var plan = TilePlanSamples.FourTiles(dir.Path);
        Assert.EndsWith($" merge '{dir.Path}' --out '/data/field one/out'\n", SlurmScript.MergeText(plan, Options("/x/pm")));
        Assert.EndsWith($" merge '{dir.Path}' --out '/elsewhere/m'\n", SlurmScript.MergeText(plan, Options("/x/pm") with { MergeOutputDirectory = "/elsewhere/m" }));
        Assert.Contains($"#SBATCH --output=\"{dir.Path}/slurm/logs/merge.out\"\n", SlurmScript.MergeText(plan, Options("/x/pm")));
    }

    [Fact]
    public void Scripts_GiveTheProgramExactlyItsArguments_ThroughBash()
    {
        using var dir = new TempDir();
        string work = Path.Combine(dir.Path, Awkward, "W"), bin = Path.Combine(dir.Path, Awkward, "bin");
        Directory.CreateDirectory(bin);
        string argsFile = dir.File("args.txt");
        string exe = ShellRun.WriteScript(Path.Combine(bin, "fake pm"), $"printf '%s\\n' \"$@\" > '{argsFile}'\n");
        var plan = TilePlanSamples.FourTiles(work);
        TilePlanJson.Write(plan, TilePlanJson.PathIn(work));
        var written = SlurmScript.Write(TilePlanJson.Read(work), Options(exe) with { MergeOutputDirectory = Path.Combine(dir.Path, Awkward, "merged out") });

        var r = ShellRun.Bash(written.TilesScript, new Dictionary<string, string> { ["SLURM_ARRAY_TASK_ID"] = "2", ["SLURM_ARRAY_JOB_ID"] = "77" });
        Assert.True(r.ExitCode == 0, r.Error);
        Assert.Equal(["tile", work, "--index", "2"], File.ReadAllLines(argsFile));
        Assert.Contains("tile 2 of array job 77", r.Error);

        r = ShellRun.Bash(written.MergeScript, new Dictionary<string, string>());
        Assert.True(r.ExitCode == 0, r.Error);
        Assert.Equal(["merge", work, "--out", Path.Combine(dir.Path, Awkward, "merged out")], File.ReadAllLines(argsFile));

        // Outside an array task the variable is unset: 'set -u' stops the script before the program runs.
        File.Delete(argsFile);
        r = ShellRun.Bash(written.TilesScript, new Dictionary<string, string>());
        Assert.NotEqual(0, r.ExitCode);
        Assert.Contains("SLURM_ARRAY_TASK_ID", r.Error);
        Assert.False(File.Exists(argsFile));

        // sbatch expands %-patterns in --output: the literal % of the path is doubled, the task's %a is not.
        Assert.Contains($"#SBATCH --output=\"{dir.Path}/field it's $HOME #1 50%%/W/slurm/logs/tile-%a.out\"\n", File.ReadAllText(written.TilesScript));
    }

    [Fact]
    public void Submit_SubmitsTheArrayThenTheMergeAfterOkOnIt()
    {
        using var dir = new TempDir();
        string work = Path.Combine(dir.Path, Awkward);
        var plan = TilePlanSamples.FourTiles(work);
        var written = SlurmScript.Write(plan, Options("/x/pm"));
        string log = dir.File("sbatch.log");
        string fakeBin = Path.Combine(dir.Path, "fakebin");
        Directory.CreateDirectory(fakeBin);
        // A stand-in sbatch: logs its working directory and arguments, prints "jobid;cluster" as --parsable does.
        ShellRun.WriteScript(Path.Combine(fakeBin, "sbatch"),
            $"n=$(( $(cat '{log}' 2>/dev/null | grep -c '^call') + 1 ))\n" +
            $"{{ echo \"call $n\"; echo \"cwd $PWD\"; printf 'arg %s\\n' \"$@\"; }} >> '{log}'\n" +
            "echo \"$((100 + n));pmci\"\n" +
            "for a in \"$@\"; do [ \"$a\" = --wait ] && exit \"${FAKE_MERGE_RC:-0}\"; done\nexit 0\n");
        // A stand-in scontrol: 'show job ID -o' gives the job's final state on one line, as the real one does.
        ShellRun.WriteScript(Path.Combine(fakeBin, "scontrol"),
            "echo \"JobId=$3 JobName=m UserId=u(0) JobState=${FAKE_MERGE_STATE:-COMPLETED} Reason=None Dependency=(null)\"\n");
        var env = new Dictionary<string, string> { ["PATH"] = fakeBin + ":/usr/bin:/bin" };

        var r = ShellRun.Bash(written.SubmitScript, env);
        Assert.True(r.ExitCode == 0, r.Error);
        string slurmDir = Path.Combine(work, "slurm");
        Assert.Equal(
        [
            "call 1", $"cwd {work}", "arg --parsable", $"arg {slurmDir}/tiles.sbatch",
            "call 2", $"cwd {work}", "arg --parsable", "arg --dependency=afterok:101", "arg --kill-on-invalid-dep=yes", $"arg {slurmDir}/merge.sbatch",
        ], File.ReadAllLines(log));
        Assert.Contains("tile array: job 101, 4 tasks", r.Out);
        Assert.Contains("merge: job 102", r.Out);

        File.Delete(log);
        r = ShellRun.Bash(written.SubmitScript, env, "--wait");
        Assert.True(r.ExitCode == 0, r.Error);
        Assert.Contains("arg --wait", File.ReadAllLines(log));
        Assert.Contains("arg --dependency=afterok:101", File.ReadAllLines(log));
        Assert.Contains("merge: job 102 ended COMPLETED, exit code 0", r.Out);

        File.Delete(log);
        env["FAKE_MERGE_RC"] = "3";
        env["FAKE_MERGE_STATE"] = "FAILED";
        r = ShellRun.Bash(written.SubmitScript, env, "--wait");
        Assert.Equal(3, r.ExitCode);
        Assert.Contains("merge: job 102 ended FAILED, exit code 3", r.Out);
        Assert.Contains("the merge did not succeed", r.Error);

        // sbatch --wait exits 0 for a job cancelled before it ran (a tile failed): the state decides.
        File.Delete(log);
        env["FAKE_MERGE_RC"] = "0";
        env["FAKE_MERGE_STATE"] = "CANCELLED";
        r = ShellRun.Bash(written.SubmitScript, env, "--wait");
        Assert.Equal(1, r.ExitCode);
        Assert.Contains("merge: job 102 ended CANCELLED, exit code 1", r.Out);

        r = ShellRun.Bash(written.SubmitScript, env, "--bogus");
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("unknown argument '--bogus'", r.Error);
    }

    [Fact]
    public void Write_IsRepeatableAndTheScriptsAreExecutable()
    {
        using var dir = new TempDir();
        var plan = TilePlanSamples.FourTiles(dir.Path);
        var w = SlurmScript.Write(plan, Options("/x/pm"));
        var first = new[] { w.TilesScript, w.MergeScript, w.SubmitScript }.Select(File.ReadAllBytes).ToArray();
        SlurmScript.Write(plan, Options("/x/pm"));
        Assert.Equal(first, new[] { w.TilesScript, w.MergeScript, w.SubmitScript }.Select(File.ReadAllBytes).ToArray());
        Assert.Equal(["slurm/merge.sbatch", "slurm/submit.sh", "slurm/tiles.sbatch"], dir.Files());
        Assert.True(Directory.Exists(Path.Combine(dir.Path, "slurm", "logs")));
        foreach (var f in new[] { w.TilesScript, w.MergeScript, w.SubmitScript })
            Assert.True(File.GetUnixFileMode(f).HasFlag(UnixFileMode.UserExecute), f);
    }

    [Theory]
    [InlineData("/x/p\"m", "--exe")]
    [InlineData("/x/p\\m", "--exe")]
    [InlineData("relative/pm", "--exe")]
    public void Write_RefusesPathsTheScriptsCannotCarry(string exe, string named)
    {
        using var dir = new TempDir();
        var e = Assert.Throws<InputException>(() => SlurmScript.Write(TilePlanSamples.FourTiles(dir.Path), Options(exe)));
        Assert.StartsWith(named + ":", e.Message);
        Assert.Empty(dir.Files());
    }

    [Fact]
    public void Write_RefusesAWorkDirectoryWithAQuoteAndAnEmptyPlan()
    {
        using var dir = new TempDir();
        var e = Assert.Throws<InputException>(() => SlurmScript.Write(TilePlanSamples.FourTiles(Path.Combine(dir.Path, "a\"b")), Options("/x/pm")));
        Assert.StartsWith("the work directory:", e.Message);
        e = Assert.Throws<InputException>(() => SlurmScript.Write(TilePlanSamples.FourTiles(dir.Path) with { Tiles = [] }, Options("/x/pm")));
        Assert.Contains("no tiles", e.Message);
        Assert.Empty(dir.Files());
    }

    [Theory]
    [InlineData("bad partition", null, "--partition")]
    [InlineData(null, "a,b", "--account")]
    public void Validate_NamesTheOption(string? partition, string? account, string named)
    {
        var e = Assert.Throws<InputException>(() => (Options("/x/pm") with { Partition = partition, Account = account }).Validate());
        Assert.StartsWith(named, e.Message);
    }

    [Fact]
    public void Validate_ChecksRanges()
    {
        Assert.StartsWith("--cpus-per-task 0", Assert.Throws<InputException>(() => (Options("/x/pm") with { CpusPerTask = 0 }).Validate()).Message);
        Assert.StartsWith("--mem-per-task 8", Assert.Throws<InputException>(() => (Options("/x/pm") with { TileMemoryMiB = 8 }).Validate()).Message);
        Assert.StartsWith("--time-merge 0", Assert.Throws<InputException>(() => (Options("/x/pm") with { MergeWallMinutes = 0 }).Validate()).Message);
        Assert.StartsWith("--job-name 'a b'", Assert.Throws<InputException>(() => (Options("/x/pm") with { JobName = "a b" }).Validate()).Message);
    }
}
