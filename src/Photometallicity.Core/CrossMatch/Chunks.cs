namespace Photometallicity.CrossMatch;

/// <summary>
/// Deterministic parallel loops: the rows are cut into fixed chunks whose boundaries do not depend on the
/// number of threads; each chunk writes its results by index (or into its own slot), so the outcome is the
/// same on one core or many.
/// </summary>
internal static class Chunks
{
    public const int Size = 4096;

    public static int Count(int n) => (n + Size - 1) / Size;

    /// <summary>Runs <paramref name="body"/>(chunk, lo, hi) for every chunk of [0, n), in parallel.</summary>
    public static void For(int n, Action<int, int, int> body)
    {
        int chunks = Count(n);
        if (chunks <= 1)
        {
            if (n > 0) body(0, 0, n);
            return;
        }
        Parallel.For(0, chunks, c => body(c, c * Size, Math.Min(n, (c + 1) * Size)));
    }
}
