using Photometallicity.Configuration;
using Photometallicity.Pipeline;

namespace Photometallicity.Cli.Commands;

/// <summary>Runs the whole pipeline for a config and writes its outputs; shared by 'run' and 'demo'.</summary>
internal static class PipelineExecution
{
    public static PipelineResult RunAndWrite(CliContext ctx, string configPath, string? outDir, RunScope? scope = null)
    {
        var config = ConfigLoader.Load(configPath, outDir);
        if (scope?.CalibrationPath is { } cp && !File.Exists(cp)) throw new Errors.InputException("calibration file not found", cp);
        var log = ctx.Logger("run");
        var result = PipelineRunner.Run(config, log, new ProgressReporter(ctx.Error), scope);
        var files = RunOutputWriter.Write(result, config.Output.Directory);
        if (config.Output.Plots && result.Membership is not null) files = [.. files, .. RunReport.Write(config.Output.Directory, log)];
        ctx.Error.WriteLine($"wrote {files.Count} files to {config.Output.Directory}:");
        foreach (var f in files) ctx.Error.WriteLine("  " + Path.GetRelativePath(config.Output.Directory, f));
        return result;
    }
}
