using System.Runtime.CompilerServices;
namespace Photometallicity.CrossMatch;

/// <summary>
/// Solves the astrometric transform between the catalogues. The right tree holds the right catalogue as
/// observed; each iteration maps the left positions into the right frame with the current transform
/// (which is equivalent to correcting the right catalogue), matches within the radius, refits on the
/// secure pairs (one candidate each way) with clipping, and stops when the solution moves by less than
/// the tolerance anywhere in the field.
/// The first estimate is the mode of the offsets of all pairs within a wider search radius (a 2-D histogram
/// peak, background-subtracted centroid of the 3 x 3 bins around it), so an offset as large as the match
/// radius itself is still found.
/// </summary>
internal sealed class OffsetSolver
{
    private const int HistogramHalf = 30;
    // The first estimate needs only the peak of the offset distribution, and the refinement a few thousand
    // pairs for sub-mas precision: both use at most 200 000 left rows spread evenly along the spatial order
    // (program's choice; on 10^6 rows this saves most of the solution's time).
    private const int HistogramRows = 200_000;
    private const int SolutionRows = 200_000;
    private readonly TangentPlane _plane;
    private readonly SkyKdTree _rightTree;
    private readonly UnitVectors _left;
    private readonly Projection _lp, _rp;
    private readonly int _rightCount;

    public OffsetSolver(TangentPlane plane, SkyKdTree rightTree, UnitVectors left, UnitVectors rightRaw)
    {
        _plane = plane;
        _rightTree = rightTree;
        _left = left;
        _lp = new Projection(plane, left);
        _rp = new Projection(plane, rightRaw);
        _rightCount = rightRaw.Count;
        _rows = FalseMatchRate.Sample(left.Order, SolutionRows);
    }

    private readonly int[] _rows;

    /// <summary>The left rows the solution uses (all of them up to 200 000).</summary>
    public int SampleCount => _rows.Length;

    public sealed record Outcome(AstrometricTransform Transform, AstrometricFitResult? Fit, int SecurePairs, int Iterations, bool Converged);

    /// <summary>The offset at the peak of the pair-offset histogram, or null when no peak stands out.</summary>
    public AstrometricTransform? InitialEstimate(double searchRadiusRad)
    {
        double bin = searchRadiusRad / HistogramHalf;
        var h = PairHistograms.Offsets(_rightTree, _left, _lp, _rp, searchRadiusRad, bin, HistogramHalf, HistogramRows);
        int side = 2 * HistogramHalf + 1;
        // Background: median count of the bins well inside the search circle.
        var inside = new List<long>();
        for (int y = 0; y < side; y++)
            for (int x = 0; x < side; x++)
            {
                int dx = x - HistogramHalf, dy = y - HistogramHalf;
                if (dx * dx + dy * dy <= (HistogramHalf - 2) * (HistogramHalf - 2)) inside.Add(h[y, x]);
            }
        inside.Sort();
        double bg = inside.Count > 0 ? inside[inside.Count / 2] : 0;
        long best = -1;
        int bx = 0, by = 0;
        for (int y = 1; y < side - 1; y++)
            for (int x = 1; x < side - 1; x++)
            {
                long s = 0;
                for (int j = -1; j <= 1; j++)
                    for (int i = -1; i <= 1; i++) s += h[y + j, x + i];
                if (s > best)
                {
                    best = s;
                    bx = x;
                    by = y;
                }
            }
        // A peak must stand 5 sigma (Poisson) above nine bins of background (5 sigma: common practice).
        if (best - 9 * bg <= 5 * Math.Sqrt(9 * bg + 1)) return null;
        double sw = 0, sx = 0, sy = 0;
        for (int j = -1; j <= 1; j++)
            for (int i = -1; i <= 1; i++)
            {
                double w = Math.Max(0, h[by + j, bx + i] - bg);
                sw += w;
                sx += w * (bx + i - HistogramHalf);
                sy += w * (by + j - HistogramHalf);
            }
        return new AstrometricTransform(1.0, 0.0, sx / sw * bin, sy / sw * bin);
    }

