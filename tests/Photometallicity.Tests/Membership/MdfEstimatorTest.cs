using Photometallicity.Membership;
using Photometallicity.Metallicity;
using Photometallicity.Numerics;

namespace Photometallicity.Tests.Membership;

/// <summary>
/// The MDF fit against the closed form: a Gaussian MDF N(mu, sigma) convolved with a Gaussian likelihood of width e_i
/// is N(x_i; mu, sqrt(sigma^2 + e_i^2)) (convolution of normals), whose maximum-likelihood (mu, sigma) is found here by
/// a brute-force grid search, independently of the EM code.
/// </summary>
public class MdfEstimatorTest
{
    private static (FehLikelihoods L, double[] X, double[] E) Sample(int n, double mu, double sigma, ulong seed)
    {
        var rng = new Rng(seed);
        const double gmin = -4, step = 0.01; const int count = 501;
        var off = new int[n]; var start = new int[n]; var len = new int[n];
        var vals = new List<Half>();
        var x = new double[n]; var e = new double[n];
        for (int i = 0; i < n; i++)
        {
            e[i] = 0.1 + 0.2 * rng.NextDouble();
            x[i] = rng.NextGaussian(mu, Math.Sqrt(sigma * sigma + e[i] * e[i]));
            int j0 = Math.Max(0, (int)((x[i] - 6 * e[i] - gmin) / step)), j1 = Math.Min(count - 1, (int)((x[i] + 6 * e[i] - gmin) / step));
            off[i] = vals.Count; start[i] = j0; len[i] = j1 - j0 + 1;
            double norm = 0;
            for (int j = j0; j <= j1; j++) norm += Math.Exp(-0.5 * Math.Pow((gmin + j * step - x[i]) / e[i], 2));
            for (int j = j0; j <= j1; j++) vals.Add((Half)(Math.Exp(-0.5 * Math.Pow((gmin + j * step - x[i]) / e[i], 2)) / (norm * step)));
        }
        return (new FehLikelihoods { GridMin = gmin, GridStep = step, GridCount = count, Offset = off, Start = start, Length = len, Values = vals.ToArray() }, x, e);
    }

    private static double Analytic(double[] x, double[] e, double mu, double s)
    {
        double l = 0;
        for (int i = 0; i < x.Length; i++)
        {
            double t = s * s + e[i] * e[i];
            l += -0.5 * ((x[i] - mu) * (x[i] - mu) / t + Math.Log(2 * Math.PI * t));
        }
        return l;
    }

    [Fact]
    public void Fit_MatchesClosedFormMaximumLikelihood()
    {
        var (l, x, e) = Sample(800, -1.3, 0.25, 9);
        var w = Enumerable.Repeat(1.0, x.Length).ToArray();
        var rows = Enumerable.Range(0, x.Length).ToArray();
        var fit = MdfEstimator.Fit(l, w, rows, -1.0, 0.5, 1);

        double bestL = double.NegativeInfinity, bm = 0, bs = 0;
        for (double m = -1.45; m <= -1.15; m += 0.001)
            for (double s = 0.15; s <= 0.35; s += 0.001)
            {
                double v = Analytic(x, e, m, s);
                if (v > bestL) { bestL = v; bm = m; bs = s; }
            }
        Assert.True(fit.Converged);
        Assert.Equal(bm, fit.Mean, 2);
        Assert.Equal(bs, fit.Sigma, 2);
        // curvature error against the asymptotic 1 / sqrt(sum 1 / (sigma^2 + e^2)) for the mean
        double info = e.Sum(ei => 1 / (bs * bs + ei * ei));
        Assert.Equal(1 / Math.Sqrt(info), fit.MeanErr, 3);
        // the grid convolution reproduces the analytic log-likelihood (up to the constant, identical here)
        double obj = MdfEstimator.Objective(l, w, rows, bm, bs, 1);
        Assert.Equal(Analytic(x, e, bm, bs), obj, 0);
    }
}
