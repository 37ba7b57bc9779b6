using System.CommandLine;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'run' verb: the whole pipeline from a config file.</summary>
internal static class RunCommand
{
    public static Command Create(CliContext ctx)
    {
        var config = new Argument<string>("CONFIG") { Description = "The run's JSON config (comments and trailing commas allowed; see README 'Config reference')." };
        var outDir = new Option<string?>("--out") { Description = "Output directory (default: the config's output.directory, relative to the config file)." };
        var cmd = new Command("run", "Run the whole pipeline: cross-match, photometry, calibration, per-star [Fe/H], membership, figures and summary.") { config, outDir };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            PipelineExecution.RunAndWrite(ctx, pr.GetValue(config)!, pr.GetValue(outDir));
            return 0;
        }));
        return cmd;
    }
}
