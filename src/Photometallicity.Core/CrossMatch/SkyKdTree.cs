using System.Runtime.CompilerServices;
namespace Photometallicity.CrossMatch;

/// <summary>
/// A balanced k-d tree (Bentley 1975, Commun. ACM 18, 509) over unit vectors on the celestial sphere.
/// Distances are chord lengths in 3-D, which are monotonic in the great-circle angle, so there is no RA
/// wrap and no pole to handle. Built in O(N log N): each node splits its range at the median (quickselect,
/// Hoare 1961, Commun. ACM 4, 321) along the axis of largest extent; the layout is implicit (children of node
/// k are 2k+1 and 2k+2, the split is at the middle of the range), so the tree depends only on the data.
/// Queries are read-only and thread-safe. Ties in distance go to the smaller original index.
/// </summary>
public sealed class SkyKdTree
{
    private const int LeafSize = 12;
    private const int ParallelDepth = 4;

    private readonly double[] _x, _y, _z;
    private readonly int[] _index;
    private readonly byte[] _dim;
    private readonly double[] _split;

    private SkyKdTree(double[] x, double[] y, double[] z, int[] index, byte[] dim, double[] split)
    {
        _x = x;
        _y = y;
        _z = z;
        _index = index;
        _dim = dim;
        _split = split;
    }

    public int Count => _index.Length;

