using System.CommandLine;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'calibrate' verb. (Placeholder until its stage lands.)</summary>
internal static class CalibrateCommand
{
    public static Command Create(CliContext ctx)
    {
        var cmd = new Command("calibrate", "(not implemented yet)");
        cmd.SetAction(_ => CommandRunner.Execute(ctx, () => throw new NotImplementedException("'calibrate' is not implemented yet")));
        return cmd;
    }
}
