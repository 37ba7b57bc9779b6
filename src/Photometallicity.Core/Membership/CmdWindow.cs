namespace Photometallicity.Membership;

/// <summary>
/// The colour-magnitude window of the fit and a binned Hess diagram on it. The window spans the 0.1st to 99.9th
/// percentile of the usable stars in each axis, widened by 2% (robust against a few wild photometric values).
/// The bins are half the smoothing bandwidth of each axis, h = s n^(-1/6) with s = min(standard deviation,
/// interquartile range / 1.349) (Scott's rule for a 2-D Gaussian kernel, Scott 1992, "Multivariate Density
/// Estimation", eq. 6.42, with Silverman's 1986 robust spread), at most <see cref="MaxBins"/> bins per axis.
/// </summary>
internal sealed class CmdWindow
{
    public CmdWindow(double cLo, double cHi, double mLo, double mHi, int nc, int nm)
    {
        CLo = cLo; CHi = cHi; MLo = mLo; MHi = mHi; Nc = nc; Nm = nm;
    }

    public double CLo { get; }
    public double CHi { get; }
    public double MLo { get; }
    public double MHi { get; }
    public int Nc { get; }
    public int Nm { get; }
    public double DC => (CHi - CLo) / Nc;
    public double DM => (MHi - MLo) / Nm;

    public const int MaxBins = 160;

    /// <summary>Kernel width of the smoothing, in bins (the bins are half a bandwidth).</summary>
    public const double KernelBins = 2.0;

    public static CmdWindow FromData(double[] colour, double[] mag, int[] rows)
    {
        var c = rows.Select(i => colour[i]).Order().ToArray();
        var m = rows.Select(i => mag[i]).Order().ToArray();
        double factor = Math.Pow(rows.Length, -1.0 / 6.0);
        (double lo, double hi) Range(double[] s)
        {
            double lo = s[(int)(0.001 * (s.Length - 1))], hi = s[(int)Math.Ceiling(0.999 * (s.Length - 1))];
            double pad = Math.Max(0.02 * (hi - lo), 1e-3);
            return (lo - pad, hi + pad);
        }
        var (cl, ch) = Range(c);
        var (ml, mh) = Range(m);
        int nc = Bins(c, cl, ch, factor), nm = Bins(m, ml, mh, factor);
        return new CmdWindow(cl, ch, ml, mh, nc, nm);
    }

    private static int Bins(double[] sorted, double lo, double hi, double factor)
    {
        int n = sorted.Length;
        double mean = sorted.Average();
        double sd = Math.Sqrt(sorted.Sum(v => (v - mean) * (v - mean)) / Math.Max(n - 1, 1));
        double iqr = sorted[(int)(0.75 * (n - 1))] - sorted[(int)(0.25 * (n - 1))];
        double s = Math.Min(sd, iqr / 1.349);
        if (!(s > 0)) s = sd > 0 ? sd : (hi - lo) / 10;
        double h = s * factor;
        return Math.Clamp((int)Math.Ceiling((hi - lo) / (h / KernelBins)), 8, MaxBins);
    }

    /// <summary>Flat bin index of (colour, mag), or -1 outside the window.</summary>
    public int Bin(double colour, double mag)
    {
        if (!(colour >= CLo && colour < CHi && mag >= MLo && mag < MHi)) return -1;
        int ic = Math.Min((int)((colour - CLo) / DC), Nc - 1), im = Math.Min((int)((mag - MLo) / DM), Nm - 1);
        return im * Nc + ic;
    }

    public bool InMagRange(double mag) => mag >= MLo && mag <= MHi;
}
