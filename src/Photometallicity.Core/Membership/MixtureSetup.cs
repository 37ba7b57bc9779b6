namespace Photometallicity.Membership;

/// <summary>
/// Everything fixed before EM starts: the starting centre and radius, the outer region that defines the
/// foreground's CMD density, the parameter bounds and the initial parameters.
/// </summary>
internal sealed class MixtureSetup
{
    public required SpatialMStep.Bounds Bounds { get; init; }
    public required MixtureParameters Initial { get; init; }
    public required double OuterMultiple { get; init; }
    public required int OuterCount { get; init; }
    public required double InitialHalfLight { get; init; }
    private MixtureData D { get; init; } = null!;
    private int[] OuterRows { get; init; } = [];

    /// <summary>Minimum number of outer stars with a colour and magnitude for the foreground CMD density.</summary>
    public const int MinOuterStars = 100;

    public static MixtureSetup Create(MixtureData d, MembershipOptions o, List<string> warnings)
    {
        var fp = d.Footprint;
        double rh0;
        if (o.InitialHalfLightArcmin is { } given) rh0 = given;
        else
        {
            rh0 = 0.1 * Math.Sqrt(fp.Area / Math.PI);
            warnings.Add($"no initial half-light radius given: started from {rh0:F2} arcmin (a tenth of the field radius)");
        }
        var (cx, cy) = MixtureInitialiser.PeakNear(d, 0, 0, rh0);

        double mult = o.OuterRadiusMultiple;
        int[] outer = OuterOf(d, cx, cy, rh0, mult);
        if (outer.Length < MinOuterStars)
        {
            mult = Math.Min(mult, 2.0);
            outer = OuterOf(d, cx, cy, rh0, mult);
            if (outer.Length < MinOuterStars)
            {
                outer = d.CmdRows;
                mult = 0;
                warnings.Add($"fewer than {MinOuterStars} stars lie beyond 2 half-light radii: the foreground CMD density is taken from all stars and includes the target's own");
            }
            else warnings.Add($"fewer than {MinOuterStars} stars lie beyond {o.OuterRadiusMultiple} half-light radii: the foreground CMD density uses stars beyond 2");
        }

        double areaOuter = mult > 0 ? fp.Area - MixtureInitialiser.FootprintAreaWithin(fp, cx, cy, mult * rh0) : fp.Area;
        double areaIn = MixtureInitialiser.FootprintAreaWithin(fp, cx, cy, 1.5 * rh0);
        var inner = d.CmdRows.Where(i => Sq(d.X[i] - cx) + Sq(d.Y[i] - cy) <= Sq(1.5 * rh0)).ToArray();
        double ratio = areaOuter > 0 ? areaIn / areaOuter : 0;
        int nOuterAll = mult > 0 ? d.Positioned.Count(i => Sq(d.X[i] - cx) + Sq(d.Y[i] - cy) > Sq(mult * rh0)) : d.Positioned.Length;
        int nInAll = d.Positioned.Count(i => Sq(d.X[i] - cx) + Sq(d.Y[i] - cy) <= Sq(rh0));
        double areaR = MixtureInitialiser.FootprintAreaWithin(fp, cx, cy, rh0);
        double excess = nInAll - nOuterAll * (areaOuter > 0 ? areaR / areaOuter : 0);
        double f0 = Math.Clamp(2 * excess / d.Positioned.Length, 0.002, 0.9);

        const double colourWidthFloor = 0.005; // mag; keeps the ridge width away from zero (degeneracy guard)
        RidgeLine ridge;
        if (o.Fiducial is { } fid)
            ridge = new RidgeLine(fid.AbsoluteMag.Select(m => m + o.DistanceModulus).ToArray(), (double[])fid.Colour.Clone(),
                Math.Max(2 * d.Window.DC, 0.05), colourWidthFloor);
        else
            ridge = MixtureInitialiser.LearnedRidge(d, inner, outer, ratio, o.RidgeDegree, colourWidthFloor);

        var p = new MixtureParameters
        {
            Fraction = f0,
            Profile = new SurfaceDensityProfile(o.Profile, cx, cy, rh0, 0, 0),
            Ridge = ridge,
            Lf = new LuminosityFunction(d.Window.MLo, d.Window.MHi, 0),
            Plx0 = 1000.0 / Math.Pow(10.0, o.DistanceModulus / 5.0 + 1.0), // parallax (mas) = 1000 / d(pc), d = 10^(DM/5 + 1) pc
        };
        p.FootprintFraction = fp.Integrate(p.Profile.CreateEvaluator());
        InitialMetallicity(d, p, cx, cy, rh0);
        InitialAstrometry(d, p, cx, cy, rh0);

        double diag = Math.Sqrt(Sq(fp.Nx * fp.CellSize) + Sq(fp.Ny * fp.CellSize));
        double aMin = Math.Max(0.1 * rh0, 2 * Math.Sqrt(fp.Area / d.Positioned.Length));
        var bounds = new SpatialMStep.Bounds(fp.XMin, fp.XMin + fp.Nx * fp.CellSize, fp.YMin, fp.YMin + fp.Ny * fp.CellSize,
            Math.Log(Math.Min(aMin, 0.5 * rh0)), Math.Log(Math.Max(diag, 2 * rh0)), 0.9);
        return new MixtureSetup
        {
            Bounds = bounds, Initial = p, OuterMultiple = mult, OuterCount = outer.Length, InitialHalfLight = rh0,
            D = d, OuterRows = outer,
        };
    }

