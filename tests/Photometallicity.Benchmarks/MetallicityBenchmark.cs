using System.Diagnostics;
using Photometallicity.Calibration;
using Photometallicity.Metallicity;
using Photometallicity.Numerics;
using Photometallicity.Photometry;

namespace Photometallicity.Benchmarks;

/// <summary>
/// [Fe/H] assignment of 10^6 synthetic red giants (invented model and field) with a 500-member ensemble.
/// Band errors follow <see cref="PhotometricErrorModel"/> for invented depths (blue 25.5, red 25.0, narrow 24.0 mag at 5 sigma,
/// floor 0.005), blue magnitudes uniform in 19-23.5 mag. Args: [stars] [members] [threads] [points per sigma] [max stride].
/// </summary>
internal static class MetallicityBenchmark
{
    [Benchmark("metallicity")]
    public static void Run(string[] args)
    {
        int n = args.Length > 0 ? int.Parse(args[0]) : 1_000_000;
        int members = args.Length > 1 ? int.Parse(args[1]) : 500;
        int threads = args.Length > 2 ? int.Parse(args[2]) : -1;
        double pps = args.Length > 3 ? double.Parse(args[3], System.Globalization.CultureInfo.InvariantCulture) : new MetallicityOptions().PointsPerSigma;
        int maxStride = args.Length > 4 ? int.Parse(args[4]) : new MetallicityOptions().MaxEvaluationStride;
        var model = BuildModel(members);
        var phot = Stars(n, model);

        var proc = Process.GetCurrentProcess();
        var cpu0 = proc.TotalProcessorTime;
        var clock = Stopwatch.StartNew();
        var assigner = new MetallicityAssigner(model, new MetallicityOptions { MaxDegreeOfParallelism = threads, PointsPerSigma = pps, MaxEvaluationStride = maxStride });
        double setup = clock.Elapsed.TotalSeconds;
        var r = assigner.Run(phot);
        double total = clock.Elapsed.TotalSeconds;
        proc.Refresh();
        double cpu = (proc.TotalProcessorTime - cpu0).TotalSeconds;
        double meanWindow = r.Likelihoods.Length.Where(l => l > 0).DefaultIfEmpty().Average();
        Console.WriteLine($"metallicity: {n} stars, {members} members, {Environment.ProcessorCount} cores, threads {threads}");
        Console.WriteLine($"  tabulation {setup:F2} s ({model.EnsembleCoefficients.Length} members, colour step {assigner.ColourNodeStep:F4} mag)");
        Console.WriteLine($"  total {total:F2} s wall, {n / total:F0} stars/s; CPU {cpu:F2} s ({1e6 * cpu / n:F1} us per star, {n / cpu * 2:F0} stars/s on 2 idle cores)");
        Console.WriteLine($"  mean stored likelihood window {meanWindow:F0} points, {r.Likelihoods.Values.Length * 2e-6:F0} MB of likelihoods; load average {LoadAverage()}");
        Console.WriteLine("  " + string.Join(", ", r.Counts.Where(kv => kv.Value > 0).Select(kv => $"{kv.Key} {kv.Value}")));
    }

    private static string LoadAverage()
    {
        try { return File.ReadAllText("/proc/loadavg").Split(' ')[0]; } catch (IOException) { return "n/a"; }
    }

