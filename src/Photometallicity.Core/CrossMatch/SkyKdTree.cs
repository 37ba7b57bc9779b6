using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
namespace Photometallicity.CrossMatch;

/// <summary>
/// A balanced k-d tree (Bentley 1975, Commun. ACM 18, 509) over unit vectors on the celestial sphere.
/// Distances are chord lengths in 3-D, which are monotonic in the great-circle angle, so there is no RA
/// wrap and no pole to handle. Built in O(N log N): each node splits its range at the median (quickselect,
/// Hoare 1961, Commun. ACM 4, 321) along the longest side of its bounding box; the layout is implicit
/// (children of node k are 2k+1 and 2k+2, the split is at the middle of the range), so the tree depends only
/// on the data. Each leaf is one run of the coordinate arrays, scanned four points at a time where the
/// hardware allows.
/// A tree can be re-used for slightly moved copies of its points (<see cref="WithMovedPoints"/>): the splits
/// are shifted by the common part of the move and every pruning test is widened by the rest, so the answers are
/// exactly those of a tree built on the moved points. Queries are read-only and thread-safe. Ties in distance go to the
/// smaller original index.
/// </summary>
public sealed class SkyKdTree
{
    private const int LeafSize = 32;
    private const int ParallelDepth = 4;
    private const int StackDepth = 64;
    // A moved copy is re-used only when no point moved by more than this on any axis (about 20 arcsec);
    // beyond it a fresh tree is cheaper than the widened searches (program's choice).
    private const double MaxReuseSlack = 1e-4;
    // Added to the measured largest move so that rounding in the widened tests can never prune a point
    // inside the radius (1e-12 rad = 0.2 micro-arcsec; far above double rounding of unit-vector components).
    private const double SlackPad = 1e-12;

    [StructLayout(LayoutKind.Sequential)]
    private struct Pt
    {
        public double X, Y, Z;
        public int Index;
    }

    /// <summary>An internal node: the split value and its axis, together so that a step down reads one place.</summary>
    private struct Node
    {
        public double Split;
        public int Dim;
    }

    // The points in tree order, one array per coordinate (so that a leaf is scanned several points at a time),
    // and their original indices. _p holds them together only while the tree is being built.
    private readonly double[] _x, _y, _z;
    private readonly int[] _index;
    private readonly Node[] _nodes;
    private readonly double _slack;
    private Pt[]? _p;

    private SkyKdTree(double[] x, double[] y, double[] z, int[] index, Node[] nodes, double slack)
    {
        _x = x;
        _y = y;
        _z = z;
        _index = index;
        _nodes = nodes;
        _slack = slack;
    }

    public int Count => _index.Length;

    /// <summary>Builds the tree over copies of the given vectors (the inputs are not modified).</summary>
    public static SkyKdTree Build(UnitVectors points)
    {
        int n = points.Count;
        var p = new Pt[n];
        double[] px = points.X, py = points.Y, pz = points.Z;
        Chunks.For(n, (_, lo, hi) =>
        {
            for (int i = lo; i < hi; i++) p[i] = new Pt { X = px[i], Y = py[i], Z = pz[i], Index = i };
        });
        int levels = 0;
        for (int m = n; m > LeafSize; m = (m + 1) / 2) levels++;
        int internalNodes = (1 << levels) - 1;
        var tree = new SkyKdTree(new double[n], new double[n], new double[n], new int[n], new Node[Math.Max(1, internalNodes)], 0.0) { _p = p };
        if (n > LeafSize)
        {
            Span<double> box = stackalloc double[6];
            box[0] = box[1] = box[2] = double.MaxValue;
            box[3] = box[4] = box[5] = double.MinValue;
            for (int i = 0; i < n; i++)
            {
                box[0] = Math.Min(box[0], px[i]);
                box[1] = Math.Min(box[1], py[i]);
                box[2] = Math.Min(box[2], pz[i]);
                box[3] = Math.Max(box[3], px[i]);
                box[4] = Math.Max(box[4], py[i]);
                box[5] = Math.Max(box[5], pz[i]);
            }
            tree.BuildNode(0, 0, n, 0, box[0], box[1], box[2], box[3], box[4], box[5]);
        }
        Chunks.For(n, (_, lo, hi) =>
        {
            for (int k = lo; k < hi; k++)
            {
                tree._x[k] = p[k].X;
                tree._y[k] = p[k].Y;
                tree._z[k] = p[k].Z;
                tree._index[k] = p[k].Index;
            }
        });
        tree._p = null;
        return tree;
    }

