namespace Photometallicity.Membership;

/// <summary>
/// A Gaussian of mean mu and intrinsic dispersion s observed with per-star error variances v_i:
/// x_i ~ N(mu, s^2 + v_i). One weighted ECM cycle (Meng &amp; Rubin 1993, Biometrika 80, 267) with fixed weights w_i:
/// mu' = sum w x / (s^2 + v) / sum w / (s^2 + v) (exact maximiser at fixed s), then, with the true value as the
/// latent variable, s'^2 = sum w [s^2 v / (s^2 + v) + (s^2 (x - mu') / (s^2 + v))^2] / sum w (the EM step of the
/// classical measurement-error model). Both steps never lower the weighted likelihood.
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
        double num = 0, den = 0;
        foreach (int i in rows)
        {
            double w = weight(i), t = s2 + v[i];
            double shrink = s2 * (x[i] - Mean) / t;
            num += w * (s2 * v[i] / t + shrink * shrink);
            den += w;
        }
        if (den > 0) Sigma = Math.Max(Math.Sqrt(num / den), SigmaFloor);
    }
}
