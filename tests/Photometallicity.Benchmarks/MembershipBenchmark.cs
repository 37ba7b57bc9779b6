using System.Diagnostics;
using Photometallicity.Membership;
using Photometallicity.Metallicity;
using Photometallicity.Numerics;
using Photometallicity.Units;

namespace Photometallicity.Benchmarks;

/// <summary>
/// Membership fit on an invented field of 10^6 stars (default; first argument overrides): a Plummer dwarf of 5% of the
/// stars on a uniform foreground over a 2 x 2 deg field, red-giant ridge against a two-population foreground CMD,
/// Gaussian [Fe/H] likelihoods for the stars brighter than 23 mag. Prints the wall time of the fit (both metallicity
/// modes, as the pipeline runs it) and the recovered numbers.
/// </summary>
internal static class MembershipBenchmark
{
    [Benchmark("membership")]
    public static void Run(string[] args)
    {
        int n = args.Length > 0 ? int.Parse(args[0], System.Globalization.CultureInfo.InvariantCulture) : 1_000_000;
        var sw = Stopwatch.StartNew();
        var (inputs, truth) = Make(n, 2026);
        Console.WriteLine($"membership: generated {n} stars in {sw.Elapsed.TotalSeconds:F1} s ({truth.Count(t => t)} members)");
        var options = new MembershipOptions
        {
            InitialCentre = SkyPosition.FromDegrees(0.05, -33.0), // invented, across RA = 0
            DistanceModulus = 22.0,
            InitialHalfLightArcmin = 5.0,
        };
        var proc = Process.GetCurrentProcess();
        var cpu0 = proc.TotalProcessorTime;
        sw.Restart();
        var r = MembershipFitter.Run(inputs, options);
        double t = sw.Elapsed.TotalSeconds;
        proc.Refresh();
        double cpu = (proc.TotalProcessorTime - cpu0).TotalSeconds;
        int members = truth.Count(x => x);
        Console.WriteLine($"membership: fit {n} stars in {t:F1} s on {Environment.ProcessorCount} cores (CPU time {cpu:F1} s; load average at start {LoadAverage()}); {r.Iterations} EM iterations, converged {r.Converged}");
        Console.WriteLine($"membership: expected members {r.ExpectedMembers:F0} (truth {members}), r_h {r.Structure.HalfLightArcmin:F2} +- {r.Structure.HalfLightErrArcmin:F2} arcmin (truth 4.00)");
        Console.WriteLine($"membership: MDF mean {r.Mdf!.Mean:F3} +- {r.Mdf.MeanErr:F3}, sigma {r.Mdf.Sigma:F3} +- {r.Mdf.SigmaErr:F3} (truth -1.60, 0.30); without the metallicity term {r.MdfWithoutMetallicityTerm!.Mean:F3}, {r.MdfWithoutMetallicityTerm.Sigma:F3}");
        foreach (var w in r.Warnings) Console.WriteLine($"membership: warning: {w}");
    }

