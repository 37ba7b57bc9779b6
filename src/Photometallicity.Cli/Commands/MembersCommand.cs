using System.CommandLine;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'members' verb. (Placeholder until its stage lands.)</summary>
internal static class MembersCommand
{
    public static Command Create(CliContext ctx)
    {
        var cmd = new Command("members", "(not implemented yet)");
        cmd.SetAction(_ => CommandRunner.Execute(ctx, () => throw new NotImplementedException("'members' is not implemented yet")));
        return cmd;
    }
}
