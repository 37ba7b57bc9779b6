using System.CommandLine;
using System.Globalization;
using Photometallicity.Errors;
using Photometallicity.Pipeline;
using Photometallicity.Tiling;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'tile' verb: runs one tile of a split survey.</summary>
internal static class TileCommand
{
    public const string ArrayTaskVariable = "SLURM_ARRAY_TASK_ID";

    public static Command Create(CliContext ctx)
    {
        var work = new Argument<string>("WORKDIR") { Description = "Work directory written by 'split'." };
        var index = new Option<int?>("--index") { Description = $"Tile number, 0-based (default: the {ArrayTaskVariable} environment variable, as in a Slurm job array)." };
        var cmd = new Command("tile", "Run one tile of a split survey: its cross-match with the whole-field solution and its stars' [Fe/H]; writes result.bin in the tile's directory.") { work, index };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            int i = pr.GetValue(index) ?? FromEnvironment();
            var plan = TilePlanJson.Read(pr.GetValue(work)!);
            TileRunner.Run(plan, i, ctx.Logger("tile"), new ProgressReporter(ctx.Error));
            return 0;
        }));
        return cmd;
    }

    private static int FromEnvironment()
    {
        string? v = Environment.GetEnvironmentVariable(ArrayTaskVariable);
        if (v is null) throw new InputException($"no tile given: pass --index N or set {ArrayTaskVariable}");
        if (!int.TryParse(v, NumberStyles.Integer, CultureInfo.InvariantCulture, out int i) || i < 0)
            throw new InputException($"{ArrayTaskVariable} is '{v}', not a tile number");
        return i;
    }
}
