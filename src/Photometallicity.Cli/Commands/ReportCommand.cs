using System.CommandLine;
using Photometallicity.Pipeline;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'report' verb: rebuilds the figures and the summary page of an existing output directory.</summary>
internal static class ReportCommand
{
    public static Command Create(CliContext ctx)
    {
        var dir = new Argument<string>("DIR") { Description = "Output directory of an earlier run (holding stars.csv, summary.json, calibration.json, calibration_residuals.csv)." };
        var cmd = new Command("report", "Rebuild the figures (plots/*.png, *.svg) and the summary page (summary.html, summary.md) from an existing output directory.") { dir };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            string d = Path.GetFullPath(pr.GetValue(dir)!);
            if (!Directory.Exists(d)) throw new Errors.InputException("directory not found", d);
            var files = RunReport.Write(d, ctx.Logger("report"));
            ctx.Error.WriteLine($"wrote {files.Count} files under {d}");
            return 0;
        }));
        return cmd;
    }
}