    /// <summary>
    /// A tree over <paramref name="moved"/>, which must be slightly moved copies of the points this tree was built
    /// on (same count, same order). The common part of the move (per axis, the middle of its range) shifts every
    /// split; the rest, at most the slack, widens every pruning test. Builds a fresh tree when the points moved
    /// too unevenly for that to pay.
    /// </summary>
    public SkyKdTree WithMovedPoints(UnitVectors moved) => WithMovedPoints(new Stored(moved));

    /// <summary>Where point i (original index) has moved to.</summary>
    internal interface IPointMap
    {
        int Count { get; }
        (double X, double Y, double Z) Map(int i);
    }

    private readonly struct Stored(UnitVectors v) : IPointMap
    {
        public int Count => v.Count;

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public (double X, double Y, double Z) Map(int i) => (v.X[i], v.Y[i], v.Z[i]);
    }

    /// <summary>All moved points as vectors (for a fresh build).</summary>
    private static UnitVectors Materialise<TMap>(TMap map) where TMap : struct, IPointMap
    {
        int n = map.Count;
        var x = new double[n];
        var y = new double[n];
        var z = new double[n];
        Chunks.For(n, (_, lo, hi) =>
        {
            for (int i = lo; i < hi; i++) (x[i], y[i], z[i]) = map.Map(i);
        });
        return new UnitVectors(x, y, z);
    }

