using System.Globalization;
using System.Text;
using Photometallicity.Catalogues;

namespace Photometallicity.Tiling;

/// <summary>What <see cref="SlurmScript.Write"/> wrote and the requests in it.</summary>
public sealed record SlurmScripts(string Directory, string TilesScript, string MergeScript, string SubmitScript, string LogDirectory,
    TaskResources Tile, TaskResources Merge, string MergeOutputDirectory);

/// <summary>
/// The Slurm batch scripts of a tile plan, in WORKDIR/slurm: tiles.sbatch, a job array with one task per tile
/// (task N runs 'tile WORKDIR --index N'); merge.sbatch, which runs 'merge WORKDIR --out DIR'; and submit.sh,
/// which submits the array and then the merge with an afterok dependency on it. Paths are absolute, in double
/// quotes in #SBATCH lines (sbatch's own quoting) and in single quotes in bash, so spaces and shell
/// characters are safe; '%' in a log path is doubled because sbatch expands %-patterns there.
/// The text depends only on the plan and the options, so the same inputs give the same files.
/// </summary>
public static class SlurmScript
{
    public const string DirectoryName = "slurm";
    public const string TilesFileName = "tiles.sbatch";
    public const string MergeFileName = "merge.sbatch";
    public const string SubmitFileName = "submit.sh";

    public static string ScriptDirectory(TilePlan plan) => Path.Combine(plan.WorkDirectory, DirectoryName);

    public static string LogDirectory(TilePlan plan) => Path.Combine(ScriptDirectory(plan), "logs");

    /// <summary>The tile tasks' request: the estimate for the largest tile, or the explicit values of the options.</summary>
    public static TaskResources TileResources(TilePlan plan, SlurmOptions o) =>
        TaskResources.ForLargestTile(plan, o.CpusPerTask).Override(o.TileMemoryMiB, o.TileWallMinutes);

    /// <summary>The merge job's request: the estimate for the whole field, or the explicit values of the options.</summary>
    public static TaskResources MergeResources(TilePlan plan, SlurmOptions o) =>
        TaskResources.ForMerge(plan, o.CpusPerTask).Override(o.MergeMemoryMiB, o.MergeWallMinutes);

    private static string MergeOutput(TilePlan plan, SlurmOptions o) => o.MergeOutputDirectory ?? plan.OutputDirectory;

    /// <summary>Checks the options and the plan's paths, then writes the three scripts (each to a temporary name, then renamed) and creates the log directory.</summary>
    public static SlurmScripts Write(TilePlan plan, SlurmOptions o)
    {
        Check(plan, o);
        string dir = ScriptDirectory(plan), logs = LogDirectory(plan);
        Directory.CreateDirectory(logs);
        string tiles = Path.Combine(dir, TilesFileName), merge = Path.Combine(dir, MergeFileName), submit = Path.Combine(dir, SubmitFileName);
        var tileRes = TileResources(plan, o);
        var mergeRes = MergeResources(plan, o);
        WriteExecutable(tiles, TilesText(plan, o));
        WriteExecutable(merge, MergeText(plan, o));
        WriteExecutable(submit, SubmitText(plan));
        return new SlurmScripts(dir, tiles, merge, submit, logs, tileRes, mergeRes, MergeOutput(plan, o));
    }

    private static void Check(TilePlan plan, SlurmOptions o)
    {
        o.Validate();
        if (plan.Tiles.Count == 0)
            throw new Errors.InputException("the plan holds no tiles, so there is nothing to submit", file: Path.Combine(plan.WorkDirectory, TilePlan.FileName));
        SlurmOptions.CheckScriptSafe(plan.WorkDirectory, "the work directory");
    }

    /// <summary>tiles.sbatch: the job array, one task per tile.</summary>
    public static string TilesText(TilePlan plan, SlurmOptions o)
    {
        Check(plan, o);
        var r = TileResources(plan, o);
        var big = plan.Tiles.MaxBy(t => t.BroadbandRows)!;
        var s = new StringBuilder();
        s.Append("#!/bin/bash\n");
        s.Append("# The tiles of the plan in ").Append(plan.WorkDirectory).Append(", one array task each; written by 'photometallicity batch'.\n");
        s.Append(Inv($"# {plan.Tiles.Count} tiles at HEALPix order {plan.Order}; the largest reads {big.BroadbandRows} broadband and {big.NarrowbandRows} narrow-band rows.\n"));
        Describe(s, r);
        s.Append("#SBATCH --job-name=").Append(o.JobName).Append("-tiles\n");
        s.Append(Inv($"#SBATCH --array=0-{plan.Tiles.Count - 1}\n"));
        Resources(s, r, o);
        s.Append("#SBATCH --output=").Append(SbatchQuote(FilenamePattern(LogDirectory(plan)) + "/tile-%a.out")).Append('\n');
        s.Append("set -euo pipefail\n");
        s.Append("echo \"tile ${SLURM_ARRAY_TASK_ID} of array job ${SLURM_ARRAY_JOB_ID:-?} on $(hostname)\" >&2\n");
        s.Append("exec ").Append(Command(o)).Append(" tile ").Append(ShellQuote(plan.WorkDirectory)).Append(" --index \"${SLURM_ARRAY_TASK_ID}\"\n");
        return s.ToString();
    }

