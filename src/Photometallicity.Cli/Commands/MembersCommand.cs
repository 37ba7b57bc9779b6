using System.CommandLine;
using Photometallicity.Pipeline;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'members' verb: per-star [Fe/H] and membership with a calibration made earlier.</summary>
internal static class MembersCommand
{
    public static Command Create(CliContext ctx)
    {
        var config = new Argument<string>("CONFIG") { Description = "The field's JSON config (target, membership settings)." };
        var calibration = new Option<string>("--calibration") { Description = "calibration.json written by 'calibrate' or 'run' for the same filter set.", Required = true };
        var outDir = new Option<string?>("--out") { Description = "Output directory (default: the config's output.directory)." };
        var cmd = new Command("members", "Membership probabilities, the target's structure and the members' metallicity distribution, with an existing calibration (the [Fe/H] likelihoods are recomputed from it). Writes everything 'run' writes.") { config, calibration, outDir };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            PipelineExecution.RunAndWrite(ctx, pr.GetValue(config)!, pr.GetValue(outDir), new RunScope(PipelineStage.Membership, Path.GetFullPath(pr.GetValue(calibration)!)));
            return 0;
        }));
        return cmd;
    }
}
