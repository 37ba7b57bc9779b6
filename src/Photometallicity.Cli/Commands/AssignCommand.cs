using System.CommandLine;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'assign' verb. (Placeholder until its stage lands.)</summary>
internal static class AssignCommand
{
    public static Command Create(CliContext ctx)
    {
        var cmd = new Command("assign", "(not implemented yet)");
        cmd.SetAction(_ => CommandRunner.Execute(ctx, () => throw new NotImplementedException("'assign' is not implemented yet")));
        return cmd;
    }
}
