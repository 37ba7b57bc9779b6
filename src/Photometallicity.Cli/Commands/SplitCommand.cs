using System.CommandLine;
using Photometallicity.Configuration;
using Photometallicity.Errors;
using Photometallicity.Pipeline;
using Photometallicity.Tiling;
using Photometallicity.Units;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'split' verb: fits the whole-field solutions once and cuts the field into HEALPix tiles with margins.</summary>
internal static class SplitCommand
{
    public static Command Create(CliContext ctx)
    {
        var config = new Argument<string>("CONFIG") { Description = "The run's JSON config (as for 'run')." };
        var order = new Option<int>("--order") { Description = "HEALPix order of the tiles (Nside = 2^order; order 6 gives tiles of about 0.92 deg, 8 about 0.23 deg).", Required = true };
        var margin = new Option<double?>("--margin") { Description = "Margin kept around every tile, arcsec (default and minimum: the larger of 1.2 x (match radius + offset correction) and the reach of the field's chains of competing match candidates, plus 0.1)." };
        var outDir = new Option<string>("--out") { Description = "Work directory for the plan, the whole-field solutions and the tiles.", Required = true };
        var cmd = new Command("split", "Prepare a tiled run: solve the cross-match and fit the calibration once for the whole field, then write every non-empty HEALPix tile's rows (with a margin) and plan.json into the work directory. Then run 'tile' for each tile (or 'batch' for a Slurm script) and 'merge'.")
        {
            config, order, margin, outDir,
        };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            int k = pr.GetValue(order);
            if (k < 0 || k > 29) throw new InputException($"--order {k} is outside the allowed range [0, 29]");
            double? m = pr.GetValue(margin);
            if (m is { } mm && !(mm > 0)) throw new InputException($"--margin {mm} must be a positive number of arcsec");
            var cfg = ConfigLoader.Load(pr.GetValue(config)!);
            var log = ctx.Logger("split");
            var plan = SurveySplitter.Split(cfg, new SplitOptions(k, m is { } a ? Angle.FromArcseconds(a) : null), pr.GetValue(outDir)!, log, new ProgressReporter(ctx.Error));
            ctx.Error.WriteLine($"wrote {plan.Tiles.Count} tiles to {plan.WorkDirectory}; largest tile {plan.Tiles.Select(t => t.BroadbandRows).DefaultIfEmpty(0).Max()} broadband rows.");
            ctx.Error.WriteLine($"next: photometallicity tile {plan.WorkDirectory} --index N (N = 0 .. {plan.Tiles.Count - 1}), or 'batch' for a Slurm script; then 'merge'.");
            return 0;
        }));
        return cmd;
    }
}
