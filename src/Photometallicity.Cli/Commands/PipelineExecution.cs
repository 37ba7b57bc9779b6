using System.Diagnostics;
using System.Runtime;
using System.Runtime.CompilerServices;
using Microsoft.Extensions.Logging;
using Photometallicity.Configuration;
using Photometallicity.Pipeline;

namespace Photometallicity.Cli.Commands;

/// <summary>Runs the whole pipeline for a config and writes its outputs; shared by 'run', 'demo', the single stages and 'merge'.</summary>
internal static class PipelineExecution
{
    /// <summary>Runs, writes the tables and then the figures; returns the output directory.</summary>
    public static string RunAndWrite(CliContext ctx, string configPath, string? outDir, RunScope? scope = null)
    {
        var config = ConfigLoader.Load(configPath, outDir);
        if (scope?.CalibrationPath is { } cp && !File.Exists(cp)) throw new Errors.InputException("calibration file not found", cp);
        var log = ctx.Logger("run");
        var (files, members) = RunAndWriteTables(ctx, config, scope, log);
        // The figures re-read the written stars table; the run's in-memory products are let go first, so that the
        // two never add up (at 10^7 stars each is a few GB).
        GC.Collect(2, GCCollectionMode.Aggressive, blocking: true, compacting: true);
        if (config.Output.Plots && members)
        {
            var clock = Stopwatch.StartNew();
            files = [.. files, .. RunReport.Write(config.Output.Directory, log)];
            log.LogInformation("figures and summary page took {Seconds:F2} s, peak memory so far {MiB:F0} MiB", clock.Elapsed.TotalSeconds, PeakMemory.SoFarMiB());
        }
        ctx.Error.WriteLine($"wrote {files.Count} files to {config.Output.Directory}:");
        foreach (var f in files) ctx.Error.WriteLine("  " + Path.GetRelativePath(config.Output.Directory, f));
        return config.Output.Directory;
    }

    [MethodImpl(MethodImplOptions.NoInlining)]
    private static (IReadOnlyList<string> Files, bool Members) RunAndWriteTables(CliContext ctx, PipelineConfig config, RunScope? scope, ILogger log)
    {
        var result = PipelineRunner.Run(config, log, new ProgressReporter(ctx.Error), scope);
        var clock = Stopwatch.StartNew();
        var files = RunOutputWriter.Write(result, config.Output.Directory);
        log.LogInformation("writing the tables took {Seconds:F2} s, peak memory so far {MiB:F0} MiB", clock.Elapsed.TotalSeconds, PeakMemory.SoFarMiB());
        return (files, result.Membership is not null);
    }
}
