using System.CommandLine;
using Photometallicity.Cli.Commands;

namespace Photometallicity.Cli;

/// <summary>
/// The command-line application: builds the verbs, parses, runs, and maps failures to exit codes
/// (0 success, 2 bad input or usage, 1 internal failure).
/// </summary>
public static class CliApp
{
    public static int Run(string[] args, TextWriter stdout, TextWriter stderr)
    {
        var ctx = new CliContext(stdout, stderr);
        var root = new RootCommand("photometallicity: photometric [Fe/H] of resolved red giants from Ca II H&K narrow-band and two broadband filters.");
        foreach (var command in Verbs(ctx)) root.Subcommands.Add(command);

        var parse = root.Parse(args);
        if (parse.Errors.Count > 0)
        {
            foreach (var e in parse.Errors) stderr.WriteLine($"error: {e.Message}");
            stderr.WriteLine("Run 'photometallicity --help' or 'photometallicity VERB --help' for the options.");
            return 2;
        }
        return parse.Invoke(new InvocationConfiguration { Output = stdout, Error = stderr, EnableDefaultExceptionHandler = false });
    }

    private static IEnumerable<Command> Verbs(CliContext ctx)
    {
        yield return DemoCommand.Create(ctx);
        yield return RunCommand.Create(ctx);
        yield return MatchCommand.Create(ctx);
        yield return ExtinctionCommand.Create(ctx);
        yield return CalibrateCommand.Create(ctx);
        yield return AssignCommand.Create(ctx);
        yield return MembersCommand.Create(ctx);
        yield return ForecastCommand.Create(ctx);
        yield return ReportCommand.Create(ctx);
        yield return ConvertCommand.Create(ctx);
        yield return HealpixCommand.Create(ctx);
        yield return SplitCommand.Create(ctx);
        yield return TileCommand.Create(ctx);
        yield return MergeCommand.Create(ctx);
        yield return BatchCommand.Create(ctx);
        yield return ValidateCommand.Create(ctx);
    }
}
