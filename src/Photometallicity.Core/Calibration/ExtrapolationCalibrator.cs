namespace Photometallicity.Calibration;

/// <summary>
/// Measures how fast the calibration's error grows beyond the standards (<see cref="Extrapolation"/>), from the standards
/// themselves: the bluest <see cref="HoldOutShare"/> of the accepted standards are held out, the chosen model form is refitted to
/// the rest (on a basis placed on the rest), and the held-out standards' residuals across the gap are fitted by
///   r_i ~ N(0, V_i + t_i^T Cov t_i + (kappa d_i)^2)
/// (V_i the effective variance, t_i^T Cov t_i the fit's own prediction variance from its inverse Fisher matrix, d_i the colour
/// distance from the convex hull of the training standards at the held-out standard's [Fe/H]), by maximum likelihood in kappa (Brent in ln kappa, or kappa = 0 when that is better);
/// likewise the reddest share; the two sides give one KappaColour (joint likelihood). For [Fe/H], the most metal-poor and most
/// metal-rich shares are held out and the extra variance is (kappa_F |df/dF|_edge d_F)^2 with d_F the [Fe/H] distance beyond the
/// training standards' hull at the held-out colour and the slope taken at the hull's edge. Standards the fit calls outliers (p_outlier &gt; 0.5) are not
/// used. Held-out-region cross-validation: a way to measure how prediction error grows with distance from the data (a common
/// practice; the growth linear in the distance is a project choice, the first term of any smooth model error).
/// </summary>
internal static class ExtrapolationCalibrator
{
    /// <summary>Share of the accepted standards held out on each side (project choice), at least <see cref="MinHeldOut"/>.</summary>
    public const double HoldOutShare = 0.2;
    public const int MinHeldOut = 6;

    /// <summary>Upper bound of the kappas searched: 10 mag of index per mag of colour, e^10 in sensitivity (no real limit).</summary>
    private const double KappaMax = 10;

    internal sealed record Outcome(double KappaColour, double KappaFeh, int HeldOutColour, int HeldOutFeh, string Note)
    {
        /// <summary>The colour error's quadratic term (mag of index per mag^2 of colour): sigma = KappaColour d + KappaColour2 d^2.</summary>
        public double KappaColour2 { get; init; }

        /// <summary>ln N(r; 0, V + t'Ct + (kappa D)^2) of each held-out standard across the gaps at the fitted kappas, keyed by
        /// (side + 1) * N + standard (side 0-3: blue, red, metal-poor, metal-rich).</summary>
        public IReadOnlyDictionary<long, double> GapLogLikelihoods { get; init; } = new Dictionary<long, double>();
    }

    public static Outcome Run(FitData d, int[] accepted, ModelSpec spec, bool outliers)
    {
        var colourGaps = new List<(double R, double V, double D, long Key)>();
        var fehGaps = new List<(double R, double V, double D, long Key)>();
        int nHold = Math.Max(MinHeldOut, (int)Math.Round(HoldOutShare * accepted.Length));
        string note = "";
        if (accepted.Length - nHold < spec.Count + 2)
            return new Outcome(0, 0, 0, 0, $"too few accepted standards ({accepted.Length}) to hold out {nHold} on a side; the model-form error beyond the standards is not measured and is taken as zero");
        var byColour = accepted.OrderBy(i => d.C[i]).ThenBy(i => i).ToArray();
        var byFeh = accepted.OrderBy(i => d.F[i]).ThenBy(i => i).ToArray();
        Side(d, byColour.Take(nHold).ToArray(), byColour.Skip(nHold).ToArray(), spec, outliers, colourGaps, colour: true, side: 0);
        Side(d, byColour.Skip(accepted.Length - nHold).ToArray(), byColour.Take(accepted.Length - nHold).ToArray(), spec, outliers, colourGaps, colour: true, side: 1);
        // Wider colour gaps too (twice the share), so that the growth is measured over a range of distances and a curved misfit,
        // whose error grows as d^2, is seen as such.
        int nWide = 2 * nHold;
        if (accepted.Length - nWide >= spec.Count + 2)
        {
            Side(d, byColour.Take(nWide).ToArray(), byColour.Skip(nWide).ToArray(), spec, outliers, colourGaps, colour: true, side: 4);
            Side(d, byColour.Skip(accepted.Length - nWide).ToArray(), byColour.Take(accepted.Length - nWide).ToArray(), spec, outliers, colourGaps, colour: true, side: 5);
        }
        Side(d, byFeh.Take(nHold).ToArray(), byFeh.Skip(nHold).ToArray(), spec, outliers, fehGaps, colour: false, side: 2);
        Side(d, byFeh.Skip(accepted.Length - nHold).ToArray(), byFeh.Take(accepted.Length - nHold).ToArray(), spec, outliers, fehGaps, colour: false, side: 3);
        var (kc, kc2) = Kappa2(colourGaps);
        double kf = Kappa(fehGaps);
        var points = new Dictionary<long, double>();
        foreach (var (r, v, dd, key) in colourGaps) if (key < 4L * d.N) points[key] = PointLogLikelihood(r, v, kc * dd + kc2 * dd * dd);
        foreach (var (r, v, dd, key) in fehGaps) points[key] = PointLogLikelihood(r, v, kf * dd);
        return new Outcome(kc, kf, colourGaps.Count, fehGaps.Count, note) { GapLogLikelihoods = points, KappaColour2 = kc2 };
    }

