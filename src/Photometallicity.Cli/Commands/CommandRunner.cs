using Photometallicity.Errors;

namespace Photometallicity.Cli.Commands;

/// <summary>Runs a verb's body and turns its failures into a message on stderr and an exit code.</summary>
internal static class CommandRunner
{
    public static int Execute(CliContext ctx, Func<int> body)
    {
        try
        {
            return body();
        }
        catch (PhotometallicityException e)
        {
            ctx.Error.WriteLine($"error: {e.Message}");
            return e.ExitCode;
        }
        catch (OperationCanceledException)
        {
            ctx.Error.WriteLine("error: cancelled");
            return 1;
        }
        catch (Exception e)
        {
            ctx.Error.WriteLine($"internal error: {e.GetType().Name}: {e.Message}");
            if (Environment.GetEnvironmentVariable("PHOTOMETALLICITY_DEBUG") is { Length: > 0 }) ctx.Error.WriteLine(e);
            else ctx.Error.WriteLine("(set PHOTOMETALLICITY_DEBUG=1 for the stack trace; please report it)");
            return 1;
        }
    }
}
