namespace Photometallicity.Membership;

/// <summary>
/// The EM iteration of the two-component mixture (Dempster, Laird &amp; Rubin 1977, JRSS B 39, 1). EM suits this
/// model because (i) the responsibilities are closed-form given the parameters (<see cref="MixtureEStep"/>), (ii) each
/// iteration cannot lower the likelihood, so the fit ascends monotonically from any start, and (iii) with the
/// responsibilities fixed the M-step splits into independent sub-problems: the fraction (closed form, f = sum r / N),
/// the spatial profile (numerical: <see cref="SpatialMStep"/>), the ridge line and its width, the luminosity-function
/// slope, the two metallicity Gaussians (EM updates on the latent [Fe/H]) and the proper-motion / parallax Gaussians
/// (ECM updates). Every sub-step is a conditional maximisation or an EM step of its own, so the ascent is kept
/// (generalised EM / ECM, Meng &amp; Rubin 1993, Biometrika 80, 267).
/// </summary>
internal sealed class MixtureEm
{
    private readonly MixtureData _d;
    private readonly SpatialMStep.Bounds _bounds;
    private readonly int _threads;
    private readonly bool _useFeh;

    /// <summary>
    /// An EM over the rows of <paramref name="d"/>. With <paramref name="keepTerms"/> each star's non-spatial log terms
    /// (<see cref="OtherT"/>, <see cref="OtherF"/>, 16 bytes a row) are kept for the structural uncertainties; a fit that is
    /// not reported with them leaves them empty.
    /// </summary>
    public MixtureEm(MixtureData d, SpatialMStep.Bounds bounds, bool useFeh, int threads, bool keepTerms = true)
    {
        _d = d; _bounds = bounds; _useFeh = useFeh && d.Feh is not null && d.FehRows.Length > 0; _threads = threads;
        R = new double[d.RowCount];
        OtherT = keepTerms ? new double[d.RowCount] : [];
        OtherF = keepTerms ? new double[d.RowCount] : [];
    }

    /// <summary>Change of ln L per iteration (besides the per-star part) below which EM stops: far below the 0.5 of a 1-sigma change.</summary>
    public const double AbsoluteTolerance = 1e-4;

    public double[] R { get; }
    /// <summary>The target's non-spatial log terms per row (empty unless kept).</summary>
    public double[] OtherT { get; }
    public double[] OtherF { get; }
    public double LogLikelihood { get; private set; }
    public double[] LastStats { get; private set; } = [];
    public bool UsesFeh => _useFeh;

    /// <summary>Iterates to convergence; on return R is consistent with <paramref name="p"/>.</summary>
    public (int Iterations, bool Converged) Iterate(MixtureParameters p, double[] fgCmdLog, int maxIter, double tolPerStar)
    {
        double tol = tolPerStar * _d.Positioned.Length + AbsoluteTolerance;
        double prev = double.NegativeInfinity;
        var lastMove = new double[] { 0.1 * p.Profile.HalfLight, 0.1 * p.Profile.HalfLight, 0.1, 0.05, 0.05 };
        _spatialGain = double.PositiveInfinity;
        _sinceSpatial = -1;
        for (int it = 1; it <= maxIter; it++)
        {
            var acc = MixtureEStep.Run(_d, p, fgCmdLog, _useFeh, _threads, R, OtherT, OtherF);
            LastStats = acc;
            LogLikelihood = acc[MixtureEStep.LogL];
            if (Math.Abs(LogLikelihood - prev) <= tol)
            {
                if (_sinceSpatial == 0) return (it, true);
                _sinceSpatial = 4; // converged with the spatial step skipped: run it before stopping
            }
            prev = LogLikelihood;
            MStep(p, acc, lastMove);
        }
        LastStats = MixtureEStep.Run(_d, p, fgCmdLog, _useFeh, _threads, R, OtherT, OtherF);
        LogLikelihood = LastStats[MixtureEStep.LogL];
        return (maxIter, false);
    }

    private void MStep(MixtureParameters p, double[] acc, double[] lastMove)
    {
        var d = _d;
        int n = d.Positioned.Length;
        p.Fraction = Math.Clamp(acc[MixtureEStep.SumR] / n, 1e-9, 1 - 1e-9);

        // The spatial search is the costly sub-step; once it gains little it runs every fourth iteration only
        // (skipping a sub-step keeps the ascent: the parameters simply stay where they are).
        _sinceSpatial++;
        if (_spatialGain > SpatialGainForEveryIteration || _sinceSpatial >= 4) SpatialStep(p, lastMove);
        p.Ridge.Update(d.Mag, d.Colour, d.VarColour, d.CmdRows, R);

        if (acc[MixtureEStep.SumRCmd] > 1e-9) p.Lf = p.Lf.Fit(acc[MixtureEStep.SumRMag] / acc[MixtureEStep.SumRCmd]);

        if (_useFeh)
        {
            double floor = MdfEstimator.SigmaFloor(d.Feh!);
            (p.MdfMean, p.MdfSigma) = MdfEstimator.Update(acc[MixtureEStep.TW], acc[MixtureEStep.TM1], acc[MixtureEStep.TM2], floor, p.MdfMean, p.MdfSigma);
            (p.FgMdfMean, p.FgMdfSigma) = MdfEstimator.Update(acc[MixtureEStep.FW], acc[MixtureEStep.FM1], acc[MixtureEStep.FM2], floor, p.FgMdfMean, p.FgMdfSigma);
        }
        if (d.PmRows.Length > 0)
        {
            var r = R;
            p.PmRa.Update(d.PmRa, d.VarPmRa, d.PmRows, i => r[i]);
            p.PmDec.Update(d.PmDec, d.VarPmDec, d.PmRows, i => r[i]);
            p.FgPmRa.Update(d.PmRa, d.VarPmRa, d.PmRows, i => 1 - r[i]);
            p.FgPmDec.Update(d.PmDec, d.VarPmDec, d.PmRows, i => 1 - r[i]);
        }
        if (d.PlxRows.Length > 0)
        {
            var r = R;
            p.FgPlx.Update(d.Plx, d.VarPlx, d.PlxRows, i => 1 - r[i]);
        }
    }

    private const double SpatialGainForEveryIteration = 0.05;
    private double _spatialGain;
    private int _sinceSpatial;

    private void SpatialStep(MixtureParameters p, double[] lastMove)
    {
        var before = p.Profile;
        p.Profile = SpatialMStep.Run(_d, R, p.Profile, _bounds, _threads, 120, out double phi, lastMove, out double gain);
        p.FootprintFraction = phi;
        _spatialGain = gain;
        _sinceSpatial = 0;
        var now = p.Profile;
        double rh = now.HalfLight;
        // next simplex: a few times the last move, never below a small fraction of the scale
        lastMove[0] = Math.Max(3 * Math.Abs(now.X0 - before.X0), 0.005 * rh);
        lastMove[1] = Math.Max(3 * Math.Abs(now.Y0 - before.Y0), 0.005 * rh);
        lastMove[2] = Math.Max(3 * Math.Abs(Math.Log(now.HalfLight / before.HalfLight)), 0.005);
        lastMove[3] = Math.Max(3 * Math.Abs(now.K1 - before.K1), 0.003);
        lastMove[4] = Math.Max(3 * Math.Abs(now.K2 - before.K2), 0.003);
    }
}
