namespace Photometallicity.Membership;

/// <summary>
/// The spatial M-step: with responsibilities r fixed, maximise over the profile parameters
///   Q(theta) = sum_i r_i ln Sigma(x_i; theta) - R ln Phi(theta),   R = sum_i r_i,
/// where Phi is the profile's integral over the footprint (so Sigma / Phi is a density on the field). There is no
/// closed form, so a Nelder-Mead search in (x0, y0, ln r_h, k1, k2) starts from the current values; the result is
/// never worse than the start, which keeps EM's ascent (a generalised EM step, Dempster, Laird &amp; Rubin 1977).
/// The search runs on a sample of at most about <see cref="MaxStars"/> stars (all likely members; the stars of small r by
/// a fixed stride of the row index, weights scaled up; r &lt; 1e-6 skipped); its proposal is accepted only if the exact
/// Q over every star has risen, so the ascent holds exactly. The E-step that follows always uses every star.
/// </summary>
internal static class SpatialMStep
{
    public const int MaxStars = 80_000;

    /// <summary>Simplex spread in Q (log-likelihood units) at which the search stops: far below one unit of ln L.</summary>
    public const double FunctionTolerance = 1e-3;

    public readonly record struct Bounds(double XMin, double XMax, double YMin, double YMax, double LnAMin, double LnAMax, double KMax);

    public static SurfaceDensityProfile Run(MixtureData d, double[] r, SurfaceDensityProfile start, Bounds bounds, int threads, int maxEvals, out double phi, double[]? step, out double gain)
    {
        // Search sample: every star with r >= 0.01; fainter-weighted candidates (1e-6 < r < 0.01) by a fixed stride of
        // the row index, their weights scaled by the stride. The search is thus cheap and its sample nearly fixed.
        double rTotal = 0;
        int nHigh = 0, nLow = 0;
        foreach (int i in d.Positioned)
        {
            rTotal += r[i];
            if (r[i] >= 0.01) nHigh++;
            else if (r[i] > 1e-6) nLow++;
        }
        int strideHigh = Math.Max(1, (nHigh + MaxStars / 2 - 1) / (MaxStars / 2));
        int strideLow = Math.Max(1, (nLow + Math.Max(MaxStars - nHigh / strideHigh, 1) - 1) / Math.Max(MaxStars - nHigh / strideHigh, 1));
        var xsL = new List<double>(); var ysL = new List<double>(); var wsL = new List<double>();
        foreach (int i in d.Positioned)
        {
            double ri = r[i];
            int stride = ri >= 0.01 ? strideHigh : ri > 1e-6 ? strideLow : 0;
            if (stride == 0 || i % stride != 0) continue;
            xsL.Add(d.X[i]); ysL.Add(d.Y[i]); wsL.Add(ri * stride);
        }
        var xs = xsL.ToArray(); var ys = ysL.ToArray(); var ws = wsL.ToArray();
        var kind = start.Kind;

        double Objective(double[] t)
        {
            if (!Inside(t, bounds)) return double.MaxValue;
            var pr = new SurfaceDensityProfile(kind, t[0], t[1], Math.Exp(t[2]), t[3], t[4]);
            var ev = pr.CreateEvaluator();
            double ph = d.Footprint.Integrate(ev);
            if (!(ph > 0)) return double.MaxValue;
            var s = ChunkedReduction.Sum(xs.Length, 1, threads, (a, b, acc) =>
            {
                double q = 0;
                for (int k = a; k < b; k++) q += ws[k] * Math.Log(ev.Density(xs[k], ys[k]));
                acc[0] = q;
            });
            return -(s[0] - rTotal * Math.Log(ph));
        }

        var x0 = new[] { start.X0, start.Y0, Math.Log(start.HalfLight), start.K1, start.K2 };
        double h = start.HalfLight;
        step ??= [0.1 * h, 0.1 * h, 0.1, 0.05, 0.05];
        var (best, _, _) = NelderMead.Minimise(Objective, x0, step, FunctionTolerance, maxEvals);
        var proposal = new SurfaceDensityProfile(kind, best[0], best[1], Math.Exp(best[2]), best[3], best[4]);
        // Accept only if the exact Q over all stars has not decreased: this keeps the EM ascent exact.
        double qOld = ExactQ(d, r, start, rTotal, threads, out double phiOld);
        double qNew = ExactQ(d, r, proposal, rTotal, threads, out double phiNew);
        gain = qNew - qOld;
        if (!(gain > 0)) { gain = 0; phi = phiOld; return start; }
        phi = phiNew;
        return proposal;
    }

    /// <summary>Q(theta) over every positioned star.</summary>
    private static double ExactQ(MixtureData d, double[] r, SurfaceDensityProfile p, double rTotal, int threads, out double phi)
    {
        var ev = p.CreateEvaluator();
        phi = d.Footprint.Integrate(ev);
        var pos = d.Positioned;
        var s = ChunkedReduction.Sum(pos.Length, 1, threads, (a, b, acc) =>
        {
            double q = 0;
            for (int k = a; k < b; k++)
            {
                int i = pos[k];
                if (r[i] > 0) q += r[i] * Math.Log(ev.Density(d.X[i], d.Y[i]));
            }
            acc[0] = q;
        });
        return s[0] - rTotal * Math.Log(phi);
    }

    public static bool Inside(double[] t, Bounds b) =>
        t[0] >= b.XMin && t[0] <= b.XMax && t[1] >= b.YMin && t[1] <= b.YMax && t[2] >= b.LnAMin && t[2] <= b.LnAMax
        && t[3] * t[3] + t[4] * t[4] <= b.KMax * b.KMax;
}
