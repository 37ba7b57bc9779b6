using System.Globalization;
using Photometallicity.Errors;
using Photometallicity.Units;

namespace Photometallicity.Calibration;

/// <summary>Options of <see cref="ClusterMemberSelector"/>.</summary>
public sealed record ClusterSelectionOptions
{
    /// <summary>Degree of the ridge line colour(mag) (low order: 1-3).</summary>
    public int RidgeDegree { get; init; } = 2;

    /// <summary>Clipping limit while fitting the ridge line (robust sigmas).</summary>
    public double ClipSigma { get; init; } = 3.0;

    /// <summary>Stars within this many robust sigmas of the ridge line are kept as members.</summary>
    public double KeepSigma { get; init; } = 2.5;

    /// <summary>Optional magnitude window (blue0, mag): e.g. to keep to the red-giant branch above the horizontal branch.</summary>
    public double? BrightLimit { get; init; }
    public double? FaintLimit { get; init; }

    public int MaxIterations { get; init; } = 30;
}

/// <summary>One star's outcome: member or not, why, its distance from the centre and its colour offset from the ridge.</summary>
public sealed record ClusterStarVerdict(bool Member, string Reason, double RadiusArcmin, double ColourOffset, double OffsetSigma);

/// <summary>The members (indices into the input), every star's verdict, and the fitted ridge line.</summary>
public sealed record ClusterMembership(
    int[] Members,
    ClusterStarVerdict[] PerStar,
    double[] RidgeCoefficients,
    double RidgeMagCentre,
    double RidgeMagScale,
    double RidgeSigma,
    int Iterations)
{
    /// <summary>Ridge-line colour at magnitude <paramref name="mag"/>: sum_k c_k t^k, t = (mag - centre) / scale.</summary>
    public double RidgeColour(double mag)
    {
        double t = (mag - RidgeMagCentre) / RidgeMagScale, s = 0, tk = 1;
        foreach (double c in RidgeCoefficients) { s += c * tk; tk *= t; }
        return s;
    }
}

