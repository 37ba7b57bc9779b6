using System.CommandLine;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'match' verb. (Placeholder until its stage lands.)</summary>
internal static class MatchCommand
{
    public static Command Create(CliContext ctx)
    {
        var cmd = new Command("match", "(not implemented yet)");
        cmd.SetAction(_ => CommandRunner.Execute(ctx, () => throw new NotImplementedException("'match' is not implemented yet")));
        return cmd;
    }
}