    private static (MembershipInputs, bool[]) Make(int n, ulong seed)
    {
        var rng = new Rng(seed);
        double ra0 = 0.05 * Math.PI / 180, dec0 = -33.0 * Math.PI / 180, half = 60.0, rh = 4.0, e = 0.25, th = 0.6;
        var ra = new double[n]; var dec = new double[n]; var mag = new double[n]; var col = new double[n];
        var vc = new double[n]; var usable = new bool[n]; var truth = new bool[n]; var feh = new double[n];
        for (int i = 0; i < n; i++)
        {
            bool member = rng.NextDouble() < 0.05;
            double xi, eta;
            if (member)
            {
                double u = rng.NextDouble(), rr = rh * Math.Sqrt(u / (1 - u)), phi = 2 * Math.PI * rng.NextDouble();
                double v = rr * Math.Cos(phi), w = rr * Math.Sin(phi) * (1 - e);
                xi = v * Math.Sin(th) + w * Math.Cos(th); eta = v * Math.Cos(th) - w * Math.Sin(th);
                if (Math.Abs(xi) > half || Math.Abs(eta) > half) { member = false; xi = half * (2 * rng.NextDouble() - 1); eta = half * (2 * rng.NextDouble() - 1); }
            }
            else { xi = half * (2 * rng.NextDouble() - 1); eta = half * (2 * rng.NextDouble() - 1); }
            // gnomonic deprojection (standard coordinates, radians)
            double x = xi / 3437.7467707849, y = eta / 3437.7467707849;
            double den = Math.Cos(dec0) - y * Math.Sin(dec0);
            ra[i] = (ra0 + Math.Atan2(x, den)) * 180 / Math.PI;
            if (ra[i] < 0) ra[i] += 360;
            dec[i] = Math.Atan2(Math.Sin(dec0) + y * Math.Cos(dec0), Math.Sqrt(x * x + den * den)) * 180 / Math.PI;
            double m = member ? Expo(rng, 18.5, 24, 0.7) : Expo(rng, 18, 24, 0.3);
            double sc = 0.01 + 0.03 * Math.Pow(10, 0.4 * (m - 24));
            double tt = m - 21;
            double c = member ? 1.0 - 0.18 * tt + 0.02 * tt * tt + rng.NextGaussian(0, 0.03)
                              : (rng.NextDouble() < 0.6 ? rng.NextGaussian(0.75, 0.15) : rng.NextGaussian(1.5, 0.25));
            mag[i] = m; col[i] = c + rng.NextGaussian(0, sc); vc[i] = sc * sc; usable[i] = true; truth[i] = member;
            feh[i] = member ? rng.NextGaussian(-1.6, 0.3) : rng.NextGaussian(-0.6, 0.4);
        }
        // [Fe/H] likelihoods: Gaussians on a 0.02 dex grid for stars brighter than 23 mag
        const double gmin = -4, step = 0.02; const int gcount = 251;
        var off = new int[n]; var start = new int[n]; var len = new int[n];
        var vals = new List<Half>(n * 40);
        for (int i = 0; i < n; i++)
        {
            off[i] = vals.Count;
            if (mag[i] > 23) continue;
            double s = 0.12 + 0.15 * Math.Pow(10, 0.4 * (mag[i] - 23));
            double obs = feh[i] + rng.NextGaussian(0, s), hw = 5.26 * s;
            int j0 = Math.Max(0, (int)Math.Ceiling((obs - hw - gmin) / step)), j1 = Math.Min(gcount - 1, (int)Math.Floor((obs + hw - gmin) / step));
            if (j1 < j0) continue;
            double norm = 0;
            for (int j = j0; j <= j1; j++) { double z = (gmin + j * step - obs) / s; norm += Math.Exp(-0.5 * z * z); }
            for (int j = j0; j <= j1; j++) { double z = (gmin + j * step - obs) / s; vals.Add((Half)(Math.Exp(-0.5 * z * z) / (norm * step))); }
            start[i] = j0; len[i] = j1 - j0 + 1;
        }
        var l = new FehLikelihoods { GridMin = gmin, GridStep = step, GridCount = gcount, Offset = off, Start = start, Length = len, Values = vals.ToArray() };
        return (new MembershipInputs { RaDeg = ra, DecDeg = dec, Mag = mag, Colour0 = col, VarColour = vc, VarMag = vc, Usable = usable, Feh = l }, truth);
    }

    private static string LoadAverage()
    {
        try { return File.ReadAllText("/proc/loadavg").Split(' ')[0]; }
        catch (IOException) { return "n/a"; }
        catch (UnauthorizedAccessException) { return "n/a"; }
    }

    private static double Expo(Rng rng, double lo, double hi, double beta) =>
        lo + Math.Log(1 + rng.NextDouble() * (Math.Exp(beta * (hi - lo)) - 1)) / beta;
}
