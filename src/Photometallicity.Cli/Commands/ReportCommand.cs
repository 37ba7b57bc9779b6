using System.CommandLine;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'report' verb. (Placeholder until its stage lands.)</summary>
internal static class ReportCommand
{
    public static Command Create(CliContext ctx)
    {
        var cmd = new Command("report", "(not implemented yet)");
        cmd.SetAction(_ => CommandRunner.Execute(ctx, () => throw new NotImplementedException("'report' is not implemented yet")));
        return cmd;
    }
}
