using Photometallicity.Configuration;
using Photometallicity.Pipeline;

namespace Photometallicity.Cli.Commands;

/// <summary>Runs the whole pipeline for a config and writes its outputs; shared by 'run' and 'demo'.</summary>
internal static class PipelineExecution
{
    public static PipelineResult RunAndWrite(CliContext ctx, string configPath, string? outDir)
    {
        var config = ConfigLoader.Load(configPath, outDir);
        var log = ctx.Logger("run");
        var result = PipelineRunner.Run(config, log, new ProgressReporter(ctx.Error));
        var files = RunOutputWriter.Write(result, config.Output.Directory);
        if (config.Output.Plots) files = [.. files, .. RunReport.Write(config.Output.Directory, log)];
        ctx.Error.WriteLine($"wrote {files.Count} files to {config.Output.Directory}:");
        foreach (var f in files) ctx.Error.WriteLine("  " + Path.GetRelativePath(config.Output.Directory, f));
        return result;
    }
}