    /// <summary>merge.sbatch: one job that merges the tiles' results.</summary>
    public static string MergeText(TilePlan plan, SlurmOptions o)
    {
        Check(plan, o);
        var r = MergeResources(plan, o);
        var s = new StringBuilder();
        s.Append("#!/bin/bash\n");
        s.Append("# Merges the tile results of the plan in ").Append(plan.WorkDirectory).Append(" into the run's outputs; written by 'photometallicity batch'.\n");
        s.Append(Inv($"# The whole field: {plan.BroadbandRows} broadband and {plan.NarrowbandRows} narrow-band rows.\n"));
        Describe(s, r);
        s.Append("#SBATCH --job-name=").Append(o.JobName).Append("-merge\n");
        Resources(s, r, o);
        s.Append("#SBATCH --output=").Append(SbatchQuote(FilenamePattern(LogDirectory(plan)) + "/merge.out")).Append('\n');
        s.Append("set -euo pipefail\n");
        s.Append("echo \"merge job ${SLURM_JOB_ID:-?} on $(hostname)\" >&2\n");
        s.Append("exec ").Append(Command(o)).Append(" merge ").Append(ShellQuote(plan.WorkDirectory))
            .Append(" --out ").Append(ShellQuote(MergeOutput(plan, o))).Append('\n');
        return s.ToString();
    }

    /// <summary>submit.sh: submits the array, then the merge depending on it; --wait blocks until the merge ends and returns its exit code.</summary>
    public static string SubmitText(TilePlan plan)
    {
        string dir = ShellQuote(ScriptDirectory(plan)), work = ShellQuote(plan.WorkDirectory);
        int n = plan.Tiles.Count;
        var s = new StringBuilder();
        s.Append("#!/usr/bin/env bash\n");
        s.Append("# Submits the tile array of the plan in ").Append(plan.WorkDirectory).Append(", then the merge job, which starts\n");
        s.Append("# when every tile task has succeeded and is cancelled if one fails. Prints both job ids.\n");
        s.Append("# Written by 'photometallicity batch'.\n");
        s.Append("usage='usage: submit.sh [--wait]\n");
        s.Append("  --wait  block until the merge job has ended and exit with its exit code (for scripts and CI)'\n");
        s.Append("set -euo pipefail\n");
        s.Append("dir=").Append(dir).Append('\n');
        s.Append("wait_for_merge=0\n");
        s.Append("for arg in \"$@\"; do\n");
        s.Append("  case \"$arg\" in\n");
        s.Append("    --wait) wait_for_merge=1 ;;\n");
        s.Append("    -h|--help) echo \"$usage\"; exit 0 ;;\n");
        s.Append("    *) echo \"submit.sh: unknown argument '$arg'\" >&2; echo \"$usage\" >&2; exit 2 ;;\n");
        s.Append("  esac\n");
        s.Append("done\n");
        s.Append("command -v sbatch >/dev/null || { echo \"submit.sh: sbatch not found; run this where Slurm jobs are submitted\" >&2; exit 2; }\n");
        s.Append("mkdir -p \"$dir/logs\"\n");
        s.Append("cd ").Append(work).Append('\n');
        s.Append("tiles_job=$(sbatch --parsable \"$dir/").Append(TilesFileName).Append("\")\n");
        s.Append("tiles_job=${tiles_job%%;*}\n");
        s.Append(Inv($"echo \"tile array: job $tiles_job, {n} task{(n == 1 ? "" : "s")} (logs: $dir/logs/tile-N.out)\"\n"));
        s.Append("merge_args=(--parsable --dependency=\"afterok:$tiles_job\" --kill-on-invalid-dep=yes)\n");
        s.Append("if [ \"$wait_for_merge\" -eq 0 ]; then\n");
        s.Append("  merge_job=$(sbatch \"${merge_args[@]}\" \"$dir/").Append(MergeFileName).Append("\")\n");
        s.Append("  echo \"merge: job ${merge_job%%;*}, after every tile task succeeded (log: $dir/logs/merge.out)\"\n");
        s.Append("  exit 0\n");
        s.Append("fi\n");
        s.Append("echo \"merge: submitted after job $tiles_job; waiting until it has ended\"\n");
        s.Append("rc=0\n");
        s.Append("merge_job=$(sbatch \"${merge_args[@]}\" --wait \"$dir/").Append(MergeFileName).Append("\") || rc=$?\n");
        s.Append("merge_job=${merge_job%%;*}\n");
        // sbatch --wait exits 0 for a job cancelled before it ran (as when a tile fails and the dependency can
        // never be met): the job's final state decides. scontrol knows it for MinJobAge after the end (300 s
        // by default), sacct where accounting is on.
        s.Append("state=\"\"\n");
        s.Append("if [ -n \"$merge_job\" ]; then\n");
        s.Append("  state=$(scontrol show job \"$merge_job\" -o 2>/dev/null | sed -n 's/.*JobState=\\([A-Z_]*\\).*/\\1/p' || true)\n");
        s.Append("  [ -n \"$state\" ] || state=$(sacct -n -X -P -j \"$merge_job\" -o State 2>/dev/null | head -n 1 | cut -d' ' -f1 || true)\n");
        s.Append("fi\n");
        s.Append("if [ -z \"$state\" ]; then\n");
        s.Append("  echo \"submit.sh: cannot read the final state of job ${merge_job:-?}; going by sbatch's exit code\" >&2\n");
        s.Append("elif [ \"$state\" != COMPLETED ] && [ \"$rc\" -eq 0 ]; then\n");
        s.Append("  rc=1\n");
        s.Append("fi\n");
        s.Append("echo \"merge: job ${merge_job:-?} ended ${state:-(state unknown)}, exit code $rc (log: $dir/logs/merge.out)\"\n");
        s.Append("[ \"$rc\" -eq 0 ] || echo \"submit.sh: the merge did not succeed; if it never ran, a tile task failed: see $dir/logs/tile-N.out\" >&2\n");
        s.Append("exit \"$rc\"\n");
        return s.ToString();
    }

