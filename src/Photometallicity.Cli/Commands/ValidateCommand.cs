using System.CommandLine;
using System.Diagnostics;
using Microsoft.Extensions.Logging.Abstractions;
using Photometallicity.Catalogues;
using Photometallicity.Configuration;
using Photometallicity.Pipeline;
using Photometallicity.Validation;

namespace Photometallicity.Cli.Commands;

/// <summary>
/// The 'validate' verb: generates the fixed grid of invented validation fields with known truth, runs the whole
/// pipeline on each (the code 'run' uses), scores each against its truth and writes the score tables.
/// </summary>
internal static class ValidateCommand
{
    public static Command Create(CliContext ctx)
    {
        var outDir = new Option<string>("--out") { Description = "Directory for the fields (DIR/fields/NAME: inputs, truth, results in out/) and the tables validation.csv and validation_fields.csv.", DefaultValueFactory = _ => "validation-out" };
        var quick = new Option<bool>("--quick") { Description = "The quick grid: three small fields (for CI) instead of the full grid." };
        var seed = new Option<ulong>("--seed") { Description = "Master seed; each field's seed derives from it and the field's name.", DefaultValueFactory = _ => 1UL };
        var fields = new Option<string?>("--fields") { Description = "Comma-separated field names to run (from either grid; see README 'Validation'); default: the whole grid." };
        var check = new Option<bool>("--check") { Description = "Exit 1 when any acceptance criterion (README 'Validation') is not met; without it the verb only reports." };
        var cmd = new Command("validate", "Generate invented fields with known truth, run the whole pipeline on each and score the [Fe/H] values, uncertainties, metallicity distribution and standards against the truth.") { outDir, quick, seed, fields, check };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            var grid = Select(pr.GetValue(quick), pr.GetValue(fields));
            string dir = Path.GetFullPath(pr.GetValue(outDir)!);
            ulong s = pr.GetValue(seed);
            var scores = new List<FieldScore>();
            var all = Stopwatch.StartNew();
            for (int k = 0; k < grid.Count; k++)
            {
                var f = grid[k];
                ctx.Error.WriteLine($"[{k + 1}/{grid.Count}] {f.Name}: generating {f.Stars} invented stars ({IndexLaws.Name(f.Law)} law, {f.StandardsName} standards, {100 * f.BadShare:F0}% bad, {f.DepthName} narrow band)");
                var clock = Stopwatch.StartNew();
                scores.Add(RunField(f, Path.Combine(dir, "fields", f.Name), s));
                var sc = scores[^1];
                ctx.Error.WriteLine(sc.Error is null
                    ? $"[{k + 1}/{grid.Count}] {f.Name}: run and scored in {clock.Elapsed.TotalSeconds:F1} s"
                    : $"[{k + 1}/{grid.Count}] {f.Name}: FAILED after {clock.Elapsed.TotalSeconds:F1} s: {sc.Error}");
            }
            CatalogueIO.Write(ValidationReport.BinTable(scores), Path.Combine(dir, "validation.csv"));
            CatalogueIO.Write(ValidationReport.FieldTable(scores), Path.Combine(dir, "validation_fields.csv"));
            ctx.Out.Write(ValidationReport.Text(scores));
            int failed = scores.Sum(x => ValidationReport.Failures(x).Count);
            ctx.Error.WriteLine($"validation: {scores.Count} fields in {all.Elapsed.TotalSeconds:F0} s; {failed} acceptance criteria not met; tables in {dir}");
            if (scores.Any(x => x.Error is not null)) return 1;
            return pr.GetValue(check) && failed > 0 ? 1 : 0;
        }));
        return cmd;
    }

    private static IReadOnlyList<ValidationField> Select(bool quick, string? names)
    {
        if (string.IsNullOrWhiteSpace(names)) return quick ? ValidationGrid.Quick : ValidationGrid.Full;
        var list = new List<ValidationField>();
        foreach (var n in names.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries))
            list.Add(ValidationGrid.ByName(n) ?? throw new Errors.InputException(
                $"--fields: no field '{n}'; the fields are {string.Join(", ", ValidationGrid.Full.Concat(ValidationGrid.Quick).Select(f => f.Name))}"));
        return list;
    }

    /// <summary>Writes, runs and scores one field; a failure is recorded in the score, not thrown.</summary>
    internal static FieldScore RunField(ValidationField f, string dir, ulong seed)
    {
        try
        {
            if (Directory.Exists(dir)) Directory.Delete(dir, recursive: true);
            string configPath = ValidationFieldWriter.Write(f, dir, seed);
            var config = ConfigLoader.Load(configPath);
            var result = PipelineRunner.Run(config, NullLogger.Instance);
            RunOutputWriter.Write(result, config.Output.Directory);
            return FieldScorer.Score(dir, config.Output.Directory);
        }
        catch (Exception e) when (e is not OutOfMemoryException)
        {
            return new FieldScore
            {
                Field = f.Name, Law = IndexLaws.Name(f.Law), Standards = f.StandardsName, BadShare = f.BadShare, Depth = f.DepthName,
                Error = $"{e.GetType().Name}: {e.Message}",
            };
        }
    }
}
