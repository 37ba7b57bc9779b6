using System.CommandLine;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'forecast' verb. (Placeholder until its stage lands.)</summary>
internal static class ForecastCommand
{
    public static Command Create(CliContext ctx)
    {
        var cmd = new Command("forecast", "(not implemented yet)");
        cmd.SetAction(_ => CommandRunner.Execute(ctx, () => throw new NotImplementedException("'forecast' is not implemented yet")));
        return cmd;
    }
}