    private static void Describe(StringBuilder s, TaskResources r)
    {
        if (r.EstimatedPeakMiB > 0)
            s.Append(Inv($"# Estimated peak memory {r.EstimatedPeakMiB:0} MiB and run time {r.EstimatedSeconds:0} s on {r.Cpus} CPUs; asked for {r.MemoryMiB} MiB and {r.SlurmTime}.\n"));
    }

    private static void Resources(StringBuilder s, TaskResources r, SlurmOptions o)
    {
        s.Append(Inv($"#SBATCH --cpus-per-task={r.Cpus}\n"));
        s.Append(Inv($"#SBATCH --mem={r.MemoryMiB}M\n"));
        s.Append("#SBATCH --time=").Append(r.SlurmTime).Append('\n');
        if (o.Partition is not null) s.Append("#SBATCH --partition=").Append(o.Partition).Append('\n');
        if (o.Account is not null) s.Append("#SBATCH --account=").Append(o.Account).Append('\n');
    }

    private static string Command(SlurmOptions o) => string.Join(' ', o.Executable.Select(ShellQuote));

    /// <summary>A bash word that is exactly <paramref name="s"/>: single quotes, with each ' written as '\''.</summary>
    public static string ShellQuote(string s) => "'" + s.Replace("'", "'\\''", StringComparison.Ordinal) + "'";

    /// <summary>An #SBATCH argument in double quotes (sbatch's own quoting; the caller refuses '"' and '\').</summary>
    public static string SbatchQuote(string s) => "\"" + s + "\"";

    /// <summary>A literal path in an sbatch filename pattern: '%' is written '%%'.</summary>
    public static string FilenamePattern(string path) => path.Replace("%", "%%", StringComparison.Ordinal);

    private static string Inv(FormattableString f) => f.ToString(CultureInfo.InvariantCulture);

    private static void WriteExecutable(string path, string text)
    {
        AtomicFile.WriteAllText(path, text);
        if (!OperatingSystem.IsWindows())
            File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute | UnixFileMode.GroupRead
                | UnixFileMode.GroupExecute | UnixFileMode.OtherRead | UnixFileMode.OtherExecute);
    }
}
