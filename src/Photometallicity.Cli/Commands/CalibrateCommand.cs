using System.CommandLine;
using Photometallicity.Pipeline;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'calibrate' verb: the pipeline up to the calibration; writes calibration.json and the residuals table.</summary>
internal static class CalibrateCommand
{
    public static Command Create(CliContext ctx)
    {
        var config = new Argument<string>("CONFIG") { Description = "The run's JSON config; its catalogues, bands and standards are used." };
        var outDir = new Option<string?>("--out") { Description = "Output directory (default: the config's output.directory)." };
        var cmd = new Command("calibrate", "Cross-match, prepare the photometry and fit the calibration of the index against the standards, with bootstrap errors. Writes calibration.json, calibration_residuals.csv and summary.json.") { config, outDir };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            PipelineExecution.RunAndWrite(ctx, pr.GetValue(config)!, pr.GetValue(outDir), new RunScope(PipelineStage.Calibration));
            return 0;
        }));
        return cmd;
    }
}