    /// <summary>Invented model: X0 = a + b C + (c + d C) 0.06 (F + 3.8)^2 + e (C - 1.4)^2, degree 3, with a perturbed ensemble.</summary>
    private static CalibrationModel BuildModel(int members)
    {
        var basis = new PolynomialBasis2D(3, 1.4, 0.6, -1.75, 1.75);
        double[] p0 = [0.30, 0.20, 0.50, 0.25, 0.05];
        double[] sd = [0.006, 0.004, 0.012, 0.006, 0.005];
        var rng = Seeds.For(1, "benchmark-ensemble");
        var ens = new double[members][];
        var sint = new double[members];
        for (int m = 0; m < members; m++)
        {
            var p = p0.Select((v, i) => v + sd[i] * rng.NextGaussian()).ToArray();
            ens[m] = Project(basis, p);
            sint[m] = 0.01 + 0.001 * rng.NextGaussian();
        }
        return new CalibrationModel
        {
            Basis = basis, Coefficients = Project(basis, p0), CoefficientCovariance = new double[basis.Count * basis.Count], SigmaInt = 0.01,
            EnsembleCoefficients = ens, EnsembleSigmaInt = sint,
            Domain = new ValidityDomain([(0.8, -3.5), (2.0, -3.3), (2.0, 0.0), (0.8, -0.3)], []),
            Filters = new FilterSet("invented-system", "iB", "iR", "iN", 1.1, 3.3, 1.6, 4.6),
        };
    }

    private static double Model(double[] p, double c, double f) => p[0] + p[1] * c + (p[2] + p[3] * c) * 0.06 * (f + 3.8) * (f + 3.8) + p[4] * (c - 1.4) * (c - 1.4);

    /// <summary>Coefficients by least squares on a 10 x 10 grid (normal equations; exact as the model lies in the span).</summary>
    private static double[] Project(PolynomialBasis2D basis, double[] p)
    {
        int nb = basis.Count;
        var a = new MathNet.Numerics.LinearAlgebra.Double.DenseMatrix(100, nb);
        var y = new MathNet.Numerics.LinearAlgebra.Double.DenseVector(100);
        var t = new double[nb];
        for (int i = 0; i < 10; i++)
            for (int j = 0; j < 10; j++)
            {
                double c = 0.6 + 0.18 * i, f = -4 + 0.45 * j;
                basis.Terms(c, f, t);
                for (int q = 0; q < nb; q++) a[i * 10 + j, q] = t[q];
                y[i * 10 + j] = Model(p, c, f);
            }
        return a.Solve(y).ToArray();
    }

    private static IndexPhotometry Stars(int n, CalibrationModel model)
    {
        var rng = Seeds.For(1, "benchmark-stars");
        var eb = new PhotometricErrorModel("iB", 25.5, 0.005);
        var er = new PhotometricErrorModel("iR", 25.0, 0.005);
        var en = new PhotometricErrorModel("iN", 24.0, 0.005);
        const double k = 1.1;
        var x = new double[n]; var c = new double[n]; var vx = new double[n]; var vc = new double[n]; var cv = new double[n];
        var b0 = new double[n]; var r0 = new double[n]; var n0 = new double[n];
        for (int i = 0; i < n; i++)
        {
            double ct = 0.85 + 1.1 * rng.NextDouble();
            var range = model.Domain.FehRangeAt(ct)!.Value;
            double ft = range.FehLo + (range.FehHi - range.FehLo) * rng.NextDouble();
            double xt = model.Evaluate(ct, ft);
            double blue = 19 + 4.5 * rng.NextDouble();
            double red = blue - ct, narrow = blue + xt + k * ct;
            double sb = eb.Sigma(blue), sr = er.Sigma(red), sn = en.Sigma(narrow);
            b0[i] = blue + sb * rng.NextGaussian();
            r0[i] = red + sr * rng.NextGaussian();
            n0[i] = narrow + sn * rng.NextGaussian() + 0.01 * rng.NextGaussian();
            c[i] = b0[i] - r0[i];
            x[i] = (n0[i] - b0[i]) - k * c[i];
            vc[i] = sb * sb + sr * sr;
            vx[i] = sn * sn + (1 + k) * (1 + k) * sb * sb + k * k * sr * sr;
            cv[i] = -(1 + k) * sb * sb - k * sr * sr;
        }
        return new IndexPhotometry
        {
            Blue0 = b0, Red0 = r0, Narrow0 = n0, Colour0 = c, Index0 = x, VarColour = vc, VarIndex = vx, CovIndexColour = cv,
            Status = new PhotometryStatus[n], ColourCoefficient = k,
        };
    }
}
