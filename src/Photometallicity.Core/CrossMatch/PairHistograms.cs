using System.Runtime.CompilerServices;
namespace Photometallicity.CrossMatch;

/// <summary>
/// Histograms over all (left, right) pairs within a radius, counted in parallel over fixed chunks of left rows
/// into integer bins (integer sums, so the result does not depend on the order of chunks).
/// </summary>
internal static class PairHistograms
{
    private const double RadToArcsec = 180.0 * 3600.0 / Math.PI;

    /// <summary>Counts of pair separations in <paramref name="bins"/> equal bins over [0, maxArcsec).</summary>
    public static double[] Separations(SkyKdTree tree, UnitVectors queries, double maxArcsec, int bins)
    {
        double chord = 2.0 * Math.Sin(0.5 * maxArcsec / RadToArcsec);
        double width = maxArcsec / bins;
        var perChunk = new long[Chunks.Count(queries.Count)][];
        var order = queries.Order;
        Chunks.For(queries.Count, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (c, lo, hi) =>
        {
            var h = new long[bins];
            var found = new PairBuffer(64);
            for (int k = lo; k < hi; k++)
            {
                int i = order[k];
                found.Clear();
                tree.WithinRadius(queries.X[i], queries.Y[i], queries.Z[i], chord * chord, found);
                for (int m = 0; m < found.Count; m++)
                {
                    double v = found.Chord2[m];
                    double s = SkySeparation.RadiansFromChord2(v) * RadToArcsec;
                    if (s < maxArcsec) h[Math.Min(bins - 1, (int)(s / width))]++;
                }
            }
            perChunk[c] = h;
        });
        var total = new double[bins];
        foreach (var h in perChunk)
            for (int b = 0; b < bins; b++) total[b] += h[b];
        return total;
    }

    /// <summary>
    /// 2-D histogram of the pair offsets (right minus left, tangent-plane radians) of all pairs within
    /// <paramref name="radiusRad"/>, in (2 half + 1)^2 square bins of side <paramref name="binRad"/> centred on zero.
    /// At most <paramref name="maxRows"/> left rows are used, evenly spread along the spatial order.
    /// </summary>
    internal static long[,] Offsets(SkyKdTree tree, UnitVectors left, Projection leftPlane, Projection rightPlane,
        double radiusRad, double binRad, int half, int maxRows)
    {
        double chord = 2.0 * Math.Sin(0.5 * radiusRad);
        int side = 2 * half + 1;
        var order = FalseMatchRate.Sample(left.Order, maxRows);
        var perChunk = new long[Chunks.Count(order.Length)][];
        Chunks.For(order.Length, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (c, lo, hi) =>
        {
            var h = new long[side * side];
            var found = new PairBuffer(64);
            // The chunk's rows gathered first (independent loads that overlap), then searched in order.
            int m = hi - lo;
            var q = new double[5 * m];
            for (int k = 0; k < m; k++)
            {
                int i = order[lo + k];
                q[5 * k] = left.X[i];
                q[5 * k + 1] = left.Y[i];
                q[5 * k + 2] = left.Z[i];
                (q[5 * k + 3], q[5 * k + 4]) = leftPlane.At(i);
            }
            for (int k = 0; k < m; k++)
            {
                found.Clear();
                tree.WithinRadius(q[5 * k], q[5 * k + 1], q[5 * k + 2], chord * chord, found);
                double xi = q[5 * k + 3], eta = q[5 * k + 4];
                for (int j = 0; j < found.Count; j++)
                {
                    int r = found.Right[j];
                    var (rxi, reta) = rightPlane.At(r);
                    double dx = rxi - xi, dy = reta - eta;
                    if (!double.IsFinite(dx) || !double.IsFinite(dy)) continue;
                    int bx = (int)Math.Round(dx / binRad) + half, by = (int)Math.Round(dy / binRad) + half;
                    if (bx >= 0 && bx < side && by >= 0 && by < side) h[by * side + bx]++;
                }
            }
            perChunk[c] = h;
        });
        var total = new long[side, side];
        foreach (var h in perChunk)
            for (int by = 0; by < side; by++)
                for (int bx = 0; bx < side; bx++)
                    total[by, bx] += h[by * side + bx];
        return total;
    }
}
