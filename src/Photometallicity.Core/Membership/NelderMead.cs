namespace Photometallicity.Membership;

/// <summary>
/// Derivative-free minimisation by the downhill simplex method (Nelder &amp; Mead 1965, Computer Journal 7, 308)
/// with the standard coefficients: reflection 1, expansion 2, contraction 1/2, shrink 1/2. Deterministic; the
/// returned point is never worse than the starting point (the start is a vertex of the first simplex).
/// Stops when the spread of the function values on the simplex falls below <c>ftol</c> or after <c>maxEvals</c>.
/// </summary>
internal static class NelderMead
{
    public static (double[] X, double F, int Evals) Minimise(Func<double[], double> f, double[] x0, double[] step, double ftol, int maxEvals)
    {
        int n = x0.Length;
        var pts = new double[n + 1][];
        var fv = new double[n + 1];
        pts[0] = (double[])x0.Clone();
        fv[0] = f(pts[0]);
        int evals = 1;
        for (int k = 0; k < n; k++)
        {
            var p = (double[])x0.Clone();
            p[k] += step[k];
            pts[k + 1] = p;
            fv[k + 1] = f(p);
            evals++;
        }
        var order = new int[n + 1];
        var centroid = new double[n];
        while (evals < maxEvals)
        {
            for (int k = 0; k <= n; k++) order[k] = k;
            Array.Sort(order, (a, b) => fv[a].CompareTo(fv[b]) != 0 ? fv[a].CompareTo(fv[b]) : a.CompareTo(b));
            int best = order[0], worst = order[n], second = order[n - 1];
            if (Math.Abs(fv[worst] - fv[best]) <= ftol) break;
            Array.Clear(centroid);
            for (int k = 0; k < n; k++)
                for (int d = 0; d < n; d++) centroid[d] += pts[order[k]][d] / n;
            double[] Along(double t)
            {
                var p = new double[n];
                for (int d = 0; d < n; d++) p[d] = centroid[d] + t * (pts[worst][d] - centroid[d]);
                return p;
            }
            var xr = Along(-1.0);
            double fr = f(xr); evals++;
            if (fr < fv[best])
            {
                var xe = Along(-2.0);
                double fe = f(xe); evals++;
                if (fe < fr) { pts[worst] = xe; fv[worst] = fe; }
                else { pts[worst] = xr; fv[worst] = fr; }
            }
            else if (fr < fv[second])
            {
                pts[worst] = xr; fv[worst] = fr;
            }
            else
            {
                bool outside = fr < fv[worst];
                var xc = Along(outside ? -0.5 : 0.5);
                double fc = f(xc); evals++;
                if (fc < (outside ? fr : fv[worst])) { pts[worst] = xc; fv[worst] = fc; }
                else
                {
                    for (int k = 1; k <= n; k++)
                    {
                        int j = order[k];
                        for (int d = 0; d < n; d++) pts[j][d] = pts[best][d] + 0.5 * (pts[j][d] - pts[best][d]);
                        fv[j] = f(pts[j]); evals++;
                    }
                }
            }
        }
        int ib = 0;
        for (int k = 1; k <= n; k++) if (fv[k] < fv[ib]) ib = k;
        return (pts[ib], fv[ib], evals);
    }
}
