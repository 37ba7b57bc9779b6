using MathNet.Numerics.Distributions;

namespace Photometallicity.Membership;

/// <summary>
/// Turns a converged mixture into the stage result: membership probabilities by row, the structure with errors
/// (<see cref="StructureUncertainty"/>), and the test against a foreground-only model: its parameters (foreground
/// metallicity and astrometry Gaussians) are refitted to all stars, and TS = 2 (ln L - ln L0) is referred to a
/// chi-square with as many degrees of freedom as the target adds (Wilks 1938, Ann. Math. Stat. 9, 60). The target's
/// parameters are undefined under the null, so this reference distribution is only approximate (Davies 1987,
/// Biometrika 74, 33); the threshold is applied with that in mind.
/// </summary>
internal static class MembershipReport
{
    public static MembershipResult Build(MixtureData d, MixtureSetup setup, MembershipOptions o, MixtureFit fit, List<string> warnings)
    {
        var p = fit.Parameters;
        var em = fit.Em;
        var pm = new double[d.RowCount];
        Array.Fill(pm, double.NaN);
        double expected = 0;
        foreach (int i in d.Positioned) { pm[i] = em.R[i]; expected += em.R[i]; }

        var cov = StructureUncertainty.Covariance(d, p, em.OtherT, em.OtherF, o.MaxThreads);
        var prof = p.Profile;
        double e = prof.Ellipticity, pa = prof.PositionAngle;
        double Err(int k) => cov is null ? double.NaN : Math.Sqrt(cov[k, k]);
        double eErr = double.NaN, paErr = double.NaN;
        if (cov is not null && e > 1e-9)
        {
            // e = |k|, theta = atan2(k2, k1) / 2: propagate the (k1, k2) covariance
            double k1 = prof.K1, k2 = prof.K2;
            double[] je = [k1 / e, k2 / e];
            double[] jt = [-0.5 * k2 / (e * e), 0.5 * k1 / (e * e)];
            double Q(double[] a, double[] b) => a[0] * b[0] * cov[3, 3] + (a[0] * b[1] + a[1] * b[0]) * cov[3, 4] + a[1] * b[1] * cov[4, 4];
            eErr = Math.Sqrt(Math.Max(Q(je, je), 0));
            paErr = Math.Sqrt(Math.Max(Q(jt, jt), 0)) * 180 / Math.PI;
        }
        else if (cov is not null) eErr = Math.Sqrt(0.5 * (cov[3, 3] + cov[4, 4]));
        if (cov is null) warnings.Add("structural errors unavailable: the log-likelihood is not curved at the fit (parameter at a bound or no target)");
        int n = d.Positioned.Length;
        var structure = new StructureFit(prof.Kind, d.Plane.Deproject(prof.X0, prof.Y0), Err(0), Err(1), prof.HalfLight,
            prof.HalfLight * Err(2), e, eErr, pa * 180 / Math.PI, paErr, p.Fraction * n, n * Err(5), p.FootprintFraction);

        double ll0 = ForegroundOnlyLogLikelihood(d, p, fit.ForegroundCmdLog, em.UsesFeh, o.MaxThreads);
        double ts = Math.Max(2 * (em.LogLikelihood - ll0), 0);
        int k = 6 + (p.Ridge.IsFiducial ? 0 : p.Ridge.Degree + 1) + 1 + 1 + (em.UsesFeh ? 2 : 0) + (d.PmRows.Length > 0 ? 4 : 0);
        double pval = 1 - ChiSquared.CDF(k, ts);
        bool significant = pval < MembershipFitter.DetectionPValue;
        if (!significant)
            warnings.Add($"no significant galaxy: expected members {expected:F1}" +
                         (double.IsFinite(structure.MemberCountErr) ? $" +/- {structure.MemberCountErr:F1}" : " (error unavailable)") + " consistent with zero " +
                         $"(2 dlnL = {ts:F1} against a foreground-only model, p = {pval:G2} for {k} target parameters)");
        if (prof.HalfLight <= Math.Exp(setup.Bounds.LnAMin) * 1.001)
            warnings.Add($"the half-light radius hit its lower bound ({prof.HalfLight:F3} arcmin)");

        var w = d.Window;
        var rm = new double[21];
        var rc = new double[21];
        for (int j = 0; j < rm.Length; j++) { rm[j] = w.MLo + j * (w.MHi - w.MLo) / 20; rc[j] = p.Ridge.Colour(rm[j]); }
        return new MembershipResult
        {
            PMember = pm, Structure = structure, ExpectedMembers = expected, LogLikelihood = em.LogLikelihood,
            ForegroundOnlyLogLikelihood = ll0, TestStatistic = ts, NoTargetPValue = pval, Significant = significant,
            RidgeMag = rm, RidgeColour = rc, RidgeWidth = p.Ridge.SigmaInt, FootprintAreaArcmin2 = d.Footprint.Area,
            ForegroundMdf = em.UsesFeh ? (p.FgMdfMean, p.FgMdfSigma) : null,
            Warnings = warnings.ToArray(), Iterations = fit.Iterations, Converged = fit.Converged,
        };
    }

    private static double ForegroundOnlyLogLikelihood(MixtureData d, MixtureParameters fitted, double[] fgCmdLog, bool useFeh, int threads)
    {
        var p = fitted.Clone();
        var ones = new double[d.RowCount];
        Array.Fill(ones, 1.0);
        if (useFeh)
        {
            var fit = MdfEstimator.Fit(d.Feh!, ones, d.FehRows, p.FgMdfMean, p.FgMdfSigma, threads, 200);
            p.FgMdfMean = fit.Mean; p.FgMdfSigma = fit.Sigma;
        }
        for (int it = 0; it < 50 && d.PmRows.Length > 0; it++)
        {
            p.FgPmRa.Update(d.PmRa, d.VarPmRa, d.PmRows, _ => 1.0);
            p.FgPmDec.Update(d.PmDec, d.VarPmDec, d.PmRows, _ => 1.0);
        }
        for (int it = 0; it < 50 && d.PlxRows.Length > 0; it++) p.FgPlx.Update(d.Plx, d.VarPlx, d.PlxRows, _ => 1.0);
        var gf = useFeh ? new GaussianOnGrid(d.Feh!, p.FgMdfMean, p.FgMdfSigma) : null;
        double lnArea = Math.Log(d.Footprint.Area);
        var pos = d.Positioned;
        var s = ChunkedReduction.Sum(pos.Length, 1, threads, (a, b, acc) =>
        {
            double q = 0;
            for (int k = a; k < b; k++)
            {
                int i = pos[k];
                double l = -lnArea;
                if (d.HasCmd[i]) l += fgCmdLog[i];
                if (gf is not null && d.HasFeh[i]) l += Math.Log(Math.Max(gf.Convolve(i), 1e-300));
                if (d.HasPm[i]) l += p.FgPmRa.LogDensity(d.PmRa[i], d.VarPmRa[i]) + p.FgPmDec.LogDensity(d.PmDec[i], d.VarPmDec[i]);
                if (d.HasPlx[i]) l += p.FgPlx.LogDensity(d.Plx[i], d.VarPlx[i]);
                q += l;
            }
            acc[0] = q;
        });
        return s[0];
    }
}
