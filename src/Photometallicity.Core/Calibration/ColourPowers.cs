namespace Photometallicity.Calibration;

/// <summary>
/// The colour part shared by the monotone models: t = (C - lo) / (hi - lo), u = 2t - 1, and the powers u^a (a = 0 .. degree) with
/// their first and second u-derivatives; outside [-1, 1] every power continues along its tangent at the nearer end, so the colour
/// polynomial grows at most linearly beyond the standards' colours (a project choice: no polynomial run-away).
/// </summary>
internal static class ColourPowers
{
    public static void Evaluate(int degree, double lo, double hi, double colour, Span<double> pw, Span<double> dpw, Span<double> d2pw, out double t)
    {
        t = (colour - lo) / (hi - lo);
        double u = 2 * t - 1;
        double uc = Math.Clamp(u, -1, 1);
        for (int a = 0; a <= degree; a++)
        {
            double v = Math.Pow(uc, a), dv = a == 0 ? 0 : a * Math.Pow(uc, a - 1), d2 = a < 2 ? 0 : a * (a - 1) * Math.Pow(uc, a - 2);
            if (u != uc) { pw[a] = v + dv * (u - uc); dpw[a] = dv; d2pw[a] = 0; }
            else { pw[a] = v; dpw[a] = dv; d2pw[a] = d2; }
        }
    }
}
