using Photometallicity.Errors;
using Photometallicity.Numerics;

namespace Photometallicity.Calibration;

/// <summary>
/// Nonparametric bootstrap of the calibration (Efron &amp; Tibshirani 1993, An Introduction to the Bootstrap,
/// ch. 6 and 9 (resampling pairs)), resampling units: individual standards singly, each cluster as one block
/// (a block bootstrap; members share one literature [Fe/H]). Every replicate is refitted with the whole
/// procedure, the outlier mixture included, in the chosen model form on the same basis, starting from the best fit.
/// Replicate b draws from Seeds.Derive(seed, "calibration-bootstrap", b) and writes only its own slot, so the
/// ensemble is the same whatever the number of threads. A replicate whose resample cannot be fitted (e.g. all
/// one colour) is redrawn from Seeds.Derive(seed, "calibration-bootstrap-retry", 16 b + attempt).
/// </summary>
internal static class CalibrationBootstrap
{
    private const int MaxAttempts = 16;

    internal sealed record Outcome(double[][] Coefficients, double[] SigmaInt, int Redrawn);

    public static Outcome Run(FitData d, ResampleUnits units, IIndexBasis basis, bool outliers, MixtureFit.Start start, int replicates, ulong seed,
        int? maxThreads, IProgress<double>? progress)
    {
        int n = d.N;
        var coef = new double[replicates][];
        var sigma = new double[replicates];
        int redrawn = 0, done = 0, step = Math.Max(1, replicates / 100);
        var failures = new string?[replicates];
        var po = new ParallelOptions { MaxDegreeOfParallelism = maxThreads ?? -1 };
        Parallel.For(0, replicates, po,
            () => (Fit: new MixtureFit(d, basis, outliers), W: new double[n]),
            (b, _, local) =>
            {
                string? err = null;
                for (int attempt = 0; attempt < MaxAttempts; attempt++)
                {
                    var rng = attempt == 0
                        ? Seeds.For(seed, "calibration-bootstrap", b)
                        : Seeds.For(seed, "calibration-bootstrap-retry", 16L * b + attempt);
                    units.Draw(rng, local.W);
                    err = local.Fit.Fit(local.W, start);
                    if (err is null)
                    {
                        coef[b] = local.Fit.Coefficients.ToArray();
                        sigma[b] = local.Fit.SigmaInt;
                        if (attempt > 0) Interlocked.Increment(ref redrawn);
                        break;
                    }
                }
                if (err is not null) failures[b] = $"bootstrap replicate {b}: {err} after {MaxAttempts} draws";
                int k = Interlocked.Increment(ref done);
                if (progress is not null && (k % step == 0 || k == replicates)) progress.Report((double)k / replicates);
                return local;
            },
            _ => { });
        string? failure = failures.FirstOrDefault(f => f is not null); // lowest replicate: the same message whatever the threads
        if (failure is not null)
            throw new MethodException($"The calibration bootstrap failed: {failure}. The standards are too few or too concentrated for the model \"{basis.Describe}\"; add standards or fix a simpler form (calibration.degree, calibration.knots).");
        return new Outcome(coef, sigma, redrawn);
    }
}
