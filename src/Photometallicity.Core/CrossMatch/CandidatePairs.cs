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
        var counts = new int[n];
        var chunkRight = new int[chunks][];
        var chunkChord = new double[chunks][];
        Chunks.For(n, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (c, lo, hi) =>
        {
            var found = new PairBuffer(2 * (hi - lo));
            double[] x = left.X, y = left.Y, z = left.Z;
            for (int k = lo; k < hi; k++)
            {
                int i = order[k];
                int before = found.Count;
                tree.WithinRadius(x[i], y[i], z[i], maxChord2, found);
                counts[i] = found.Count - before;
            }
            chunkRight[c] = found.Right;
            chunkChord[c] = found.Chord2;
        });
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
                int i = order[k];
                int m = counts[i];
                Array.Copy(cr, at, right, start[i], m);
                Array.Copy(cc, at, chord, start[i], m);
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