/// <summary>
/// Chooses the red-giant members of a cluster field for use as calibration standards: stars within the radius of
/// the centre, then a low-order polynomial ridge line colour0(blue0) fitted with iterative clipping, and the stars
/// within KeepSigma robust sigmas of it. The scatter about the ridge is 1.4826 times the median absolute deviation
/// of the kept residuals (a robust sigma, Rousseeuw &amp; Croux 1993, JASA 88, 1273; the factor makes it
/// consistent with a Gaussian sigma). The ridge fit is least squares in a scaled magnitude (common practice).
/// </summary>
public static class ClusterMemberSelector
{
    public static ClusterMembership Select(double[] raDeg, double[] decDeg, double[] colour0, double[] blue0,
        SkyPosition centre, Angle radius, ClusterSelectionOptions? options = null)
    {
        var o = options ?? new ClusterSelectionOptions();
        int n = raDeg.Length;
        Guard.SameLength(n, decDeg.Length, nameof(raDeg), nameof(decDeg));
        Guard.SameLength(n, colour0.Length, nameof(raDeg), nameof(colour0));
        Guard.SameLength(n, blue0.Length, nameof(raDeg), nameof(blue0));
        if (o.RidgeDegree < 1 || o.RidgeDegree > 3) throw new InputException($"cluster selection: ridge degree {o.RidgeDegree} is outside [1, 3].", column: "ridge_degree");

        var reason = new string?[n];
        var radiusArcmin = new double[n];
        var candidates = new List<int>();
        var (cx, cy, cz) = centre.ToUnitVector();
        for (int i = 0; i < n; i++)
        {
            radiusArcmin[i] = double.NaN;
            if (!double.IsFinite(raDeg[i]) || !double.IsFinite(decDeg[i]) || decDeg[i] < -90 || decDeg[i] > 90) { reason[i] = "position missing or invalid"; continue; }
            var (x, y, z) = SkyPosition.FromDegrees(raDeg[i], decDeg[i]).ToUnitVector();
            // Separation from the chord length: 2 asin(|d| / 2), accurate at all separations.
            double dx = x - cx, dy = y - cy, dz = z - cz;
            double sep = 2 * Math.Asin(Math.Min(1.0, 0.5 * Math.Sqrt(dx * dx + dy * dy + dz * dz)));
            radiusArcmin[i] = Angle.FromRadians(sep).Arcminutes;
            if (sep > radius.Radians) { reason[i] = Inv($"outside the cluster radius ({radiusArcmin[i]:F2} > {radius.Arcminutes:F2} arcmin)"); continue; }
            if (!double.IsFinite(colour0[i]) || !double.IsFinite(blue0[i])) { reason[i] = "colour or magnitude missing"; continue; }
            if (o.BrightLimit is { } bl && blue0[i] < bl) { reason[i] = Inv($"brighter than the magnitude window ({blue0[i]:F2} < {bl:F2} mag)"); continue; }
            if (o.FaintLimit is { } fl && blue0[i] > fl) { reason[i] = Inv($"fainter than the magnitude window ({blue0[i]:F2} > {fl:F2} mag)"); continue; }
            candidates.Add(i);
        }
        int p = o.RidgeDegree + 1;
        if (candidates.Count < p + 3)
            throw new MethodException($"Only {candidates.Count} stars with colour and magnitude lie within {radius.Arcminutes:F2} arcmin of the cluster centre; a degree-{o.RidgeDegree} ridge line needs at least {p + 3}.");

        double mmin = candidates.Min(i => blue0[i]), mmax = candidates.Max(i => blue0[i]);
        double mc = 0.5 * (mmin + mmax), ms = Math.Max(0.5 * (mmax - mmin), 1e-3);
        var keep = candidates.ToDictionary(i => i, _ => true);
        var coef = new double[p];
        var resid = new double[n];
        double sigma = double.NaN;
        int iter = 0;
        for (iter = 1; iter <= o.MaxIterations; iter++)
        {
            var kept = candidates.Where(i => keep[i]).ToArray();
            if (kept.Length < p + 2)
                throw new MethodException($"The ridge-line fit kept only {kept.Length} of {candidates.Count} stars (at least {p + 2} needed); the field has no clear red-giant branch.");
            if (!FitRidge(kept, colour0, blue0, mc, ms, coef))
                throw new MethodException($"The ridge-line fit is degenerate: the {kept.Length} kept stars span too little magnitude for degree {o.RidgeDegree}.");
            foreach (int i in candidates) resid[i] = colour0[i] - Ridge(coef, (blue0[i] - mc) / ms);
            sigma = RobustSigma(kept.Select(i => resid[i]).ToArray());
            if (!(sigma > 0)) sigma = 1e-6;
            bool changed = false;
            foreach (int i in candidates)
            {
                bool k = Math.Abs(resid[i]) <= o.ClipSigma * sigma;
                if (k != keep[i]) { keep[i] = k; changed = true; }
            }
            if (!changed) break;
        }

        var verdicts = new ClusterStarVerdict[n];
        var members = new List<int>();
        var isCandidate = new bool[n];
        foreach (int i in candidates) isCandidate[i] = true;
        for (int i = 0; i < n; i++)
        {
            if (!isCandidate[i]) { verdicts[i] = new ClusterStarVerdict(false, reason[i]!, radiusArcmin[i], double.NaN, double.NaN); continue; }
            double z = resid[i] / sigma;
            bool member = Math.Abs(z) <= o.KeepSigma;
            if (member) members.Add(i);
            verdicts[i] = new ClusterStarVerdict(member,
                member ? "member" : Inv($"colour {resid[i]:+0.000;-0.000} mag ({z:+0.0;-0.0} sigma) off the red-giant ridge line (limit {o.KeepSigma} sigma)"),
                radiusArcmin[i], resid[i], z);
        }
        return new ClusterMembership(members.ToArray(), verdicts, coef, mc, ms, sigma, Math.Min(iter, o.MaxIterations));
    }

    private static string Inv(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);

    private static double Ridge(double[] c, double t)
    {
        double s = 0, tk = 1;
        foreach (double v in c) { s += v * tk; tk *= t; }
        return s;
    }

    private static bool FitRidge(int[] kept, double[] colour, double[] mag, double mc, double ms, double[] coef)
    {
        int p = coef.Length;
        Span<double> a = stackalloc double[p * p];
        Span<double> tk = stackalloc double[p];
        a.Clear();
        Array.Clear(coef);
        foreach (int i in kept)
        {
            double t = (mag[i] - mc) / ms;
            tk[0] = 1;
            for (int k = 1; k < p; k++) tk[k] = tk[k - 1] * t;
            for (int r = 0; r < p; r++)
            {
                coef[r] += tk[r] * colour[i];
                for (int c = 0; c <= r; c++) a[r * p + c] += tk[r] * tk[c];
            }
        }
        if (!SmallCholesky.Factor(a, p)) return false;
        SmallCholesky.Solve(a, p, coef);
        return true;
    }

    private static double RobustSigma(double[] r)
    {
        double med = Median(r);
        var dev = r.Select(v => Math.Abs(v - med)).ToArray();
        return 1.4826 * Median(dev);
    }

    private static double Median(double[] v)
    {
        var s = v.Order().ToArray();
        int m = s.Length / 2;
        return s.Length % 2 == 1 ? s[m] : 0.5 * (s[m - 1] + s[m]);
    }
}
