using System.Diagnostics;

namespace Photometallicity.Pipeline;

/// <summary>
/// Progress of long steps, printed to a text stream (stderr) as plain lines: "bootstrap: 40%" at most every
/// <see cref="Interval"/>, and a closing "bootstrap: done in 3.2 s". Works the same on a terminal and in a log.
/// </summary>
public sealed class ProgressReporter(TextWriter writer)
{
    public static readonly TimeSpan Interval = TimeSpan.FromSeconds(2);

    /// <summary>A progress receiver for one step; report fractions in [0, 1], then dispose to print the closing line.</summary>
    public Step For(string step) => new(writer, step);

    public sealed class Step : IProgress<double>, IDisposable
    {
        private readonly TextWriter _w;
        private readonly string _name;
        private readonly Stopwatch _clock = Stopwatch.StartNew();
        private TimeSpan _last = TimeSpan.Zero;
        private bool _closed;

        internal Step(TextWriter w, string name)
        {
            _w = w;
            _name = name;
        }

        public void Report(double fraction)
        {
            lock (this)
            {
                if (_closed || _clock.Elapsed - _last < Interval) return;
                _last = _clock.Elapsed;
                _w.WriteLine($"{_name}: {Math.Clamp(fraction, 0, 1) * 100:F0}%");
            }
        }

        public void Dispose()
        {
            lock (this)
            {
                if (_closed) return;
                _closed = true;
                _w.WriteLine($"{_name}: done in {_clock.Elapsed.TotalSeconds:F1} s");
            }
        }
    }
}