    /// <summary>Builds the tree over copies of the given vectors (the inputs are not modified).</summary>
    public static SkyKdTree Build(UnitVectors points)
    {
        int n = points.Count;
        var x = (double[])points.X.Clone();
        var y = (double[])points.Y.Clone();
        var z = (double[])points.Z.Clone();
        var index = new int[n];
        for (int i = 0; i < n; i++) index[i] = i;
        int levels = 0;
        for (int m = n; m > LeafSize; m = (m + 1) / 2) levels++;
        int internalNodes = (1 << levels) - 1;
        var dim = new byte[Math.Max(1, internalNodes)];
        var split = new double[Math.Max(1, internalNodes)];
        var tree = new SkyKdTree(x, y, z, index, dim, split);
        tree.BuildNode(0, 0, n, 0);
        return tree;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void BuildNode(int node, int lo, int hi, int depth)
    {
        if (hi - lo <= LeafSize) return;
        double minX = double.MaxValue, maxX = double.MinValue, minY = double.MaxValue, maxY = double.MinValue, minZ = double.MaxValue, maxZ = double.MinValue;
        for (int i = lo; i < hi; i++)
        {
            double a = _x[i], b = _y[i], c = _z[i];
            if (a < minX) minX = a;
            if (a > maxX) maxX = a;
            if (b < minY) minY = b;
            if (b > maxY) maxY = b;
            if (c < minZ) minZ = c;
            if (c > maxZ) maxZ = c;
        }
        double ex = maxX - minX, ey = maxY - minY, ez = maxZ - minZ;
        int d = ex >= ey && ex >= ez ? 0 : ey >= ez ? 1 : 2;
        int mid = lo + (hi - lo) / 2;
        Select(Axis(d), lo, hi - 1, mid);
        _dim[node] = (byte)d;
        _split[node] = Axis(d)[mid];
        if (depth < ParallelDepth && hi - lo > 50_000)
        {
            Parallel.Invoke(
                () => BuildNode(2 * node + 1, lo, mid, depth + 1),
                () => BuildNode(2 * node + 2, mid, hi, depth + 1));
        }
        else
        {
            BuildNode(2 * node + 1, lo, mid, depth + 1);
            BuildNode(2 * node + 2, mid, hi, depth + 1);
        }
    }

    private double[] Axis(int d) => d == 0 ? _x : d == 1 ? _y : _z;

    /// <summary>Quickselect (Wirth's variant of Hoare's FIND): puts the k-th smallest of c[lo..hi] at k.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Select(double[] c, int lo, int hi, int k)
    {
        while (hi > lo)
        {
            int m = lo + (hi - lo) / 2;
            double a = c[lo], b = c[m], e = c[hi];
            double pivot = a < b ? (b < e ? b : a < e ? e : a) : (a < e ? a : b < e ? e : b);
            int i = lo, j = hi;
            do
            {
                while (c[i] < pivot) i++;
                while (pivot < c[j]) j--;
                if (i <= j)
                {
                    Swap(i, j);
                    i++;
                    j--;
                }
            } while (i <= j);
            if (j < k) lo = i;
            if (k < i) hi = j;
        }
    }

    private void Swap(int i, int j)
    {
        (_x[i], _x[j]) = (_x[j], _x[i]);
        (_y[i], _y[j]) = (_y[j], _y[i]);
        (_z[i], _z[j]) = (_z[j], _z[i]);
        (_index[i], _index[j]) = (_index[j], _index[i]);
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
        int d = _dim[node];
        double diff = (d == 0 ? qx : d == 1 ? qy : qz) - _split[node];
        if (diff < 0)
        {
            Nearest(2 * node + 1, lo, mid, qx, qy, qz, ref best2, ref best);
            if (diff * diff <= best2) Nearest(2 * node + 2, mid, hi, qx, qy, qz, ref best2, ref best);
        }
        else
        {
            Nearest(2 * node + 2, mid, hi, qx, qy, qz, ref best2, ref best);
            if (diff * diff <= best2) Nearest(2 * node + 1, lo, mid, qx, qy, qz, ref best2, ref best);
        }
    }

    /// <summary>Appends every point with squared chord at most <paramref name="maxChord2"/> (original index, squared chord).</summary>
    public void WithinRadius(double qx, double qy, double qz, double maxChord2, List<int> indices, List<double> chord2)
    {
        if (Count > 0) Within(0, 0, Count, qx, qy, qz, maxChord2, indices, chord2);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Within(int node, int lo, int hi, double qx, double qy, double qz, double r2, List<int> indices, List<double> chord2)
    {
        if (hi - lo <= LeafSize)
        {
            for (int i = lo; i < hi; i++)
            {
                double dx = _x[i] - qx, dy = _y[i] - qy, dz = _z[i] - qz;
                double d2 = dx * dx + dy * dy + dz * dz;
                if (d2 <= r2)
                {
                    indices.Add(_index[i]);
                    chord2.Add(d2);
                }
            }
            return;
        }
        int mid = lo + (hi - lo) / 2;
        int d = _dim[node];
        double diff = (d == 0 ? qx : d == 1 ? qy : qz) - _split[node];
        if (diff < 0 || diff * diff <= r2) Within(2 * node + 1, lo, mid, qx, qy, qz, r2, indices, chord2);
        if (diff >= 0 || diff * diff <= r2) Within(2 * node + 2, mid, hi, qx, qy, qz, r2, indices, chord2);
    }

    /// <summary>The number of points with squared chord at most <paramref name="maxChord2"/>.</summary>
    public int CountWithin(double qx, double qy, double qz, double maxChord2) =>
        Count > 0 ? CountNode(0, 0, Count, qx, qy, qz, maxChord2) : 0;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private int CountNode(int node, int lo, int hi, double qx, double qy, double qz, double r2)
    {
        if (hi - lo <= LeafSize)
        {
            int c = 0;
            for (int i = lo; i < hi; i++)
            {
                double dx = _x[i] - qx, dy = _y[i] - qy, dz = _z[i] - qz;
                if (dx * dx + dy * dy + dz * dz <= r2) c++;
            }
            return c;
        }
        int mid = lo + (hi - lo) / 2;
        int d = _dim[node];
        double diff = (d == 0 ? qx : d == 1 ? qy : qz) - _split[node];
        int n = 0;
        if (diff < 0 || diff * diff <= r2) n += CountNode(2 * node + 1, lo, mid, qx, qy, qz, r2);
        if (diff >= 0 || diff * diff <= r2) n += CountNode(2 * node + 2, mid, hi, qx, qy, qz, r2);
        return n;
    }

    /// <summary>True when at least one point lies within squared chord <paramref name="maxChord2"/>.</summary>
    public bool AnyWithin(double qx, double qy, double qz, double maxChord2) =>
        Count > 0 && AnyNode(0, 0, Count, qx, qy, qz, maxChord2);

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private bool AnyNode(int node, int lo, int hi, double qx, double qy, double qz, double r2)
    {
        if (hi - lo <= LeafSize)
        {
            for (int i = lo; i < hi; i++)
            {
                double dx = _x[i] - qx, dy = _y[i] - qy, dz = _z[i] - qz;
                if (dx * dx + dy * dy + dz * dz <= r2) return true;
            }
            return false;
        }
        int mid = lo + (hi - lo) / 2;
        int d = _dim[node];
        double diff = (d == 0 ? qx : d == 1 ? qy : qz) - _split[node];
        if (diff < 0)
            return AnyNode(2 * node + 1, lo, mid, qx, qy, qz, r2) || (diff * diff <= r2 && AnyNode(2 * node + 2, mid, hi, qx, qy, qz, r2));
        return AnyNode(2 * node + 2, mid, hi, qx, qy, qz, r2) || (diff * diff <= r2 && AnyNode(2 * node + 1, lo, mid, qx, qy, qz, r2));
    }
}