    /// <summary>
    /// Log foreground CMD density of every row: from the initial outer rows (weights 1) when <paramref name="fit"/> is
    /// null, else from the rows beyond the same multiple of the fitted elliptical radius, weighted by 1 - r.
    /// </summary>
    public double[] ForegroundCmdLog((double[] R, SurfaceDensityProfile Profile)? fit)
    {
        var d = D;
        ForegroundCmdDensity dens;
        if (fit is null || OuterMultiple == 0)
        {
            var r = fit?.R;
            dens = ForegroundCmdDensity.Build(d.Window, d.CmdBin, OuterRows, i => r is null ? 1.0 : 1 - r[i]);
        }
        else
        {
            var (r, prof) = fit.Value;
            var ev = prof.CreateEvaluator();
            double lim = OuterMultiple * prof.HalfLight;
            var rows = d.CmdRows.Where(i => ev.EllipticalRadius(d.X[i], d.Y[i]) > lim).ToArray();
            if (rows.Length < MinOuterStars) rows = OuterRows;
            dens = ForegroundCmdDensity.Build(d.Window, d.CmdBin, rows, i => 1 - r[i]);
        }
        var log = new double[d.RowCount];
        foreach (int i in d.CmdRows) log[i] = Math.Log(dens.Density(d.CmdBin[i]));
        return log;
    }

    private static int[] OuterOf(MixtureData d, double cx, double cy, double rh, double mult) =>
        d.CmdRows.Where(i => Sq(d.X[i] - cx) + Sq(d.Y[i] - cy) > Sq(mult * rh)).ToArray();

    private static double Sq(double v) => v * v;

    private static void InitialMetallicity(MixtureData d, MixtureParameters p, double cx, double cy, double rh)
    {
        p.MdfMean = -1.5; p.MdfSigma = 0.3; p.FgMdfMean = -0.5; p.FgMdfSigma = 0.5;
        if (d.Feh is null || d.FehRows.Length == 0) return;
        double si = 0, ni = 0, so = 0, so2 = 0, no = 0;
        foreach (int i in d.FehRows)
        {
            double m = d.FehMean(i);
            if (!double.IsFinite(m)) continue;
            if (Sq(d.X[i] - cx) + Sq(d.Y[i] - cy) <= rh * rh) { si += m; ni++; }
            else { so += m; so2 += m * m; no++; }
        }
        if (ni > 0) p.MdfMean = si / ni;
        if (no > 1)
        {
            p.FgMdfMean = so / no;
            p.FgMdfSigma = Math.Max(Math.Sqrt(Math.Max(so2 / no - Sq(so / no), 0)), 0.3);
        }
        double floor = MdfEstimator.SigmaFloor(d.Feh);
        p.MdfSigma = Math.Max(p.MdfSigma, floor);
        p.FgMdfSigma = Math.Max(p.FgMdfSigma, floor);
    }

    private static void InitialAstrometry(MixtureData d, MixtureParameters p, double cx, double cy, double rh)
    {
        double Inner(int i) => Sq(d.X[i] - cx) + Sq(d.Y[i] - cy) <= rh * rh ? 1.0 : 0.0;
        p.PmRa = new HeteroscedasticGaussian(0, 1, 1e-3);
        p.PmDec = new HeteroscedasticGaussian(0, 1, 1e-3);
        p.FgPmRa = new HeteroscedasticGaussian(0, 5, 1e-2);
        p.FgPmDec = new HeteroscedasticGaussian(0, 5, 1e-2);
        p.FgPlx = new HeteroscedasticGaussian(0.5, 1, 1e-2);
        for (int k = 0; k < 20 && d.PmRows.Length > 0; k++)
        {
            p.PmRa.Update(d.PmRa, d.VarPmRa, d.PmRows, Inner);
            p.PmDec.Update(d.PmDec, d.VarPmDec, d.PmRows, Inner);
            p.FgPmRa.Update(d.PmRa, d.VarPmRa, d.PmRows, i => 1 - Inner(i));
            p.FgPmDec.Update(d.PmDec, d.VarPmDec, d.PmRows, i => 1 - Inner(i));
        }
        for (int k = 0; k < 20 && d.PlxRows.Length > 0; k++)
            p.FgPlx.Update(d.Plx, d.VarPlx, d.PlxRows, i => 1 - Inner(i));
    }
}