    /// <summary>As <see cref="WithMovedPoints(UnitVectors)"/>, with each moved point computed where it is needed.</summary>
    internal SkyKdTree WithMovedPoints<TMap>(TMap moved) where TMap : struct, IPointMap
    {
        if (moved.Count != Count) throw new ArgumentException($"The moved points number {moved.Count}, the tree holds {Count}.");
        if (_slack != 0.0) return Build(Materialise(moved));
        int n = Count;
        double[] nx = new double[n], ny = new double[n], nz = new double[n];
        double[] ox = _x, oy = _y, oz = _z;
        int[] index = _index;
        int chunks = Chunks.Count(n);
        var range = new double[chunks * 6];
        Chunks.For(n, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (c, lo, hi) =>
        {
            double x0 = double.PositiveInfinity, y0 = double.PositiveInfinity, z0 = double.PositiveInfinity;
            double x1 = double.NegativeInfinity, y1 = double.NegativeInfinity, z1 = double.NegativeInfinity;
            bool bad = false;
            for (int k = lo; k < hi; k++)
            {
                var (x, y, z) = moved.Map(index[k]);
                nx[k] = x;
                ny[k] = y;
                nz[k] = z;
                double dx = x - ox[k], dy = y - oy[k], dz = z - oz[k];
                bad |= !double.IsFinite(dx) || !double.IsFinite(dy) || !double.IsFinite(dz);
                x0 = Math.Min(x0, dx);
                x1 = Math.Max(x1, dx);
                y0 = Math.Min(y0, dy);
                y1 = Math.Max(y1, dy);
                z0 = Math.Min(z0, dz);
                z1 = Math.Max(z1, dz);
            }
            if (bad) x0 = double.NaN;
            range[6 * c] = x0;
            range[6 * c + 1] = y0;
            range[6 * c + 2] = z0;
            range[6 * c + 3] = x1;
            range[6 * c + 4] = y1;
            range[6 * c + 5] = z1;
        });
        Span<double> lo3 = stackalloc double[3];
        Span<double> hi3 = stackalloc double[3];
        lo3.Fill(double.PositiveInfinity);
        hi3.Fill(double.NegativeInfinity);
        for (int c = 0; c < chunks; c++)
            for (int d = 0; d < 3; d++)
            {
                if (double.IsNaN(range[6 * c + d])) return Build(Materialise(moved));
                lo3[d] = Math.Min(lo3[d], range[6 * c + d]);
                hi3[d] = Math.Max(hi3[d], range[6 * c + 3 + d]);
            }
        Span<double> shift = stackalloc double[3];
        double slack = 0;
        for (int d = 0; d < 3; d++)
        {
            shift[d] = n == 0 ? 0.0 : 0.5 * (lo3[d] + hi3[d]);
            if (n > 0) slack = Math.Max(slack, Math.Max(hi3[d] - shift[d], shift[d] - lo3[d]));
        }
        if (!(slack <= MaxReuseSlack)) return Build(Materialise(moved));
        var nodes = new Node[_nodes.Length];
        for (int node = 0; node < nodes.Length; node++)
            nodes[node] = new Node { Split = _nodes[node].Split + shift[_nodes[node].Dim], Dim = _nodes[node].Dim };
        return new SkyKdTree(nx, ny, nz, index, nodes, slack + SlackPad);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void BuildNode(int node, int lo, int hi, int depth, double x0, double y0, double z0, double x1, double y1, double z1)
    {
        if (hi - lo <= LeafSize) return;
        double ex = x1 - x0, ey = y1 - y0, ez = z1 - z0;
        int d = ex >= ey && ex >= ez ? 0 : ey >= ez ? 1 : 2;
        int mid = lo + (hi - lo) / 2;
        Select(d, lo, hi - 1, mid);
        double s = Coord(ref _p![mid], d);
        _nodes[node] = new Node { Split = s, Dim = d };
        double lx1 = d == 0 ? s : x1, ly1 = d == 1 ? s : y1, lz1 = d == 2 ? s : z1;
        double rx0 = d == 0 ? s : x0, ry0 = d == 1 ? s : y0, rz0 = d == 2 ? s : z0;
        if (depth < ParallelDepth && hi - lo > 50_000)
        {
            Parallel.Invoke(
                () => BuildNode(2 * node + 1, lo, mid, depth + 1, x0, y0, z0, lx1, ly1, lz1),
                () => BuildNode(2 * node + 2, mid, hi, depth + 1, rx0, ry0, rz0, x1, y1, z1));
        }
        else
        {
            BuildNode(2 * node + 1, lo, mid, depth + 1, x0, y0, z0, lx1, ly1, lz1);
            BuildNode(2 * node + 2, mid, hi, depth + 1, rx0, ry0, rz0, x1, y1, z1);
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Coord(ref Pt p, int d) => Unsafe.Add(ref p.X, d);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Median3(double a, double b, double e) => a < b ? (b < e ? b : a < e ? e : a) : (a < e ? a : b < e ? e : b);

    /// <summary>Quickselect (Wirth's variant of Hoare's FIND): puts the k-th smallest of axis d over [lo..hi] at k.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Select(int d, int lo, int hi, int k)
    {
        var c = _p!;
        while (hi > lo)
        {
            int m = lo + (hi - lo) / 2;
            double pivot;
            if (hi - lo > 1024)
            {
                // Large ranges: Tukey's ninther (median of three medians of three; Tukey 1978, in Contributions to
                // Survey Sampling and Applied Statistics, 335; recalled from memory) for a pivot nearer the median.
                int s = (hi - lo) / 8;
                pivot = Median3(Median3(Coord(ref c[lo], d), Coord(ref c[lo + s], d), Coord(ref c[lo + 2 * s], d)),
                    Median3(Coord(ref c[m - s], d), Coord(ref c[m], d), Coord(ref c[m + s], d)),
                    Median3(Coord(ref c[hi - 2 * s], d), Coord(ref c[hi - s], d), Coord(ref c[hi], d)));
            }
            else
            {
                pivot = Median3(Coord(ref c[lo], d), Coord(ref c[m], d), Coord(ref c[hi], d));
            }
            int i = lo, j = hi;
            do
            {
                while (Coord(ref c[i], d) < pivot) i++;
                while (pivot < Coord(ref c[j], d)) j--;
                if (i <= j)
                {
                    (c[i], c[j]) = (c[j], c[i]);
                    i++;
                    j--;
                }
            } while (i <= j);
            if (j < k) lo = i;
            if (k < i) hi = j;
        }
    }

    /// <summary>
    /// The original index of the point nearest to (qx, qy, qz) with squared chord at most <paramref name="maxChord2"/>,
    /// or -1; <paramref name="chord2"/> receives its squared chord (or +inf).
    /// </summary>
    public int Nearest(double qx, double qy, double qz, double maxChord2, out double chord2)
    {
        double best2 = maxChord2;
        int best = int.MaxValue;
        if (Count > 0) Nearest(0, 0, Count, qx, qy, qz, ref best2, ref best);
        if (best == int.MaxValue)
        {
            chord2 = double.PositiveInfinity;
            return -1;
        }
        chord2 = best2;
        return best;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Nearest(int node, int lo, int hi, double qx, double qy, double qz, ref double best2, ref int best)
    {
        if (hi - lo <= LeafSize)
        {
            for (int i = lo; i < hi; i++)
            {
                double dx = _x[i] - qx, dy = _y[i] - qy, dz = _z[i] - qz;
                double d2 = dx * dx + dy * dy + dz * dz;
                if (d2 < best2 || (d2 == best2 && _index[i] < best))
                {
                    best2 = d2;
                    best = _index[i];
                }
            }
            return;
        }
        int mid = lo + (hi - lo) / 2;
        ref Node nd = ref _nodes[node];
        int d = nd.Dim;
        double diff = (d == 0 ? qx : d == 1 ? qy : qz) - nd.Split;
        double dl = diff - _slack, dr = -diff - _slack;
        if (diff < 0)
        {
            Nearest(2 * node + 1, lo, mid, qx, qy, qz, ref best2, ref best);
            if (dr < 0 || dr * dr <= best2) Nearest(2 * node + 2, mid, hi, qx, qy, qz, ref best2, ref best);
        }
        else
        {
            Nearest(2 * node + 2, mid, hi, qx, qy, qz, ref best2, ref best);
            if (dl < 0 || dl * dl <= best2) Nearest(2 * node + 1, lo, mid, qx, qy, qz, ref best2, ref best);
        }
    }

    /// <summary>Appends every point with squared chord at most <paramref name="maxChord2"/> (original index, squared chord).</summary>
    public void WithinRadius(double qx, double qy, double qz, double maxChord2, List<int> indices, List<double> chord2)
    {
        var buffer = new PairBuffer(16);
        WithinRadius(qx, qy, qz, maxChord2, buffer);
        for (int k = 0; k < buffer.Count; k++)
        {
            indices.Add(buffer.Right[k]);
            chord2.Add(buffer.Chord2[k]);
        }
    }

    /// <summary>Appends every point with squared chord at most <paramref name="r2"/> to <paramref name="found"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal void WithinRadius(double qx, double qy, double qz, double r2, PairBuffer found)
    {
        if (Count == 0) return;
        var collect = new Collect(found);
        Visit(qx, qy, qz, r2, ref collect);
    }

    /// <summary>What a range search does with each leaf it reaches (a struct, so the traversal is specialised per action).</summary>
    private interface ILeafAction
    {
        void Leaf(SkyKdTree tree, int lo, int hi, double qx, double qy, double qz, double r2);
    }

    private readonly struct Collect(PairBuffer found) : ILeafAction
    {
        public void Leaf(SkyKdTree tree, int lo, int hi, double qx, double qy, double qz, double r2) => tree.ScanLeaf(lo, hi, qx, qy, qz, r2, found);
    }

    private struct Counter : ILeafAction
    {
        public int N;

        public void Leaf(SkyKdTree tree, int lo, int hi, double qx, double qy, double qz, double r2) => N += tree.CountLeaf(lo, hi, qx, qy, qz, r2);
    }

    /// <summary>Visits, in a fixed order, every leaf whose box may hold points within squared chord r2 of q.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Visit<TAction>(double qx, double qy, double qz, double r2, ref TAction action) where TAction : struct, ILeafAction
    {
        if (Count == 0) return;
        Span<int> stack = stackalloc int[3 * StackDepth];
        int sp = 0;
        int node = 0, lo = 0, hi = Count;
        var nodes = _nodes;
        Span<double> q = stackalloc double[3];
        q[0] = qx;
        q[1] = qy;
        q[2] = qz;
        double slack = _slack;
        while (true)
        {
            while (hi - lo > LeafSize)
            {
                int mid = lo + (hi - lo) / 2;
                ref Node nd = ref nodes[node];
                double diff = q[nd.Dim] - nd.Split;
                double dl = diff - slack, dr = -diff - slack;
                bool goL = dl < 0 || dl * dl <= r2, goR = dr < 0 || dr * dr <= r2;
                if (goL)
                {
                    if (goR)
                    {
                        stack[sp] = 2 * node + 2;
                        stack[sp + 1] = mid;
                        stack[sp + 2] = hi;
                        sp += 3;
                    }
                    node = 2 * node + 1;
                    hi = mid;
                }
                else if (goR)
                {
                    node = 2 * node + 2;
                    lo = mid;
                }
                else
                {
                    lo = hi;
                }
            }
            action.Leaf(this, lo, hi, qx, qy, qz, r2);
            if (sp == 0) return;
            sp -= 3;
            node = stack[sp];
            lo = stack[sp + 1];
            hi = stack[sp + 2];
        }
    }

    /// <summary>The number of points with squared chord at most <paramref name="maxChord2"/>.</summary>
    public int CountWithin(double qx, double qy, double qz, double maxChord2)
    {
        if (Count == 0) return 0;
        var counter = new Counter();
        Visit(qx, qy, qz, maxChord2, ref counter);
        return counter.N;
    }

    /// <summary>True when at least one point lies within squared chord <paramref name="maxChord2"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public bool AnyWithin(double qx, double qy, double qz, double maxChord2)
    {
        if (Count == 0) return false;
        Span<int> stack = stackalloc int[3 * StackDepth];
        int sp = 0;
        int node = 0, lo = 0, hi = Count;
        var nodes = _nodes;
        Span<double> q = stackalloc double[3];
        q[0] = qx;
        q[1] = qy;
        q[2] = qz;
        double slack = _slack, r2 = maxChord2;
        while (true)
        {
            while (hi - lo > LeafSize)
            {
                int mid = lo + (hi - lo) / 2;
                ref Node nd = ref nodes[node];
                double diff = q[nd.Dim] - nd.Split;
                double dl = diff - slack, dr = -diff - slack;
                bool goL = dl < 0 || dl * dl <= r2, goR = dr < 0 || dr * dr <= r2;
                // Near side first, the other one stacked: a hit ends the search early.
                if (goL && goR)
                {
                    bool leftFirst = diff < 0;
                    stack[sp] = leftFirst ? 2 * node + 2 : 2 * node + 1;
                    stack[sp + 1] = leftFirst ? mid : lo;
                    stack[sp + 2] = leftFirst ? hi : mid;
                    sp += 3;
                    if (leftFirst)
                    {
                        node = 2 * node + 1;
                        hi = mid;
                    }
                    else
                    {
                        node = 2 * node + 2;
                        lo = mid;
                    }
                }
                else if (goL)
                {
                    node = 2 * node + 1;
                    hi = mid;
                }
                else if (goR)
                {
                    node = 2 * node + 2;
                    lo = mid;
                }
                else
                {
                    lo = hi;
                }
            }
            if (CountLeaf(lo, hi, qx, qy, qz, r2) > 0) return true;
            if (sp == 0) return false;
            sp -= 3;
            node = stack[sp];
            lo = stack[sp + 1];
            hi = stack[sp + 2];
        }
    }
    /// <summary>
    /// Appends the points of [lo, hi) within squared chord r2. Four points at a time where the hardware has 256-bit
    /// vectors; each lane does the scalar arithmetic ((dx dx + dy dy) + dz dz, no fused multiply-add), so the squared
    /// chords are bit for bit those of the scalar loop.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void ScanLeaf(int lo, int hi, double qx, double qy, double qz, double r2, PairBuffer found)
    {
        int i = lo;
        if (Vector256.IsHardwareAccelerated)
        {
            var vx = Vector256.Create(qx);
            var vy = Vector256.Create(qy);
            var vz = Vector256.Create(qz);
            var vr = Vector256.Create(r2);
            ref double bx = ref MemoryMarshal.GetArrayDataReference(_x);
            ref double by = ref MemoryMarshal.GetArrayDataReference(_y);
            ref double bz = ref MemoryMarshal.GetArrayDataReference(_z);
            for (; i + 4 <= hi; i += 4)
            {
                var dx = Vector256.LoadUnsafe(ref bx, (nuint)i) - vx;
                var dy = Vector256.LoadUnsafe(ref by, (nuint)i) - vy;
                var dz = Vector256.LoadUnsafe(ref bz, (nuint)i) - vz;
                var d2 = dx * dx + dy * dy + dz * dz;
                uint mask = Vector256.LessThanOrEqual(d2, vr).ExtractMostSignificantBits();
                while (mask != 0)
                {
                    int j = BitOperations.TrailingZeroCount(mask);
                    found.Add(_index[i + j], d2.GetElement(j));
                    mask &= mask - 1;
                }
            }
        }
        for (; i < hi; i++)
        {
            double dx = _x[i] - qx, dy = _y[i] - qy, dz = _z[i] - qz;
            double d2 = dx * dx + dy * dy + dz * dz;
            if (d2 <= r2) found.Add(_index[i], d2);
        }
    }

    /// <summary>How many points of [lo, hi) lie within squared chord r2 (vectorised like <see cref="ScanLeaf"/>).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private int CountLeaf(int lo, int hi, double qx, double qy, double qz, double r2)
    {
        int i = lo, n = 0;
        if (Vector256.IsHardwareAccelerated)
        {
            var vx = Vector256.Create(qx);
            var vy = Vector256.Create(qy);
            var vz = Vector256.Create(qz);
            var vr = Vector256.Create(r2);
            ref double bx = ref MemoryMarshal.GetArrayDataReference(_x);
            ref double by = ref MemoryMarshal.GetArrayDataReference(_y);
            ref double bz = ref MemoryMarshal.GetArrayDataReference(_z);
            for (; i + 4 <= hi; i += 4)
            {
                var dx = Vector256.LoadUnsafe(ref bx, (nuint)i) - vx;
                var dy = Vector256.LoadUnsafe(ref by, (nuint)i) - vy;
                var dz = Vector256.LoadUnsafe(ref bz, (nuint)i) - vz;
                var d2 = dx * dx + dy * dy + dz * dz;
                n += BitOperations.PopCount(Vector256.LessThanOrEqual(d2, vr).ExtractMostSignificantBits());
            }
        }
        for (; i < hi; i++)
        {
            double dx = _x[i] - qx, dy = _y[i] - qy, dz = _z[i] - qz;
            if (dx * dx + dy * dy + dz * dz <= r2) n++;
        }
        return n;
    }
}
