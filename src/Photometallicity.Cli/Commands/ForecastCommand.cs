using System.CommandLine;
using Photometallicity.Calibration;
using Photometallicity.Catalogues;
using Photometallicity.Configuration;
using Photometallicity.Errors;
using Photometallicity.Forecast;
using Photometallicity.Photometry;
using Photometallicity.Pipeline;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'forecast' verb: expected [Fe/H] precision from a calibration and a photometric error model.</summary>
internal static class ForecastCommand
{
    public static Command Create(CliContext ctx)
    {
        var calibration = new Option<string>("--calibration") { Description = "calibration.json to forecast with.", Required = true };
        var config = new Option<string?>("--config") { Description = "A field's config: the error model of each band is fitted from its catalogues (and its forecast and target settings are used)." };
        var depths = new Option<double[]?>("--depths") { Description = "5-sigma depths (mag) of the blue, red and narrow bands, instead of --config.", AllowMultipleArgumentsPerToken = true };
        var floor = new Option<double>("--floor") { Description = "Error floor (mag) added in quadrature with --depths.", DefaultValueFactory = _ => 0.01 };
        var dm = new Option<double?>("--distance-modulus") { Description = "Target distance modulus (mag) for the faintest giant that reaches the precision (default: the config's target)." };
        var precision = new Option<double?>("--precision") { Description = "Wanted [Fe/H] precision (dex; default 0.2 or the config's forecast.precision_dex)." };
        var colours = new Option<double[]?>("--colours") { Description = "Giant colours C0 (mag) to forecast for (default 0.8 1.0 1.2).", AllowMultipleArgumentsPerToken = true };
        var feh = new Option<double?>("--feh") { Description = "[Fe/H] of the model giants (dex; default -1.5)." };
        var at = new Option<double?>("--at-mag") { Description = "Dereddened blue magnitude (mag) at which the needed depths are computed (default: distance modulus + 1)." };
        var outDir = new Option<string>("--out") { Description = "Output directory for forecast.csv, forecast_limits.csv, forecast_depths.csv and plots/forecast.*", DefaultValueFactory = _ => "forecast-out" };
        var cmd = new Command("forecast", "Forecast the [Fe/H] precision a given depth buys: sigma[Fe/H] against magnitude and colour, the faintest giant reaching a precision at a distance, and the depth each band needs.")
            { calibration, config, depths, floor, dm, precision, colours, feh, at, outDir };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            string calPath = Path.GetFullPath(pr.GetValue(calibration)!);
            if (!File.Exists(calPath)) throw new InputException("calibration file not found", calPath);
            var model = CalibrationJson.Read(calPath);
            string? configPath = pr.GetValue(config);
            double[]? d = pr.GetValue(depths) is { Length: > 0 } given ? given : null;
            if ((configPath is null) == (d is null)) throw new InputException("give either --config (fit the error models from a field's catalogues) or --depths BLUE RED NARROW");
            BandErrorModels errors;
            PipelineConfig? cfg = null;
            if (d is not null)
            {
                if (d.Length != 3) throw new InputException($"--depths needs three values (blue, red, narrow 5-sigma depths in mag), got {d.Length}");
                errors = BandErrorModels.FromDepths(d[0], d[1], d[2], pr.GetValue(floor));
            }
            else
            {
                cfg = ConfigLoader.Load(configPath!);
                var inputs = InputCatalogues.Load(cfg);
                PhotometricErrorModel Fit(BandConfig b) => PhotometryStep.FitErrorModel(b, inputs, ctx.Logger("forecast"));
                errors = new BandErrorModels(Fit(cfg.Blue), Fit(cfg.Red), Fit(cfg.Narrow));
            }
            double distance = pr.GetValue(dm) ?? cfg?.Target.DistanceModulus ?? throw new InputException("--distance-modulus is needed without --config");
            var request = new ForecastRequest(pr.GetValue(colours) is { Length: > 0 } cs ? cs : cfg?.Forecast.Colours.ToArray() ?? [0.8, 1.0, 1.2], pr.GetValue(feh) ?? cfg?.Forecast.FehDex ?? -1.5,
                pr.GetValue(precision) ?? cfg?.Forecast.PrecisionDex ?? 0.2, distance, pr.GetValue(at));
            var products = ForecastStep.Run(model, errors, request);
            string dir = Path.GetFullPath(pr.GetValue(outDir)!);
            var files = ForecastStep.Write(products, dir, request.PrecisionDex);
            foreach (var l in products.Limits)
                ctx.Error.WriteLine($"C0 = {l.Colour:F2}, [Fe/H] = {l.Feh:F1}: {l.PrecisionDex:F2} dex reached down to blue0 = {l.BlueApparent:F2} mag (M = {l.BlueAbsolute:F2}) at distance modulus {distance:F2}: {l.Status}");
            ctx.Error.WriteLine($"wrote {files.Count} files to {dir}");
            return 0;
        }));
        return cmd;
    }
}
