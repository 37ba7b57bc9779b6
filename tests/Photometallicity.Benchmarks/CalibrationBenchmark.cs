using System.Diagnostics;
using Photometallicity.Calibration;
using Photometallicity.Numerics;

namespace Photometallicity.Benchmarks;

/// <summary>
/// Calibration stage: 300 invented standards (240 field stars, 6 invented clusters of 10), degree by 5-fold
/// cross-validation over 1..3, B = 1000 bootstrap refits. Args: [standards] [bootstrap] [threads|all] [calibration.json to write|-] [fixed degree].
/// </summary>
internal static class CalibrationBenchmark
{
    [Benchmark("calibration")]
    public static void Run(string[] args)
    {
        int n = args.Length > 0 ? int.Parse(args[0]) : 300;
        int b = args.Length > 1 ? int.Parse(args[1]) : 1000;
        int? threads = args.Length > 2 && args[2] != "all" ? int.Parse(args[2]) : null;
        var st = Make(n, 2026);
        var filters = new FilterSet("invented-system", "b_inv", "r_inv", "hk_inv", 1.1, 3.0, 1.5, 4.0);
        int? degree = args.Length > 4 ? int.Parse(args[4]) : null;
        var opt = new CalibrationOptions { Bootstrap = b, Seed = 5, Filters = filters, MaxThreads = threads, Degree = degree };
        CalibrationFitter.Run(Make(60, 1), opt with { Bootstrap = 20 }); // warm-up (JIT)
        var cpu0 = Process.GetCurrentProcess().TotalProcessorTime;
        var sw = Stopwatch.StartNew();
        var r = CalibrationFitter.Run(st, opt);
        sw.Stop();
        var cpu = Process.GetCurrentProcess().TotalProcessorTime - cpu0;
        Console.WriteLine($"calibration: {n} standards, B = {b}, threads = {(threads?.ToString() ?? "all")} ({Environment.ProcessorCount} cores): {sw.Elapsed.TotalSeconds:F2} s wall, {cpu.TotalSeconds:F2} s CPU");
        Console.WriteLine($"  degree {r.Degree}, accepted {r.Model.StandardsUsed}, rejected {r.Model.StandardsRejected}, sigma_int {r.Model.SigmaInt:F4} mag, rms {r.Model.RmsDex:F3} dex, redrawn {r.BootstrapRedrawn}");
        if (args.Length > 3 && args[3] != "-") CalibrationJson.Write(r.Model, r, args[3]);
    }

    /// <summary>Invented standards (no real system): X0 = 0.4 + 0.55 C + 0.3 F + 0.1 C^2 + 0.15 C F + 0.06 F^2 + noise.</summary>
    private static CalibrationStandards Make(int n, ulong seed)
    {
        var rng = new Rng(seed);
        int clusters = n >= 100 ? 6 : 0, perCluster = 10;
        var id = new string[n]; var c0 = new double[n]; var x0 = new double[n]; var vc = new double[n]; var vx = new double[n];
        var cov = new double[n]; var feh = new double[n]; var fe = new double[n]; var grp = new int[n];
        for (int i = 0; i < n; i++)
        {
            int g = i < clusters * perCluster ? i / perCluster : -1;
            double f = g >= 0 ? -2.3 + 0.3 * g : -2.4 + 1.8 * rng.NextDouble();
            double c = 0.8 + 0.8 * rng.NextDouble();
            id[i] = $"s{i}";
            c0[i] = c + 0.01 * rng.NextGaussian();
            x0[i] = 0.4 + 0.55 * c + 0.3 * f + 0.1 * c * c + 0.15 * c * f + 0.06 * f * f + 0.028 * rng.NextGaussian();
            if (i % 50 == 7) x0[i] += 0.3; // a few bad standards
            vc[i] = 1e-4; vx[i] = 4e-4; cov[i] = -0.3 * 0.01 * 0.02;
            feh[i] = f + 0.1 * rng.NextGaussian(); fe[i] = 0.1; grp[i] = g;
        }
        return new CalibrationStandards
        {
            Id = id, Colour0 = c0, Index0 = x0, VarColour = vc, VarIndex = vx, CovIndexColour = cov, Feh = feh, FehErr = fe,
            Group = grp, GroupName = Enumerable.Range(0, clusters).Select(g => $"cl{g}").ToArray(),
        };
    }
}
