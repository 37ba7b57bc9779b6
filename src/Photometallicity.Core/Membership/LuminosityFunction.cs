namespace Photometallicity.Membership;

/// <summary>
/// The members' magnitude distribution on the CMD window [Lo, Hi]: a truncated exponential
/// p(m) = beta exp(beta (m - Lo)) / (exp(beta (Hi - Lo)) - 1), the usual approximation of a red-giant-branch
/// luminosity function (number counts rising exponentially towards faint magnitudes; common practice).
/// The weighted maximum-likelihood beta equates the model mean with the weighted mean magnitude; the model
/// mean rises monotonically with beta, so bisection finds it.
/// </summary>
internal readonly record struct LuminosityFunction(double Lo, double Hi, double Beta)
{
    public double LogDensity(double m)
    {
        if (m < Lo || m > Hi) return double.NegativeInfinity;
        double w = Hi - Lo;
        if (Math.Abs(Beta * w) < 1e-8) return -Math.Log(w);
        // log(beta e^{beta (m-Lo)} / (e^{beta w} - 1)), written stably for either sign of beta
        double t = Beta * (m - Lo);
        double bw = Beta * w;
        double logDen = bw > 0 ? bw + Math.Log(-double.ExpM1(-bw)) : Math.Log(-double.ExpM1(bw));
        return Math.Log(Math.Abs(Beta)) + t - logDen;
    }

    public static double MeanOffset(double beta, double w)
    {
        // E[m - Lo] for the truncated exponential on [0, w]
        double bw = beta * w;
        if (Math.Abs(bw) < 1e-6) return 0.5 * w + beta * w * w / 12.0;
        return w / -double.ExpM1(-bw) - 1.0 / beta;
    }

    /// <summary>Weighted MLE of beta given the weighted mean magnitude.</summary>
    public LuminosityFunction Fit(double weightedMean)
    {
        double w = Hi - Lo;
        double target = Math.Clamp(weightedMean - Lo, 0.02 * w, 0.98 * w);
        double lo = -60.0 / w, hi = 60.0 / w;
        for (int k = 0; k < 100; k++)
        {
            double mid = 0.5 * (lo + hi);
            if (MeanOffset(mid, w) < target) lo = mid; else hi = mid;
        }
        return this with { Beta = 0.5 * (lo + hi) };
    }
}
