namespace Photometallicity.Membership;

/// <summary>
/// A Gaussian of mean mu and intrinsic dispersion s observed with per-star error variances v_i:
/// x_i ~ N(mu, s^2 + v_i). One weighted ECM cycle (Meng &amp; Rubin 1993, Biometrika 80, 267) with fixed weights w_i:
/// mu' = sum w x / (s^2 + v) / sum w / (s^2 + v) (exact maximiser at fixed s), then, with the true value as the
/// latent variable, s'^2 = sum w [s^2 v / (s^2 + v) + (s^2 (x - mu') / (s^2 + v))^2] / sum w (the EM step of the
/// classical measurement-error model). The EM step for a dispersion much smaller than the errors converges very
/// slowly, so a Newton step on the score in s^2 is also tried and the better of the two (by the weighted
/// log-likelihood, never below the current value) is kept.
/// </summary>
internal struct HeteroscedasticGaussian
{
    public double Mean;
    public double Sigma;
    public double SigmaFloor;

    public HeteroscedasticGaussian(double mean, double sigma, double floor)
    {
        Mean = mean; Sigma = Math.Max(sigma, floor); SigmaFloor = floor;
    }

    public readonly double LogDensity(double x, double v)
    {
        double t = Sigma * Sigma + v;
        double d = x - Mean;
        return -0.5 * (d * d / t + Math.Log(2 * Math.PI * t));
    }

    /// <summary>One ECM cycle over the stars <paramref name="rows"/> with weights weight(i).</summary>
    public void Update(double[] x, double[] v, int[] rows, Func<int, double> weight)
    {
        double s2 = Sigma * Sigma, a = 0, b = 0;
        foreach (int i in rows)
        {
            double w = weight(i) / (s2 + v[i]);
            a += w * x[i]; b += w;
        }
        if (!(b > 0)) return;
        Mean = a / b;
        double num = 0, den = 0, g = 0, gp = 0;
        foreach (int i in rows)
        {
            double w = weight(i), t = s2 + v[i];
            double d = x[i] - Mean;
            double shrink = s2 * d / t;
            num += w * (s2 * v[i] / t + shrink * shrink);
            den += w;
            g += w * (d * d - t) / (t * t);          // 2 x d lnL / d s^2
            gp += w * (t - 2 * d * d) / (t * t * t); // 2 x d^2 lnL / d (s^2)^2
        }
        if (!(den > 0)) return;
        double floor2 = SigmaFloor * SigmaFloor;
        double uEm = Math.Max(num / den, floor2);
        double uNt = gp < 0 ? Math.Max(s2 - g / gp, floor2) : uEm;
        double best = Math.Max(s2, floor2), lBest = WeightedLogL(x, v, rows, weight, best);
        foreach (double u in new[] { uEm, uNt })
        {
            double l = WeightedLogL(x, v, rows, weight, u);
            if (l > lBest) { lBest = l; best = u; }
        }
        Sigma = Math.Sqrt(best);
    }

    private readonly double WeightedLogL(double[] x, double[] v, int[] rows, Func<int, double> weight, double s2)
    {
        double l = 0;
        foreach (int i in rows)
        {
            double t = s2 + v[i], d = x[i] - Mean;
            l -= 0.5 * weight(i) * (d * d / t + Math.Log(t));
        }
        return l;
    }
}
