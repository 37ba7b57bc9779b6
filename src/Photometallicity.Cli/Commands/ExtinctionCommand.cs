using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using Photometallicity.Photometry.Extinction;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'extinction' verb: a band's extinction coefficient A/E(B-V) from its transmission curve.</summary>
internal static class ExtinctionCommand
{
    public static Command Create(CliContext ctx)
    {
        var curve = new Option<string>("--curve")
        {
            Description = "Filter transmission curve: text file of 'wavelength_angstrom,transmission' rows ('#' comments allowed; see calibration/README.md).",
            Required = true,
        };
        var law = new Option<string>("--law")
        {
            Description = $"Extinction law: {ExtinctionLaws.KnownNames} (default {ExtinctionLaws.DefaultName}).",
            DefaultValueFactory = _ => ExtinctionLaws.DefaultName,
        };
        var rv = new Option<double>("--rv")
        {
            Description = $"R_V = A_V / E(B-V), dimensionless (default 3.1; allowed {ExtinctionLaws.MinRv}-{ExtinctionLaws.MaxRv}).",
            DefaultValueFactory = _ => 3.1,
        };
        var teff = new Option<double?>("--teff")
        {
            Description = "Source spectrum: a black body of this temperature in K (default: flat in F_lambda).",
        };
        var json = new Option<bool>("--json")
        {
            Description = "Print a JSON object {a_over_ebv, a_over_av, lambda_eff_angstrom} on stdout instead of text.",
        };
        var cmd = new Command("extinction",
            "Extinction coefficient A_band/E(B-V) of a filter from its transmission curve, photon-weighted in the low-extinction " +
            "limit, and its photon-weighted effective wavelength (Angstrom).") { curve, law, rv, teff, json };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            string path = pr.GetValue(curve)!;
            var extinctionLaw = ExtinctionLaws.FromName(pr.GetValue(law)!, "--law");
            double rvValue = pr.GetValue(rv);
            double? teffK = pr.GetValue(teff);
            var filter = FilterCurve.Load(path);
            var r = BandExtinction.Compute(filter, extinctionLaw, rvValue, teffK, path);
            if (pr.GetValue(json))
            {
                var payload = new Dictionary<string, double>
                {
                    ["a_over_ebv"] = r.AOverEbv,
                    ["a_over_av"] = r.AOverAv,
                    ["lambda_eff_angstrom"] = r.LambdaEffAngstrom,
                };
                ctx.Out.WriteLine(JsonSerializer.Serialize(payload));
            }
            else
            {
                var inv = CultureInfo.InvariantCulture;
                ctx.Out.WriteLine(string.Format(inv, "a_over_ebv {0:F4}", r.AOverEbv));
                ctx.Out.WriteLine(string.Format(inv, "a_over_av {0:F4}", r.AOverAv));
                ctx.Out.WriteLine(string.Format(inv, "lambda_eff_angstrom {0:F1}", r.LambdaEffAngstrom));
            }
            ctx.Error.WriteLine(string.Format(CultureInfo.InvariantCulture, "{0}: law {1}, R_V = {2}, source {3}, {4} points {5:0.#}-{6:0.#} Angstrom",
                filter.Name, extinctionLaw.Name, rvValue, teffK is double t ? $"black body {t} K" : "flat F_lambda",
                filter.Count, filter.WavelengthAngstrom[0], filter.WavelengthAngstrom[filter.Count - 1]));
            return 0;
        }));
        return cmd;
    }
}
