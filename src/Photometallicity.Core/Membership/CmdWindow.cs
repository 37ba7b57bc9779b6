namespace Photometallicity.Membership;

/// <summary>
/// The colour-magnitude window of the fit and a binned Hess diagram on it. The window spans the 0.1st to 99.9th
/// percentile of the usable stars in each axis, widened by 2% (robust against a few wild photometric values).
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

    public static CmdWindow FromData(double[] colour, double[] mag, int[] rows, int nc, int nm)
    {
        var c = rows.Select(i => colour[i]).Order().ToArray();
        var m = rows.Select(i => mag[i]).Order().ToArray();
        (double lo, double hi) Range(double[] s)
        {
            double lo = s[(int)(0.001 * (s.Length - 1))], hi = s[(int)Math.Ceiling(0.999 * (s.Length - 1))];
            double pad = Math.Max(0.02 * (hi - lo), 1e-3);
            return (lo - pad, hi + pad);
        }
        var (cl, ch) = Range(c);
        var (ml, mh) = Range(m);
        return new CmdWindow(cl, ch, ml, mh, nc, nm);
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
