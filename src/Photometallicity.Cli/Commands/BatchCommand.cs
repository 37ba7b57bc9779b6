using System.CommandLine;
using System.Reflection;
using Photometallicity.Errors;
using Photometallicity.Tiling;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'batch' verb: writes the Slurm scripts that run a split work directory's tiles as a job array and then merge them.</summary>
internal static class BatchCommand
{
    public static Command Create(CliContext ctx)
    {
        var work = new Argument<string>("WORKDIR") { Description = "Work directory written by 'split' (holds plan.json), at the same path on the nodes; the scripts go to WORKDIR/slurm, the job logs to WORKDIR/slurm/logs." };
        var partition = new Option<string?>("--partition") { HelpName = "PARTITION", Description = "Slurm partition to submit to (default: the cluster's default partition)." };
        var account = new Option<string?>("--account") { HelpName = "ACCOUNT", Description = "Slurm account to charge (default: your default account)." };
        var cpus = new Option<int>("--cpus-per-task") { HelpName = "N", Description = "CPUs per task, tile tasks and merge job alike.", DefaultValueFactory = _ => TaskResources.BenchmarkCpus };
        var mem = new Option<long?>("--mem-per-task") { HelpName = "MIB", Description = "Memory per tile task in MiB (default: estimated from the largest tile's rows, with a 1.5x margin, at least 512 MiB)." };
        var time = new Option<int?>("--time-per-task") { HelpName = "MINUTES", Description = "Wall-time limit per tile task in minutes (default: estimated from the largest tile's rows, with a 3x margin, at least 10 minutes)." };
        var memMerge = new Option<long?>("--mem-merge") { HelpName = "MIB", Description = "Memory of the merge job in MiB (default: estimated from the whole field's rows, as for the tiles)." };
        var timeMerge = new Option<int?>("--time-merge") { HelpName = "MINUTES", Description = "Wall-time limit of the merge job in minutes (default: estimated from the whole field's rows, as for the tiles)." };
        var exe = new Option<string?>("--exe") { HelpName = "PATH", Description = "The photometallicity executable the nodes run; must be reachable at the same path on them (default: this program, as it is running now)." };
        var outDir = new Option<string?>("--out") { HelpName = "DIR", Description = "Directory the merge job writes the run's outputs to (default: the plan's output directory, that of the config)." };
        var jobName = new Option<string>("--job-name") { HelpName = "NAME", Description = "Job name prefix: the jobs are NAME-tiles and NAME-merge.", DefaultValueFactory = _ => "photometallicity" };
        var cmd = new Command("batch", "Write Slurm scripts for a split work directory: a job array with one task per tile, a merge job that runs after every tile succeeded, and submit.sh that submits both.")
        {
            work, partition, account, cpus, mem, time, memMerge, timeMerge, exe, outDir, jobName,
        };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            var plan = TilePlanJson.Read(pr.GetValue(work)!);
            string? merged = pr.GetValue(outDir);
            string? exePath = pr.GetValue(exe);
            IReadOnlyList<string> program;
            if (exePath is not null)
            {
                string full = Path.GetFullPath(exePath);
                if (!File.Exists(full)) throw new InputException($"--exe: no file '{full}'");
                if (!OperatingSystem.IsWindows() && (File.GetUnixFileMode(full) & (UnixFileMode.UserExecute | UnixFileMode.GroupExecute | UnixFileMode.OtherExecute)) == 0)
                    throw new InputException($"--exe: '{full}' is not executable");
                program = [full];
            }
            else program = RunningProgram();
            var options = new SlurmOptions
            {
                Executable = program,
                MergeOutputDirectory = merged is null ? null : Path.GetFullPath(merged),
                Partition = pr.GetValue(partition),
                Account = pr.GetValue(account),
                CpusPerTask = pr.GetValue(cpus),
                TileMemoryMiB = pr.GetValue(mem),
                TileWallMinutes = pr.GetValue(time),
                MergeMemoryMiB = pr.GetValue(memMerge),
                MergeWallMinutes = pr.GetValue(timeMerge),
                JobName = pr.GetValue(jobName)!,
            };
            var w = SlurmScript.Write(plan, options);
            var err = ctx.Error;
            err.WriteLine($"plan {Path.Combine(plan.WorkDirectory, TilePlan.FileName)}: {plan.Tiles.Count} tiles at HEALPix order {plan.Order}, {plan.BroadbandRows} broadband and {plan.NarrowbandRows} narrow-band rows");
            err.WriteLine($"wrote {w.TilesScript}: array 0-{plan.Tiles.Count - 1}, per task {Describe(w.Tile, options.TileMemoryMiB, options.TileWallMinutes, "the largest tile")}");
            err.WriteLine($"wrote {w.MergeScript}: merge into {w.MergeOutputDirectory}, {Describe(w.Merge, options.MergeMemoryMiB, options.MergeWallMinutes, "the whole field")}");
            err.WriteLine($"wrote {w.SubmitScript}: submits both (the merge with afterok on the array); --wait blocks until the merge ends");
            err.WriteLine($"the program on the nodes: {string.Join(' ', program)}");
            err.WriteLine($"submit with: {SlurmScript.ShellQuote(w.SubmitScript)}");
            return 0;
        }));
        return cmd;
    }

    private static string Describe(TaskResources r, long? memGiven, int? timeGiven, string what)
    {
        string mem = memGiven is null ? $"{r.MemoryMiB} MiB (estimated peak {r.EstimatedPeakMiB:0} MiB for {what})" : $"{r.MemoryMiB} MiB (as given)";
        string time = timeGiven is null ? $"{r.SlurmTime} (estimated {r.EstimatedSeconds:0} s)" : $"{r.SlurmTime} (as given)";
        return FormattableString.Invariant($"{r.Cpus} CPU{(r.Cpus == 1 ? "" : "s")}, {mem}, wall time {time}");
    }

    /// <summary>
    /// This program as the nodes should start it: the apphost's path, or, when it runs as 'dotnet photometallicity.dll',
    /// the dotnet host and the assembly.
    /// </summary>
    private static IReadOnlyList<string> RunningProgram()
    {
        string path = Environment.ProcessPath ?? throw new InputException("--exe: cannot tell where this program is; give --exe PATH");
        if (!string.Equals(Path.GetFileNameWithoutExtension(path), "dotnet", StringComparison.OrdinalIgnoreCase)) return [path];
        string? assembly = Assembly.GetEntryAssembly()?.Location;
        if (string.IsNullOrEmpty(assembly)) throw new InputException("--exe: cannot tell where this program's assembly is; give --exe PATH");
        return [path, assembly];
    }
}
