namespace Photometallicity.Membership;

/// <summary>
/// Deterministic parallel sums: the rows are cut into fixed chunks (independent of the thread count), each chunk
/// sums into its own accumulator, and the chunk accumulators are added in chunk order. The result is therefore
/// bit-identical for any degree of parallelism.
/// </summary>
internal static class ChunkedReduction
{
    public const int ChunkSize = 4096;

    /// <summary>Runs <paramref name="body"/>(start, end, accumulator) on every chunk and returns the ordered sum of accumulators.</summary>
    public static double[] Sum(int count, int width, int maxThreads, Action<int, int, double[]> body)
    {
        int chunks = (count + ChunkSize - 1) / ChunkSize;
        if (chunks <= 1 || maxThreads == 1)
        {
            // same chunks, same order of addition: identical to the parallel result
            var sum = new double[width];
            for (int c = 0; c < chunks; c++)
            {
                var acc1 = new double[width];
                int s0 = c * ChunkSize;
                body(s0, Math.Min(count, s0 + ChunkSize), acc1);
                for (int k = 0; k < width; k++) sum[k] += acc1[k];
            }
            return sum;
        }
        var partial = new double[chunks][];
        var po = new ParallelOptions { MaxDegreeOfParallelism = maxThreads > 0 ? maxThreads : -1 };
        Parallel.For(0, chunks, po, c =>
        {
            var acc = new double[width];
            int start = c * ChunkSize;
            body(start, Math.Min(count, start + ChunkSize), acc);
            partial[c] = acc;
        });
        var total = new double[width];
        for (int c = 0; c < chunks; c++)
            for (int k = 0; k < width; k++) total[k] += partial[c][k];
        return total;
    }
}
