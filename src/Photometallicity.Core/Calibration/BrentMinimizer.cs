namespace Photometallicity.Calibration;

/// <summary>
/// One-dimensional minimisation on a bracket [a, b] by Brent's method: golden-section steps combined with
/// successive parabolic interpolation (Brent 1973, Algorithms for Minimization without Derivatives, ch. 5,
/// procedure localmin). Used for the intrinsic scatter's profile likelihood on log sigma_int.
/// </summary>
internal static class BrentMinimizer
{
    private const double GoldenSection = 0.3819660112501051; // (3 - sqrt 5) / 2

    /// <summary>The abscissa of the minimum of <paramref name="f"/> in [a, b] to absolute tolerance <paramref name="tol"/>.</summary>
    public static double Minimize<TState>(Func<TState, double, double> f, TState state, double a, double b, double tol, int maxIter = 100)
    {
        double x = a + GoldenSection * (b - a), w = x, v = x;
        double fx = f(state, x), fw = fx, fv = fx;
        double d = 0, e = 0;
        for (int iter = 0; iter < maxIter; iter++)
        {
            double m = 0.5 * (a + b);
            double tol1 = 1e-10 * Math.Abs(x) + tol / 3.0, tol2 = 2 * tol1;
            if (Math.Abs(x - m) <= tol2 - 0.5 * (b - a)) break;
            bool golden = true;
            if (Math.Abs(e) > tol1)
            {
                double r = (x - w) * (fx - fv);
                double q = (x - v) * (fx - fw);
                double p = (x - v) * q - (x - w) * r;
                q = 2 * (q - r);
                if (q > 0) p = -p; else q = -q;
                double eOld = e;
                e = d;
                if (Math.Abs(p) < Math.Abs(0.5 * q * eOld) && p > q * (a - x) && p < q * (b - x))
                {
                    d = p / q;
                    double u0 = x + d;
                    if (u0 - a < tol2 || b - u0 < tol2) d = x < m ? tol1 : -tol1;
                    golden = false;
                }
            }
            if (golden)
            {
                e = (x < m ? b : a) - x;
                d = GoldenSection * e;
            }
            double u = Math.Abs(d) >= tol1 ? x + d : x + (d > 0 ? tol1 : -tol1);
            double fu = f(state, u);
            if (fu <= fx)
            {
                if (u < x) b = x; else a = x;
                v = w; fv = fw; w = x; fw = fx; x = u; fx = fu;
            }
            else
            {
                if (u < x) a = u; else b = u;
                if (fu <= fw || w == x) { v = w; fv = fw; w = u; fw = fu; }
                else if (fu <= fv || v == x || v == w) { v = u; fv = fu; }
            }
        }
        return x;
    }
}
