namespace Photometallicity.Calibration;

/// <summary>
/// Quadratic I-splines in [Fe/H] (Ramsay 1988, "Monotone regression splines in action", Statistical Science 3, 425, eq. 2):
/// I_j is the integral of the normalised degree-1 M-spline on the knots (t_j, t_j+1, t_j+2) of the clamped knot vector
/// [a, a, a, k_1 .. k_q, b, b, b], so it rises monotonically from 0 at t_j to 1 at t_j+2; any non-negative combination of
/// them is non-decreasing. There are q + 2 of them (the constant, which is also a member of the family, is left to the
/// colour part of the model). Written out, with (l, m, r) = (t_j, t_j+1, t_j+2):
///   I(x) = (x - l)^2 / ((r - l)(m - l))          for l &lt; x &lt;= m,
///   I(x) = 1 - (r - x)^2 / ((r - l)(r - m))      for m &lt; x &lt; r,
/// 0 below l and 1 above r. Outside [a, b] every I_j continues along its tangent at the end (a project choice: the index
/// keeps the slope it has at the last standards rather than flattening or curving on), which keeps it monotone.
/// </summary>
public sealed class MonotoneRamps
{
    private readonly double[] _l, _m, _r;

    public MonotoneRamps(double lo, double hi, IReadOnlyList<double> interiorKnots)
    {
        if (!(hi > lo)) throw new ArgumentException($"the [Fe/H] knot range [{lo}, {hi}] is empty");
        var t = new List<double> { lo, lo, lo };
        foreach (var k in interiorKnots)
        {
            if (!(k > t[^1] && k < hi)) throw new ArgumentException($"interior knot {k} is not inside ({t[^1]}, {hi}) in increasing order");
            t.Add(k);
        }
        t.AddRange([hi, hi, hi]);
        Lo = lo;
        Hi = hi;
        Knots = interiorKnots.ToArray();
        Count = interiorKnots.Count + 2;
        _l = new double[Count];
        _m = new double[Count];
        _r = new double[Count];
        for (int j = 0; j < Count; j++) { _l[j] = t[j + 1]; _m[j] = t[j + 2]; _r[j] = t[j + 3]; }
    }

    public double Lo { get; }
    public double Hi { get; }
    public double[] Knots { get; }
    public int Count { get; }

    /// <summary>Writes I_j(x) and I_j'(x) for every j.</summary>
    public void Evaluate(double x, Span<double> value, Span<double> slope)
    {
        if (x < Lo) { Inside(Lo, value, slope); for (int j = 0; j < Count; j++) value[j] += slope[j] * (x - Lo); return; }
        if (x > Hi) { Inside(Hi, value, slope); for (int j = 0; j < Count; j++) value[j] += slope[j] * (x - Hi); return; }
        Inside(x, value, slope);
    }

    private void Inside(double x, Span<double> value, Span<double> slope)
    {
        for (int j = 0; j < Count; j++)
        {
            double l = _l[j], m = _m[j], r = _r[j];
            if (x <= l) { value[j] = 0; slope[j] = x == l && m == l ? 2 / (r - l) : 0; }
            else if (x >= r) { value[j] = 1; slope[j] = x == r && m == r ? 2 / (r - l) : 0; }
            else if (x <= m) { double d = x - l; value[j] = d * d / ((r - l) * (m - l)); slope[j] = 2 * d / ((r - l) * (m - l)); }
            else { double d = r - x; value[j] = 1 - d * d / ((r - l) * (r - m)); slope[j] = 2 * d / ((r - l) * (r - m)); }
        }
    }
}
