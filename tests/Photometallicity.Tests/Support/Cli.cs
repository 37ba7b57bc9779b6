using Photometallicity.Cli;

namespace Photometallicity.Tests.Support;

/// <summary>Runs the command-line application in-process and captures what it prints.</summary>
public static class CliRun
{
    public sealed record Result(int ExitCode, string Out, string Error);

    public static Result Invoke(params string[] args)
    {
        var o = new StringWriter();
        var e = new StringWriter();
        int code = CliApp.Run(args, o, e);
        return new Result(code, o.ToString(), e.ToString());
    }
}