    private static void Side(FitData d, int[] held, int[] train, ModelSpec spec, bool outliers, List<(double R, double V, double D, long Key)> gaps, bool colour, int side)
    {
        var tc = train.Select(i => d.C[i]).ToArray();
        var tf = train.Select(i => d.F[i]).ToArray();
        var basis = spec.Build(tc, tf);
        if (basis is null) return;
        if (basis is SeparableBasis sb)
        {
            var tw = new double[d.N];
            foreach (int i in train) tw[i] = 1;
            basis = SeparableModelSpec.Profile(d, tw, outliers, sb);
        }
        var fit = new MixtureFit(d, basis, outliers);
        var w = new double[d.N];
        foreach (int i in train) w[i] = 1;
        if (fit.Fit(w) is not null) return;
        int p = basis.Count;
        var cov = new double[p * p];
        if (!fit.Covariance(cov)) return;
        var coef = fit.Coefficients.ToArray();
        Span<double> t = stackalloc double[p];
        var hull = new Extrapolation(new ValidityDomain(ValidityDomain.ConvexHull(tc.Zip(tf)), []), 0, 0, []);
        foreach (int i in held)
        {
            fit.HeldOutLogLikelihood(i, out double r, out double v);
            double slopeAt = basis.Gradient(coef, d.C[i], d.F[i]).DFeh;
            basis.Terms(d.C[i], d.F[i], t);
            double vp = 0;
            for (int a = 0; a < p; a++)
                for (int b = 0; b < p; b++) vp += t[a] * cov[a * p + b] * t[b];
            double dist;
            if (colour) dist = Math.Abs(hull.ColourDistance(d.C[i], d.F[i]));
            else
            {
                var (lo, hi) = hull.FehEdges(d.C[i]);
                double edge = d.F[i] < lo ? lo : hi;
                double df = d.F[i] < lo ? lo - d.F[i] : d.F[i] > hi ? d.F[i] - hi : 0;
                double slope = Math.Abs(basis.Gradient(coef, Math.Clamp(d.C[i], hull.ColourLo, hull.ColourHi), edge).DFeh);
                dist = slope * df;
            }
            // A held-out standard more likely an outlier than not under the training fit's mixture is not the model's error.
            double vt = v + vp, vb = vt + Math.Max(MixtureFit.BadFehSigma * MixtureFit.BadFehSigma * slopeAt * slopeAt, 3 * vt);
            double good = (1 - fit.OutlierFraction) * Math.Exp(-0.5 * r * r / vt) / Math.Sqrt(vt), bad = fit.OutlierFraction * Math.Exp(-0.5 * r * r / vb) / Math.Sqrt(vb);
            if (bad > good) continue;
            if (dist > 0) gaps.Add((r, vt, dist, (side + 1L) * d.N + i));
        }
    }

    private static double PointLogLikelihood(double r, double v, double sigma)
    {
        double tot = v + sigma * sigma;
        return -0.5 * (r * r / tot + Math.Log(2 * Math.PI * tot));
    }

    /// <summary>
    /// Maximum-likelihood (k1, k2) &gt;= 0 for r ~ N(0, V + (k1 D + k2 D^2)^2): k2 on a grid (0 and 40 values from 1e-3 to 30,
    /// logarithmic), k1 by <see cref="Kappa"/>-like Brent search for each; the growth's first two Taylor terms (project choice).
    /// </summary>
    private static (double K1, double K2) Kappa2(List<(double R, double V, double D, long Key)> gaps)
    {
        if (gaps.Count < 3) return (0, 0);
        double Nll(double k1, double k2)
        {
            double s = 0;
            foreach (var (r, v, dd, _) in gaps) { double sg = k1 * dd + k2 * dd * dd, tot = v + sg * sg; s += r * r / tot + Math.Log(tot); }
            return s;
        }
        (double, double) best = (0, 0);
        double bestNll = Nll(0, 0);
        for (int g = -1; g < 40; g++)
        {
            double k2 = g < 0 ? 0 : 1e-3 * Math.Pow(3e4, g / 39.0);
            double ln = BrentMinimizer.Minimize(static (f, x) => f(Math.Exp(x)), (Func<double, double>)(k1 => Nll(k1, k2)), Math.Log(1e-4), Math.Log(KappaMax), 1e-4);
            foreach (double k1 in new[] { 0.0, Math.Exp(ln) })
            {
                double v = Nll(k1, k2);
                if (v < bestNll) { bestNll = v; best = (k1, k2); }
            }
        }
        return best;
    }

    /// <summary>Maximum-likelihood kappa for r ~ N(0, V + (kappa D)^2); 0 when the gaps show no extra error.</summary>
    private static double Kappa(List<(double R, double V, double D, long Key)> gaps)
    {
        if (gaps.Count < 3) return 0;
        double Nll(double k)
        {
            double s = 0;
            foreach (var (r, v, dd, _) in gaps) { double tot = v + k * k * dd * dd; s += r * r / tot + Math.Log(tot); }
            return s;
        }
        double lnK = BrentMinimizer.Minimize(static (f, x) => f(Math.Exp(x)), (Func<double, double>)Nll, Math.Log(1e-4), Math.Log(KappaMax), 1e-4);
        double k = Math.Exp(lnK);
        return Nll(k) < Nll(0) ? k : 0;
    }
}
