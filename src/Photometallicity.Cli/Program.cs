namespace Photometallicity.Cli;

/// <summary>Process entry point: hands the arguments to <see cref="CliApp"/> with the real console.</summary>
public static class Program
{
    public static int Main(string[] args) => CliApp.Run(args, Console.Out, Console.Error);
}
