using System.CommandLine;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'extinction' verb. (Placeholder until its stage lands.)</summary>
internal static class ExtinctionCommand
{
    public static Command Create(CliContext ctx)
    {
        var cmd = new Command("extinction", "(not implemented yet)");
        cmd.SetAction(_ => CommandRunner.Execute(ctx, () => throw new NotImplementedException("'extinction' is not implemented yet")));
        return cmd;
    }
}
