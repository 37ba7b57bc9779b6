namespace Photometallicity.Calibration;

/// <summary>
/// Where a calibration may be applied: a convex polygon in the (C0, [Fe/H]) plane (the convex hull of the
/// accepted standards, optionally grown by a margin), minus colour intervals in which the forward model
/// is not strictly monotonic in [Fe/H]. Vertices run counter-clockwise.
/// </summary>
public sealed record ValidityDomain(IReadOnlyList<(double Colour, double Feh)> Hull, IReadOnlyList<(double ColourMin, double ColourMax)> ExcludedColours)
{
    public double ColourMin => Hull.Min(p => p.Colour);
    public double ColourMax => Hull.Max(p => p.Colour);
    public double FehMin => Hull.Min(p => p.Feh);
    public double FehMax => Hull.Max(p => p.Feh);

    /// <summary>True when the colour lies inside the hull's colour span and outside every excluded interval.</summary>
    public bool CoversColour(double colour)
    {
        if (!(colour >= ColourMin && colour <= ColourMax)) return false;
        foreach (var (lo, hi) in ExcludedColours)
            if (colour >= lo && colour <= hi) return false;
        return true;
    }

    /// <summary>True when the colour falls in an interval excluded for non-monotonicity.</summary>
    public bool IsNonMonotonic(double colour)
    {
        foreach (var (lo, hi) in ExcludedColours)
            if (colour >= lo && colour <= hi) return true;
        return false;
    }

    /// <summary>
    /// The [Fe/H] interval the hull covers at this colour (the vertical chord of the convex polygon),
    /// or null when the colour lies outside the hull's colour span.
    /// </summary>
    public (double FehLo, double FehHi)? FehRangeAt(double colour)
    {
        if (!(colour >= ColourMin && colour <= ColourMax) || Hull.Count == 0) return null;
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        int n = Hull.Count;
        for (int i = 0; i < n; i++)
        {
            var a = Hull[i];
            var b = Hull[(i + 1) % n];
            double cmin = Math.Min(a.Colour, b.Colour), cmax = Math.Max(a.Colour, b.Colour);
            if (colour < cmin || colour > cmax) continue;
            if (a.Colour == b.Colour)
            {
                lo = Math.Min(lo, Math.Min(a.Feh, b.Feh));
                hi = Math.Max(hi, Math.Max(a.Feh, b.Feh));
                continue;
            }
            double t = (colour - a.Colour) / (b.Colour - a.Colour);
            double f = a.Feh + t * (b.Feh - a.Feh);
            lo = Math.Min(lo, f);
            hi = Math.Max(hi, f);
        }
        if (n == 1) { lo = hi = Hull[0].Feh; }
        return double.IsFinite(lo) ? (lo, hi) : null;
    }

    /// <summary>
    /// The colour interval the hull covers at this [Fe/H] (the horizontal chord of the convex polygon), or null when the [Fe/H]
    /// lies outside the hull's [Fe/H] span.
    /// </summary>
    public (double ColourLo, double ColourHi)? ColourRangeAt(double feh)
    {
        if (!(feh >= FehMin && feh <= FehMax) || Hull.Count == 0) return null;
        var swapped = new ValidityDomain(Hull.Select(v => (v.Feh, v.Colour)).ToArray(), []);
        return swapped.FehRangeAt(feh) is { } r ? (r.FehLo, r.FehHi) : null;
    }

    /// <summary>True when the point lies inside or on the hull and outside excluded colours.</summary>
    public bool Contains(double colour, double feh)
    {
        if (!CoversColour(colour)) return false;
        var r = FehRangeAt(colour);
        return r is { } v && feh >= v.FehLo && feh <= v.FehHi;
    }

    /// <summary>Convex hull of points by Andrew's monotone chain (Andrew 1979, Inf. Proc. Lett. 9, 216), counter-clockwise.</summary>
    public static IReadOnlyList<(double Colour, double Feh)> ConvexHull(IEnumerable<(double Colour, double Feh)> points)
    {
        var p = points.Distinct().OrderBy(q => q.Colour).ThenBy(q => q.Feh).ToArray();
        if (p.Length < 3) return p;
        var h = new (double Colour, double Feh)[2 * p.Length];
        int k = 0;
        static double Cross((double, double) o, (double, double) a, (double, double) b) =>
            (a.Item1 - o.Item1) * (b.Item2 - o.Item2) - (a.Item2 - o.Item2) * (b.Item1 - o.Item1);
        for (int i = 0; i < p.Length; i++)
        {
            while (k >= 2 && Cross(h[k - 2], h[k - 1], p[i]) <= 0) k--;
            h[k++] = p[i];
        }
        for (int i = p.Length - 2, t = k + 1; i >= 0; i--)
        {
            while (k >= t && Cross(h[k - 2], h[k - 1], p[i]) <= 0) k--;
            h[k++] = p[i];
        }
        return h.Take(k - 1).ToArray();
    }
}