    /// <summary>Iterates solve - match from <paramref name="start"/> until converged or out of iterations.</summary>
    public Outcome Iterate(AstrometricTransform start, double radiusRad, int maxIterations, bool rotationScale,
        double toleranceRad, int minSecure, double fieldRadiusRad)
    {
        var t = start;
        AstrometricFitResult? fit = null;
        int secure = 0;
        double chord = 2.0 * Math.Sin(0.5 * radiusRad);
        for (int it = 1; it <= maxIterations; it++)
        {
            var mapped = MapSample(t);
            var pairs = CandidatePairs.Find(_rightTree, mapped, chord * chord);
            var rightUse = pairs.RightCounts(_rightCount);
            var rows = new List<int>();
            var partner = new List<int>();
            for (int k = 0; k < pairs.LeftCount; k++)
            {
                if (pairs.CountOf(k) != 1) continue;
                int r = pairs.Right[pairs.Start[k]];
                if (rightUse[r] != 1 || !double.IsFinite(_rp.At(r).Xi)) continue;
                rows.Add(_rows[k]);
                partner.Add(r);
            }
            secure = rows.Count;
            if (secure < minSecure) return new Outcome(t, fit, secure, it, false);
            var lx = new double[secure];
            var ly = new double[secure];
            var rx = new double[secure];
            var ry = new double[secure];
            for (int k = 0; k < secure; k++)
            {
                (lx[k], ly[k]) = _lp.At(rows[k]);
                (rx[k], ry[k]) = _rp.At(partner[k]);
            }
            // Rotation and scale need pairs spread over the field; below 20 pairs only the offset is fitted (program's choice).
            fit = AstrometricFit.Fit(lx, ly, rx, ry, rotationScale && secure >= 20);
            double change = fit.Transform.DistanceTo(t, fieldRadiusRad);
            t = fit.Transform;
            if (change < toleranceRad) return new Outcome(t, fit, secure, it, true);
        }
        return new Outcome(t, fit, secure, maxIterations, false);
    }

    /// <summary>
    /// The sampled left positions as the right catalogue would see them under transform t, in sample order
    /// (which is already spatial, so it is also their visiting order).
    /// </summary>
    public UnitVectors MapSample(AstrometricTransform t)
    {
        int n = _rows.Length;
        var x = new double[n];
        var y = new double[n];
        var z = new double[n];
        var order = new int[n];
        Chunks.For(n, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (_, lo, hi) =>
        {
            for (int k = lo; k < hi; k++)
            {
                int i = _rows[k];
                var (lxi, leta) = _lp.At(i);
                var (xi, eta) = t.Forward(lxi, leta);
                (x[k], y[k], z[k]) = _plane.Deproject(xi, eta);
                order[k] = k;
            }
        });
        return new UnitVectors(x, y, z).WithOrder(order);
    }

    /// <summary>The right catalogue corrected into the left frame by the inverse of t, one row at a time.</summary>
    public Correction CorrectionOf(AstrometricTransform t, UnitVectors rightRaw) => new(_plane, t, rightRaw);

    /// <summary>A right row corrected into the left frame (rows the plane cannot hold are left as observed).</summary>
    internal readonly struct Correction(TangentPlane plane, AstrometricTransform t, UnitVectors raw) : SkyKdTree.IPointMap
    {
        public int Count => raw.Count;

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public (double X, double Y, double Z) Map(int i)
        {
            var (x, y, z) = (raw.X[i], raw.Y[i], raw.Z[i]);
            var (rxi, reta) = plane.Project(x, y, z);
            if (!double.IsFinite(rxi)) return (x, y, z);
            var (xi, eta) = t.Inverse(rxi, reta);
            return plane.Deproject(xi, eta);
        }
    }
}
