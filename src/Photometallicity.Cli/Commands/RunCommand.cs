using System.CommandLine;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'run' verb. (Placeholder until its stage lands.)</summary>
internal static class RunCommand
{
    public static Command Create(CliContext ctx)
    {
        var cmd = new Command("run", "(not implemented yet)");
        cmd.SetAction(_ => CommandRunner.Execute(ctx, () => throw new NotImplementedException("'run' is not implemented yet")));
        return cmd;
    }
}
