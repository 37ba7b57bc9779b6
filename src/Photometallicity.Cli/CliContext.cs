using Microsoft.Extensions.Logging;

namespace Photometallicity.Cli;

/// <summary>What every verb needs from its surroundings: where results and messages go, and a logger.</summary>
public sealed class CliContext
{
    public CliContext(TextWriter stdout, TextWriter stderr)
    {
        Out = stdout;
        Error = stderr;
        LoggerFactory = new StderrLoggerFactory(stderr);
    }

    /// <summary>Results asked for on standard output.</summary>
    public TextWriter Out { get; }

    /// <summary>Logging, progress and error messages.</summary>
    public TextWriter Error { get; }

    public ILoggerFactory LoggerFactory { get; }

    public ILogger Logger(string name) => LoggerFactory.CreateLogger(name);
}
