using System.CommandLine;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'demo' verb. (Placeholder until its stage lands.)</summary>
internal static class DemoCommand
{
    public static Command Create(CliContext ctx)
    {
        var cmd = new Command("demo", "(not implemented yet)");
        cmd.SetAction(_ => CommandRunner.Execute(ctx, () => throw new NotImplementedException("'demo' is not implemented yet")));
        return cmd;
    }
}
