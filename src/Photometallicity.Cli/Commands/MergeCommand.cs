using System.CommandLine;
using Photometallicity.Pipeline;
using Photometallicity.Tiling;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'merge' verb: the outputs of a tiled run, the same files 'run' writes.</summary>
internal static class MergeCommand
{
    public static Command Create(CliContext ctx)
    {
        var work = new Argument<string>("WORKDIR") { Description = "Work directory written by 'split', with every tile run." };
        var outDir = new Option<string?>("--out") { Description = "Output directory (default: the config's output.directory)." };
        var cmd = new Command("merge", "Merge the tiles of a split survey: every star once, from the tile that owns it, in the input order; then membership, the metallicity distribution, the forecast and the figures for the whole field. Writes what 'run' writes, byte for byte the same stars tables.") { work, outDir };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            var plan = TilePlanJson.Read(pr.GetValue(work)!);
            TilePlanChecks.RequireUnchanged(plan, configOnly: false);
            var perStar = TileMerger.Gather(plan, ctx.Logger("merge"));
            PipelineExecution.RunAndWrite(ctx, plan.ConfigPath, pr.GetValue(outDir) ?? plan.OutputDirectory, new RunScope { Precomputed = perStar });
            return 0;
        }));
        return cmd;
    }
}
