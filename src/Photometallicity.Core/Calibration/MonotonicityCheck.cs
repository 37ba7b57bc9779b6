namespace Photometallicity.Calibration;

/// <summary>
/// Checks that the forward model is strictly monotonic in [Fe/H] over the hull of the accepted standards, so
/// that inverting it gives one answer: df/d[Fe/H] is evaluated on a grid of colours across the hull and, at each
/// colour, of [Fe/H] across the hull's chord. The dominant sign is that of the sum of df/d[Fe/H] over the grid;
/// a colour where any point has the other sign, or |df/d[Fe/H]| below the minimum sensitivity, is excluded.
/// Runs of excluded grid colours become intervals, widened by half a grid step on each side.
/// </summary>
internal static class MonotonicityCheck
{
    internal sealed record Outcome(int Sign, IReadOnlyList<(double ColourMin, double ColourMax)> Excluded, IReadOnlyList<string> Notes);

    public static Outcome Run(PolynomialBasis2D basis, ReadOnlySpan<double> coef, ValidityDomain hull, double minSensitivity,
        int colourSteps = 400, int fehSteps = 60)
    {
        double c0 = hull.ColourMin, c1 = hull.ColourMax;
        double h = colourSteps > 1 ? (c1 - c0) / (colourSteps - 1) : 0;
        var grad = new double[colourSteps * fehSteps];
        var valid = new bool[colourSteps * fehSteps];
        double sum = 0;
        for (int a = 0; a < colourSteps; a++)
        {
            double c = c0 + a * h;
            if (hull.FehRangeAt(c) is not { } r) continue;
            for (int b = 0; b < fehSteps; b++)
            {
                double f = r.FehLo + (r.FehHi - r.FehLo) * b / (fehSteps - 1);
                double g = basis.Gradient(coef, c, f).DFeh;
                grad[a * fehSteps + b] = g;
                valid[a * fehSteps + b] = true;
                sum += g;
            }
        }
        int sign = sum >= 0 ? 1 : -1;
        var bad = new bool[colourSteps];
        var why = new string?[colourSteps];
        for (int a = 0; a < colourSteps; a++)
            for (int b = 0; b < fehSteps; b++)
            {
                int k = a * fehSteps + b;
                if (!valid[k]) continue;
                double g = grad[k] * sign;
                if (g < 0) { bad[a] = true; why[a] = "df/d[Fe/H] changes sign"; break; }
                if (g < minSensitivity) { bad[a] = true; why[a] ??= $"|df/d[Fe/H]| < {minSensitivity} mag/dex"; }
            }
        var intervals = new List<(double, double)>();
        var notes = new List<string>();
        for (int a = 0; a < colourSteps; a++)
        {
            if (!bad[a]) continue;
            int e = a;
            bool signChange = false;
            while (e + 1 < colourSteps && bad[e + 1]) e++;
            for (int q = a; q <= e; q++) signChange |= why[q] == "df/d[Fe/H] changes sign";
            double lo = Math.Max(c0, c0 + a * h - 0.5 * h), hi = Math.Min(c1, c0 + e * h + 0.5 * h);
            intervals.Add((lo, hi));
            notes.Add($"colour {lo:F3} to {hi:F3} mag excluded: " + (signChange ? "df/d[Fe/H] changes sign (the model is not monotonic in [Fe/H])" : why[a]));
            a = e;
        }
        return new Outcome(sign, intervals, notes);
    }
}
