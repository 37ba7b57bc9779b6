using System.CommandLine;
using Photometallicity.Pipeline;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'assign' verb: per-star [Fe/H] with a calibration made earlier.</summary>
internal static class AssignCommand
{
    public static Command Create(CliContext ctx)
    {
        var config = new Argument<string>("CONFIG") { Description = "The field's JSON config (its standards are not refitted)." };
        var calibration = new Option<string>("--calibration") { Description = "calibration.json written by 'calibrate' or 'run' for the same filter set.", Required = true };
        var outDir = new Option<string?>("--out") { Description = "Output directory (default: the config's output.directory)." };
        var cmd = new Command("assign", "Give every star an [Fe/H] posterior (median, 16th and 84th percentile) with an existing calibration. Writes stars.csv (p_member empty) and summary.json.") { config, calibration, outDir };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            PipelineExecution.RunAndWrite(ctx, pr.GetValue(config)!, pr.GetValue(outDir), new RunScope(PipelineStage.Metallicity, Path.GetFullPath(pr.GetValue(calibration)!)));
            return 0;
        }));
        return cmd;
    }
}
