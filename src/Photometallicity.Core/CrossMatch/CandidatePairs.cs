using System.Runtime.CompilerServices;
namespace Photometallicity.CrossMatch;

/// <summary>
/// Every (left, right) pair within a radius, in compressed-row form: the candidates of left row i are
/// <c>Right[Start[i] .. Start[i+1])</c> with their squared chords, in the order the tree found them.
/// Built in parallel over fixed chunks of left rows and concatenated in chunk order (deterministic).
/// </summary>
public sealed class CandidatePairs
{
    private CandidatePairs(int[] start, int[] right, double[] chord2)
    {
        Start = start;
        Right = right;
        Chord2 = chord2;
    }

    public int[] Start { get; }
    public int[] Right { get; }
    public double[] Chord2 { get; }
    public int LeftCount => Start.Length - 1;
    public int PairCount => Right.Length;

    public int CountOf(int left) => Start[left + 1] - Start[left];

    /// <summary>All pairs with the query point of each left row given by its unit vector.</summary>
    public static CandidatePairs Find(SkyKdTree tree, UnitVectors left, double maxChord2)
    {
        int n = left.Count;
        int chunks = Chunks.Count(n);
        var order = left.Order;
        var countInOrder = new int[n];
        var chunkRight = new int[chunks][];
        var chunkChord = new double[chunks][];
        double[] x = left.X, y = left.Y, z = left.Z;
        Chunks.For(n, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (c, lo, hi) =>
        {
            // The chunk's query points gathered first (independent loads that overlap), then searched in order.
            int m = hi - lo;
            var qx = new double[m];
            var qy = new double[m];
            var qz = new double[m];
            for (int k = 0; k < m; k++)
            {
                int i = order[lo + k];
                qx[k] = x[i];
                qy[k] = y[i];
                qz[k] = z[i];
            }
            var found = new PairBuffer(2 * m);
            for (int k = 0; k < m; k++)
            {
                int before = found.Count;
                tree.WithinRadius(qx[k], qy[k], qz[k], maxChord2, found);
                countInOrder[lo + k] = found.Count - before;
            }
            chunkRight[c] = found.Right;
            chunkChord[c] = found.Chord2;
        });
        var counts = new int[n];
        for (int k = 0; k < n; k++) counts[order[k]] = countInOrder[k];
        var start = new int[n + 1];
        for (int i = 0; i < n; i++) start[i + 1] = start[i] + counts[i];
        var right = new int[start[n]];
        var chord = new double[start[n]];
        // Scatter each chunk's candidates to their left rows (disjoint destinations, so chunks run in parallel).
        Chunks.For(n, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (c, lo, hi) =>
        {
            int at = 0;
            var cr = chunkRight[c];
            var cc = chunkChord[c];
            for (int k = lo; k < hi; k++)
            {
                int m = countInOrder[k];
                if (m == 0) continue;
                int to = start[order[k]];
                for (int j = 0; j < m; j++)
                {
                    right[to + j] = cr[at + j];
                    chord[to + j] = cc[at + j];
                }
                at += m;
            }
        });
        return new CandidatePairs(start, right, chord);
    }

    /// <summary>For each right row, how many left rows have it as a candidate.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public int[] RightCounts(int rightCount)
    {
        var c = new int[rightCount];
        foreach (int r in Right) c[r]++;
        return c;
    }
}
