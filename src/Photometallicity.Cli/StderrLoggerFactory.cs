using Microsoft.Extensions.Logging;

namespace Photometallicity.Cli;

/// <summary>
/// A minimal logger that writes "[level] message" lines to the given error stream, so that results on
/// standard output stay clean and tests can capture the log. Level threshold: Information, or Debug when
/// PHOTOMETALLICITY_DEBUG is set.
/// </summary>
internal sealed class StderrLoggerFactory : ILoggerFactory
{
    private readonly TextWriter _writer;
    private readonly LogLevel _min;

    public StderrLoggerFactory(TextWriter writer)
    {
        _writer = writer;
        _min = Environment.GetEnvironmentVariable("PHOTOMETALLICITY_DEBUG") is { Length: > 0 } ? LogLevel.Debug : LogLevel.Information;
    }

    public void AddProvider(ILoggerProvider provider) { }

    public ILogger CreateLogger(string categoryName) => new Writer(_writer, _min);

    public void Dispose() { }

    private sealed class Writer(TextWriter w, LogLevel min) : ILogger
    {
        public IDisposable? BeginScope<TState>(TState state) where TState : notnull => null;

        public bool IsEnabled(LogLevel logLevel) => logLevel >= min;

        public void Log<TState>(LogLevel logLevel, EventId eventId, TState state, Exception? exception, Func<TState, Exception?, string> formatter)
        {
            if (!IsEnabled(logLevel)) return;
            string tag = logLevel switch
            {
                LogLevel.Warning => "warning: ",
                LogLevel.Error or LogLevel.Critical => "error: ",
                LogLevel.Debug or LogLevel.Trace => "debug: ",
                _ => "",
            };
            lock (w) w.WriteLine(tag + formatter(state, exception));
        }
    }
}
