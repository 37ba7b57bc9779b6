using System.Diagnostics;
using Photometallicity.CrossMatch;
using Photometallicity.Numerics;
using Photometallicity.Units;

namespace Photometallicity.Benchmarks;

/// <summary>
/// Cross-match in memory: N broadband x N narrow-band sources (default 10^6) in an invented 2 x 2 deg field,
/// 80% of them with a counterpart displaced by a 1 arcsec offset plus 0.15 arcsec noise, at radius 1 arcsec
/// with the offset solved. Usage: crossmatch [N] [--auto]. Prints wall time per phase and the peak working set.
/// </summary>
internal static class CrossMatchBenchmark
{
    [Benchmark("crossmatch")]
    public static void Run(string[] args)
    {
        int n = args.Length > 0 && int.TryParse(args[0], out int k) ? k : 1_000_000;
        bool auto = args.Contains("--auto");
        var (lra, ldec, rra, rdec) = MakeField(n, 42);
        Console.WriteLine($"crossmatch benchmark: {n} x {rra.Length} sources, radius 1 arcsec{(auto ? " (auto)" : "")}, threads {Environment.ProcessorCount}");

        var me = Process.GetCurrentProcess();
        var q = UnitVectors.FromDegrees(lra, ldec);
        _ = q.Order;
        var rv = UnitVectors.FromDegrees(rra, rdec);
        double c = SkySeparation.Chord(Angle.FromArcseconds(1.0));
        for (int rep = 0; rep < 3; rep++)
        {
            me.Refresh();
            var t0 = me.TotalProcessorTime;
            var sw = Stopwatch.StartNew();
            var tree = SkyKdTree.Build(rv);
            me.Refresh();
            var t1 = me.TotalProcessorTime;
            Console.WriteLine($"  k-d tree build: {sw.Elapsed.TotalSeconds:0.000} s wall, {(t1 - t0).TotalSeconds:0.000} s CPU");
            sw.Restart();
            var pairs = CandidatePairs.Find(tree, q, c * c);
            me.Refresh();
            Console.WriteLine($"  all-within-1-arcsec query: {sw.Elapsed.TotalSeconds:0.000} s wall, {(me.TotalProcessorTime - t1).TotalSeconds:0.000} s CPU ({pairs.PairCount} pairs)");
        }

        var proc = Process.GetCurrentProcess();
        for (int rep = 0; rep < 2; rep++)
        {
            var sw = Stopwatch.StartNew();
            proc.Refresh();
            var cpu0 = proc.TotalProcessorTime;
            var r = CrossMatcher.Run(lra, ldec, rra, rdec, new CrossMatchOptions { Radius = Angle.FromArcseconds(1.0), AutoRadius = auto }, new ConsoleLog());
            proc.Refresh();
            Console.WriteLine($"  CrossMatcher.Run: {sw.Elapsed.TotalSeconds:0.000} s wall, {(proc.TotalProcessorTime - cpu0).TotalSeconds:0.000} s CPU; matched {r.Matched}, offset {r.Offset.DRaCosDecArcsec:+0.0000;-0.0000}, {r.Offset.DDecArcsec:+0.0000;-0.0000} arcsec, "
                              + $"{r.Iterations} iterations, radius {r.RadiusUsed.Arcseconds:0.###}, false-match {r.ExpectedFalseMatchRate:0.0000}/{r.MeasuredFalseMatchRate:0.0000}");
        }
        Process.GetCurrentProcess().Refresh();
        long peak = Process.GetCurrentProcess().PeakWorkingSet64;
        Console.WriteLine($"  peak working set: {peak / 1e6:0} MB = {peak / (double)(n + rra.Length):0} bytes per source (whole benchmark process)");
    }

    private sealed class ConsoleLog : Microsoft.Extensions.Logging.ILogger
    {
        public IDisposable? BeginScope<TState>(TState state) where TState : notnull => null;
        public bool IsEnabled(Microsoft.Extensions.Logging.LogLevel logLevel) => true;
        public void Log<TState>(Microsoft.Extensions.Logging.LogLevel logLevel, Microsoft.Extensions.Logging.EventId eventId, TState state, Exception? exception, Func<TState, Exception?, string> formatter) =>
            Console.WriteLine("    " + formatter(state, exception));
    }

    /// <summary>Invented field: uniform in a 2 x 2 deg box at (150, +2) deg; counterparts offset by (+1.0, -0.5) arcsec.</summary>
    internal static (double[] LeftRa, double[] LeftDec, double[] RightRa, double[] RightDec) MakeField(int n, ulong seed)
    {
        var rng = new Rng(seed);
        var lra = new double[n];
        var ldec = new double[n];
        var rra = new double[n];
        var rdec = new double[n];
        const double ra0 = 150.0, dec0 = 2.0, w = 2.0;
        double cosd = Math.Cos(dec0 * Math.PI / 180);
        for (int i = 0; i < n; i++)
        {
            ldec[i] = dec0 - w / 2 + w * rng.NextDouble();
            lra[i] = ra0 + (rng.NextDouble() - 0.5) * w / cosd;
            if (rng.NextDouble() < 0.8)
            {
                rdec[i] = ldec[i] + (-0.5 + rng.NextGaussian(0, 0.15)) / 3600.0;
                rra[i] = lra[i] + (1.0 + rng.NextGaussian(0, 0.15)) / 3600.0 / Math.Cos(ldec[i] * Math.PI / 180);
            }
            else
            {
                rdec[i] = dec0 - w / 2 + w * rng.NextDouble();
                rra[i] = ra0 + (rng.NextDouble() - 0.5) * w / cosd;
            }
        }
        return (lra, ldec, rra, rdec);
    }
}
