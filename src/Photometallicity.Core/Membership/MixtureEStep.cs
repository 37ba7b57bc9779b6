namespace Photometallicity.Membership;

/// <summary>
/// The E-step: for every positioned star the log densities of both components,
///   ln A_i = ln f + ln[Sigma(x_i) / Phi] + ln p_t(c, m) + ln Z_t,i + ln p_t(pm) + ln p_t(parallax),
///   ln B_i = ln(1 - f) - ln(Area) + ln p_f(c, m) + ln Z_f,i + ln p_f(pm) + ln p_f(parallax),
/// (Phi: the profile's integral over the footprint; a term is left out, i.e. marginalised, where the star lacks that
/// measurement), the responsibility r_i = A_i / (A_i + B_i) in closed form, the log-likelihood sum ln(A_i + B_i), and
/// the sufficient statistics the M-steps need. Runs in fixed chunks with an ordered reduction (thread-count independent).
/// </summary>
internal static class MixtureEStep
{
    // accumulator layout
    public const int SumR = 0, LogL = 1, SumRMag = 2, SumRCmd = 3,
        TW = 4, TM1 = 5, TM2 = 6, FW = 7, FM1 = 8, FM2 = 9, Width = 10;

    /// <summary>ln(e^a + e^b) without overflow; -infinity when both are.</summary>
    public static double LogSumExp(double a, double b)
    {
        double mx = Math.Max(a, b);
        if (double.IsNegativeInfinity(mx)) return mx;
        return mx + Math.Log(Math.Exp(a - mx) + Math.Exp(b - mx));
    }

    /// <summary>Runs the E-step; writes r, and the non-spatial log terms of each component (for the Hessian) unless their arrays are empty.</summary>
    public static double[] Run(MixtureData d, MixtureParameters p, double[] fgCmdLog, bool useFeh, int threads,
        double[] r, double[] otherT, double[] otherF)
    {
        var ev = p.Profile.CreateEvaluator();
        double lnF = Math.Log(p.Fraction), lnF1 = Math.Log(1 - p.Fraction);
        double lnPhi = Math.Log(p.FootprintFraction), lnArea = Math.Log(d.Footprint.Area);
        bool feh = useFeh && d.Feh is not null && d.FehRows.Length > 0;
        var gt = feh ? new GaussianOnGrid(d.Feh!, p.MdfMean, p.MdfSigma) : null;
        var gf = feh ? new GaussianOnGrid(d.Feh!, p.FgMdfMean, p.FgMdfSigma) : null;
        var pos = d.Positioned;
        bool keepTerms = otherT.Length > 0;
        return ChunkedReduction.Sum(pos.Length, Width, threads, (a, b, acc) =>
        {
            for (int k = a; k < b; k++)
            {
                int i = pos[k];
                double ot = 0, of = 0;
                if (d.HasCmd[i])
                {
                    ot += p.Ridge.LogDensity(d.Colour[i], d.Mag[i], d.VarColour[i]) + p.Lf.LogDensity(d.Mag[i]);
                    of += fgCmdLog[i];
                }
                double m1t = 0, m2t = 0, m1f = 0, m2f = 0;
                bool hf = feh && d.HasFeh[i];
                if (hf)
                {
                    ot += Math.Log(Math.Max(gt!.Convolve(i, out m1t, out m2t), 1e-300));
                    of += Math.Log(Math.Max(gf!.Convolve(i, out m1f, out m2f), 1e-300));
                }
                if (d.HasPm[i])
                {
                    ot += p.PmRa.LogDensity(d.PmRa[i], d.VarPmRa[i]) + p.PmDec.LogDensity(d.PmDec[i], d.VarPmDec[i]);
                    of += p.FgPmRa.LogDensity(d.PmRa[i], d.VarPmRa[i]) + p.FgPmDec.LogDensity(d.PmDec[i], d.VarPmDec[i]);
                }
                if (d.HasPlx[i])
                {
                    double t = d.Plx[i] - p.Plx0;
                    ot += -0.5 * (t * t / d.VarPlx[i] + Math.Log(2 * Math.PI * d.VarPlx[i]));
                    of += p.FgPlx.LogDensity(d.Plx[i], d.VarPlx[i]);
                }
                if (keepTerms) { otherT[i] = ot; otherF[i] = of; }
                double la = lnF + Math.Log(ev.Density(d.X[i], d.Y[i])) - lnPhi + ot;
                double lb = lnF1 - lnArea + of;
                double ll = LogSumExp(la, lb);
                double ri = double.IsNegativeInfinity(ll) ? 0 : Math.Exp(la - ll);
                if (!double.IsNegativeInfinity(ll)) acc[LogL] += ll;
                r[i] = ri;
                acc[SumR] += ri;
                if (d.HasCmd[i]) { acc[SumRMag] += ri * d.Mag[i]; acc[SumRCmd] += ri; }
                if (hf)
                {
                    acc[TW] += ri; acc[TM1] += ri * m1t; acc[TM2] += ri * m2t;
                    double q = 1 - ri;
                    acc[FW] += q; acc[FM1] += q * m1f; acc[FM2] += q * m2f;
                }
            }
        });
    }
}
