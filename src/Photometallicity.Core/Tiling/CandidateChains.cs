using Photometallicity.CrossMatch;

namespace Photometallicity.Tiling;

/// <summary>
/// How far the outcome of the one-to-one assignment can depend on other sources. <see cref="OneToOneMatcher"/> takes
/// the pairs in one total order (squared chord, left row, right row) and accepts a pair when neither side is taken, so
/// whether pair e is accepted depends only on the pairs that share a source with e and come before it, and on theirs
/// in turn: the pairs reachable from e along chains of adjacent pairs, each earlier than the one before. A tile
/// reproduces the assignment of a source exactly when it holds the complete neighbourhood of every source on those
/// chains (<see cref="TileMatchCheck"/>). The longest such chain, counted in pairs, times the largest pair length
/// bounds how far away the sources that matter can be.
/// </summary>
public static class CandidateChains
{
    /// <summary>The left row of every pair (pairs are grouped by left row).</summary>
    public static int[] LeftOf(CandidatePairs pairs)
    {
        var left = new int[pairs.PairCount];
        for (int i = 0; i < pairs.LeftCount; i++)
            for (int k = pairs.Start[i]; k < pairs.Start[i + 1]; k++) left[k] = i;
        return left;
    }

    /// <summary>Compares pairs a and b in the assignment's order.</summary>
    public static int Compare(CandidatePairs pairs, int[] leftOf, int a, int b)
    {
        int c = pairs.Chord2[a].CompareTo(pairs.Chord2[b]);
        if (c != 0) return c;
        c = leftOf[a].CompareTo(leftOf[b]);
        return c != 0 ? c : pairs.Right[a].CompareTo(pairs.Right[b]);
    }

    /// <summary>
    /// The number of pairs on the longest chain of adjacent pairs in decreasing assignment order (1 when no two pairs
    /// share a source; 0 without pairs): a dynamic programme over the pairs in increasing order, each pair's chain one
    /// longer than the longest already ending at either of its sources.
    /// </summary>
    public static int LongestChain(CandidatePairs pairs, int rightCount)
    {
        int p = pairs.PairCount;
        if (p == 0) return 0;
        var leftOf = LeftOf(pairs);
        var order = new int[p];
        for (int k = 0; k < p; k++) order[k] = k;
        Array.Sort(order, (a, b) => Compare(pairs, leftOf, a, b));
        var atLeft = new int[pairs.LeftCount];
        var atRight = new int[rightCount];
        int longest = 0;
        foreach (int k in order)
        {
            int l = leftOf[k], r = pairs.Right[k];
            int depth = 1 + Math.Max(atLeft[l], atRight[r]);
            atLeft[l] = Math.Max(atLeft[l], depth);
            atRight[r] = Math.Max(atRight[r], depth);
            longest = Math.Max(longest, depth);
        }
        return longest;
    }
}
