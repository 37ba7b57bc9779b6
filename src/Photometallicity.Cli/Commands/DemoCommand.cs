using System.CommandLine;
using Photometallicity.Demo;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'demo' verb: writes the invented demonstration field and runs the whole pipeline on it.</summary>
internal static class DemoCommand
{
    public static Command Create(CliContext ctx)
    {
        var outDir = new Option<string>("--out") { Description = "Directory for the invented field's inputs, truth and config.json; the results go to DIR/out.", DefaultValueFactory = _ => "demo-out" };
        var seed = new Option<ulong>("--seed") { Description = "Seed of the invented field and of the run.", DefaultValueFactory = _ => 1UL };
        var stars = new Option<int>("--stars") { Description = "Number of broadband sources in the invented field (at least 500).", DefaultValueFactory = _ => 20000 };
        var inputsOnly = new Option<bool>("--inputs-only") { Description = "Only write the invented field and its config (for benchmarks and tiled runs); do not run the pipeline." };
        var cmd = new Command("demo", $"Write the invented demonstration field ({DemoTruth.GalaxyName}: an invented dwarf galaxy with a Milky Way foreground, invented filters and numbers) and run the whole pipeline on it.") { outDir, seed, stars, inputsOnly };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            int n = pr.GetValue(stars);
            if (n < 500 || n > 50_000_000) throw new Errors.InputException($"--stars {n} is outside the allowed range [500, 50000000]");
            string dir = Path.GetFullPath(pr.GetValue(outDir)!);
            ulong s = pr.GetValue(seed);
            ctx.Error.WriteLine($"generating the invented field {DemoTruth.GalaxyName}: {n} broadband sources, seed {s}");
            var field = DemoGenerator.Generate(n, s);
            string config = DemoWriter.Write(field, dir, s);
            ctx.Error.WriteLine($"wrote the invented inputs and {Path.GetFileName(config)} to {dir}");
            if (pr.GetValue(inputsOnly)) return 0;
            string results = PipelineExecution.RunAndWrite(ctx, config, null);
            ctx.Error.WriteLine($"demo done: results in {results} (start with summary.html); the invented truth is in {Path.Combine(dir, "truth")}");
            return 0;
        }));
        return cmd;
    }
}
