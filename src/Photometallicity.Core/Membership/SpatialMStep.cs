namespace Photometallicity.Membership;

/// <summary>
/// The spatial M-step: with responsibilities r fixed, maximise over the profile parameters
///   Q(theta) = sum_i r_i ln Sigma(x_i; theta) - R ln Phi(theta),   R = sum_i r_i,
/// where Phi is the profile's integral over the footprint (so Sigma / Phi is a density on the field). There is no
/// closed form, so a Nelder-Mead search in (x0, y0, ln r_h, k1, k2) starts from the current values; the result is
/// never worse than the start, which keeps EM's ascent (a generalised EM step, Dempster, Laird &amp; Rubin 1977).
/// Stars with r_i &lt; 1e-6 add nothing measurable and are skipped; above <see cref="MaxStars"/> candidates a fixed
/// stride subsample (weights scaled up) is used. The E-step that follows always uses every star.
/// </summary>
internal static class SpatialMStep
{
    public const int MaxStars = 60_000;

    /// <summary>Simplex spread in Q (log-likelihood units) at which the search stops: far below one unit of ln L.</summary>
    public const double FunctionTolerance = 1e-3;

    public readonly record struct Bounds(double XMin, double XMax, double YMin, double YMax, double LnAMin, double LnAMax, double KMax);

    public static SurfaceDensityProfile Run(MixtureData d, double[] r, SurfaceDensityProfile start, Bounds bounds, int threads, int maxEvals, out double phi, double[]? step, out double gain)
    {
        var cand = new List<int>();
        double rTotal = 0;
        foreach (int i in d.Positioned)
        {
            rTotal += r[i];
            if (r[i] > 1e-6) cand.Add(i);
        }
        int stride = Math.Max(1, (cand.Count + MaxStars - 1) / MaxStars);
        int[] rows;
        if (stride == 1) rows = cand.ToArray();
        else
        {
            rows = new int[(cand.Count + stride - 1) / stride];
            for (int k = 0; k < rows.Length; k++) rows[k] = cand[k * stride];
        }
        double sub = 0;
        foreach (int i in rows) sub += r[i];
        double full = 0;
        foreach (int i in cand) full += r[i];
        double scale = sub > 0 ? full / sub : 1.0;
        var xs = new double[rows.Length];
        var ys = new double[rows.Length];
        var ws = new double[rows.Length];
        for (int k = 0; k < rows.Length; k++) { xs[k] = d.X[rows[k]]; ys[k] = d.Y[rows[k]]; ws[k] = r[rows[k]] * scale; }
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
        double q0 = Objective(x0);
        var (best, qBest, _) = NelderMead.Minimise(Objective, x0, step, FunctionTolerance, maxEvals);
        gain = q0 - qBest;
        var result = new SurfaceDensityProfile(kind, best[0], best[1], Math.Exp(best[2]), best[3], best[4]);
        phi = d.Footprint.Integrate(result.CreateEvaluator());
        return result;
    }

    public static bool Inside(double[] t, Bounds b) =>
        t[0] >= b.XMin && t[0] <= b.XMax && t[1] >= b.YMin && t[1] <= b.YMax && t[2] >= b.LnAMin && t[2] <= b.LnAMax
        && t[3] * t[3] + t[4] * t[4] <= b.KMax * b.KMax;
}
