using System.CommandLine;
using Photometallicity.Calibration;
using Photometallicity.Catalogues;
using Photometallicity.Configuration;
using Photometallicity.Errors;
using Photometallicity.Pipeline;

namespace Photometallicity.Cli.Commands;

/// <summary>
/// The 'calibrate' verb: the pipeline up to the calibration; writes calibration.json and the residuals table.
/// With --transfer and --common: a calibration for the config's filter set made from an old calibration in another
/// filter set and stars measured in both (no standards are refitted); writes calibration.json and transfer.json.
/// </summary>
internal static class CalibrateCommand
{
    public static Command Create(CliContext ctx)
    {
        var config = new Argument<string>("CONFIG") { Description = "The run's JSON config; its catalogues, bands and standards are used. With --transfer only its bands (filters, extinction, index coefficient k), calibration.bootstrap, calibration.seed and output are used: the bands define the NEW filter set." };
        var outDir = new Option<string?>("--out") { Description = "Output directory (default: the config's output.directory)." };
        var transfer = new Option<string?>("--transfer") { HelpName = "OLD_CALIBRATION.json", Description = "OLD_CALIBRATION.json: a calibration.json made in another filter set, to be moved to the config's filter set. Needs --common." };
        var common = new Option<string?>("--common")
        {
            HelpName = "FILE",
            Description = "With --transfer: a table (.csv, .fits or .parquet) of stars measured in both filter sets, one row per star, with the dereddened colour and index "
                + "and their 1-sigma errors, all in mag: " + string.Join(", ", TransferCommonStars.Columns)
                + $" (old = the old calibration's filter set, new = the config's); optional {TransferCommonStars.CovarianceColumn} (mag^2, covariance of the new index and colour). "
                + "Rows with a missing value are skipped; at least 5 usable stars spanning some colour are needed.",
        };
        var cmd = new Command("calibrate", "Cross-match, prepare the photometry and fit the calibration of the index against the standards, with bootstrap errors. Writes calibration.json, calibration_residuals.csv and summary.json. "
            + "With --transfer OLD.json --common FILE: fit the transformation C_old = a0 + a1 C_new, X_old = b0 + b1 X_new + b2 C_new to the common stars and write the old calibration moved to the config's filter set "
            + "(calibration.json, with the transformation's bootstrap uncertainty in its ensemble) and the transformation (transfer.json).") { config, outDir, transfer, common };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            string? t = pr.GetValue(transfer), c = pr.GetValue(common);
            if (t is null && c is null)
            {
                PipelineExecution.RunAndWrite(ctx, pr.GetValue(config)!, pr.GetValue(outDir), new RunScope(PipelineStage.Calibration));
                return 0;
            }
            if (t is null) throw new InputException("--common is given without --transfer OLD_CALIBRATION.json; give both, or neither to fit the standards");
            if (c is null) throw new InputException("--transfer needs --common FILE, the table of stars measured in both filter sets (see calibrate --help for its columns)");
            Transfer(ctx, pr.GetValue(config)!, pr.GetValue(outDir), t, c);
            return 0;
        }));
        return cmd;
    }

    private static void Transfer(CliContext ctx, string configPath, string? outDir, string oldPath, string commonPath)
    {
        var config = ConfigLoader.Load(configPath, outDir);
        if (!File.Exists(oldPath)) throw new InputException("calibration file not found", oldPath);
        if (!File.Exists(commonPath)) throw new InputException("table of common stars not found", commonPath);
        var log = ctx.Logger("calibrate");
        var old = CalibrationJson.Read(oldPath);
        var table = CatalogueIO.Read(commonPath, new ReadOptions { NumericColumns = TransferCommonStars.NumericColumns });
        var stars = TransferCommonStars.FromTable(table, commonPath);
        var (_, filters) = PhotometryStep.Filters(config, log);
        var result = CalibrationTransferStep.Run(old, stars, new CalibrationTransferOptions
        {
            NewFilters = filters,
            Bootstrap = config.Calibration.Bootstrap,
            Seed = config.Calibration.Seed,
        }, log);

        string dir = config.Output.Directory;
        Directory.CreateDirectory(dir);
        string cal = Path.Combine(dir, "calibration.json");
        string tj = Path.Combine(dir, "transfer.json");
        var json = result.ToJson(Path.GetFullPath(oldPath), CalibrationTransferStep.FitSeed(config.Calibration.Seed), CalibrationTransferStep.ApplySeed(config.Calibration.Seed));
        CalibrationJson.Write(result.Model, null, cal);
        AtomicFile.WriteAllText(tj, json.ToJsonString(RunOutputWriter.JsonOptions) + "\n");
        ctx.Error.WriteLine($"wrote 2 files to {dir}:");
        ctx.Error.WriteLine("  calibration.json");
        ctx.Error.WriteLine("  transfer.json");
    }
}
