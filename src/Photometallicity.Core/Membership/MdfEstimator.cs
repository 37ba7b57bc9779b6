using Photometallicity.Metallicity;

namespace Photometallicity.Membership;

/// <summary>
/// Fits a Gaussian metallicity distribution (mean, intrinsic spread) to stars with fixed weights (membership
/// probabilities), each star entering through its own [Fe/H] likelihood (see <see cref="GaussianOnGrid"/>):
/// maximises Q(mu, sigma) = sum_i w_i ln Z_i(mu, sigma) by EM on the latent [Fe/H], then takes the errors from the
/// curvature of Q (inverse of minus its Hessian, by central finite differences), i.e. with the weights held fixed.
/// sigma is kept at or above one grid step: the grid cannot resolve a narrower spread.
/// </summary>
internal static class MdfEstimator
{
    public static double SigmaFloor(FehLikelihoods l) => l.GridStep;

    /// <summary>One EM update of (mu, sigma) from the weighted posterior moments; returns the new parameters.</summary>
    public static (double Mean, double Sigma) Update(double sumW, double sumWm1, double sumWm2, double floor, double mean, double sigma)
    {
        if (!(sumW > 1e-9)) return (mean, sigma);
        double mu = sumWm1 / sumW;
        double var = sumWm2 / sumW - mu * mu;
        return (mu, Math.Sqrt(Math.Max(var, floor * floor)));
    }

    public static double Objective(FehLikelihoods l, double[] weights, int[] stars, double mean, double sigma, int threads)
    {
        var g = new GaussianOnGrid(l, mean, sigma);
        var s = ChunkedReduction.Sum(stars.Length, 1, threads, (a, b, acc) =>
        {
            for (int k = a; k < b; k++)
            {
                int i = stars[k];
                double w = weights[i];
                if (w <= 0) continue;
                acc[0] += w * Math.Log(Math.Max(g.Convolve(i), 1e-300));
            }
        });
        return s[0];
    }

    /// <summary>Full fit with fixed weights (used after a fit without the metallicity term), EM to convergence.</summary>
    public static MdfFit Fit(FehLikelihoods l, double[] weights, int[] stars, double mean0, double sigma0, int threads, int maxIter = 500)
    {
        double floor = SigmaFloor(l);
        double mu = mean0, sig = Math.Max(sigma0, floor);
        bool converged = false;
        int it;
        for (it = 0; it < maxIter; it++)
        {
            var g = new GaussianOnGrid(l, mu, sig);
            var s = ChunkedReduction.Sum(stars.Length, 3, threads, (a, b, acc) =>
            {
                for (int k = a; k < b; k++)
                {
                    int i = stars[k];
                    double w = weights[i];
                    if (w <= 0) continue;
                    double z = g.Convolve(i, out double m1, out double m2);
                    if (!(z > 0)) continue;
                    acc[0] += w; acc[1] += w * m1; acc[2] += w * m2;
                }
            });
            var (nm, ns) = Update(s[0], s[1], s[2], floor, mu, sig);
            bool small = Math.Abs(nm - mu) < 1e-7 && Math.Abs(ns - sig) < 1e-7;
            mu = nm; sig = ns;
            if (small) { converged = true; break; }
        }
        return WithErrors(l, weights, stars, mu, sig, threads, converged);
    }

    /// <summary>Attaches curvature errors to a converged (mu, sigma).</summary>
    public static MdfFit WithErrors(FehLikelihoods l, double[] weights, int[] stars, double mu, double sig, int threads, bool converged)
    {
        double floor = SigmaFloor(l);
        double sumW = 0;
        foreach (int i in stars) sumW += Math.Max(weights[i], 0);
        double hm = 1e-3 + 0.02 * sig, hs = 0.02 * sig;
        double sc = Math.Max(sig, floor + hs + 1e-9);
        double F(double m, double s) => Objective(l, weights, stars, m, s, threads);
        double f0 = F(mu, sc);
        double fpm = F(mu + hm, sc), fmm = F(mu - hm, sc), fps = F(mu, sc + hs), fms = F(mu, sc - hs);
        double fpp = F(mu + hm, sc + hs), fpn = F(mu + hm, sc - hs), fnp = F(mu - hm, sc + hs), fnn = F(mu - hm, sc - hs);
        double hmm = (fpm - 2 * f0 + fmm) / (hm * hm);
        double hss = (fps - 2 * f0 + fms) / (hs * hs);
        double hms = (fpp - fpn - fnp + fnn) / (4 * hm * hs);
        double det = hmm * hss - hms * hms;
        double meanErr = double.NaN, sigmaErr = double.NaN;
        if (hmm < 0 && hss < 0 && det > 0)
        {
            meanErr = Math.Sqrt(-hss / det);
            sigmaErr = Math.Sqrt(-hmm / det);
        }
        else if (hmm < 0)
        {
            meanErr = Math.Sqrt(-1.0 / hmm);
        }
        return new MdfFit(mu, meanErr, sig, sigmaErr, sumW, stars.Length, converged, sig <= floor * 1.0000001);
    }
}
