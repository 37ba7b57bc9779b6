using Photometallicity.CrossMatch;

namespace Photometallicity.Tiling;

/// <summary>
/// How far the outcome of the one-to-one assignment can depend on other sources. <see cref="OneToOneMatcher"/> takes
/// the pairs in one total order (squared chord, left row, right row) and accepts a pair when neither side is taken, so
/// whether pair e is accepted depends only on the pairs that share a source with e and come before it, and on theirs
/// in turn: the pairs reachable from e along chains of adjacent pairs, each earlier than the one before. A tile
/// reproduces the assignment of a source exactly when it holds the complete neighbourhood of every source on those
/// chains (<see cref="TileMatchCheck"/>). <see cref="Measure"/> gives the largest reach: how far from a source those chains
/// go: for every pair, the bounding box (in unit-vector space) of all sources on its chains is the box of its own two
/// sources joined with the boxes of the earlier pairs adjacent to it, a dynamic programme over the pairs in increasing
/// order; a left source's chains lie in the union of its pairs' boxes.
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
        var leftOf = LeftOf(pairs);
        return LongestChain(pairs, rightCount, leftOf, AssignmentOrder(pairs, leftOf));
    }

    /// <summary>Both measures from one sort of the pairs: the longest chain (pairs) and the largest reach.</summary>
    public static (int LongestChain, Units.Angle LargestReach) Measure(CandidatePairs pairs, UnitVectors left, UnitVectors right)
    {
        var leftOf = LeftOf(pairs);
        var order = AssignmentOrder(pairs, leftOf);
        return (LongestChain(pairs, right.Count, leftOf, order), LargestReach(pairs, left, right, leftOf, order));
    }

    /// <summary>Pair indices in the assignment's order.</summary>
    private static int[] AssignmentOrder(CandidatePairs pairs, int[] leftOf)
    {
        var order = new int[pairs.PairCount];
        for (int k = 0; k < order.Length; k++) order[k] = k;
        Array.Sort(order, (a, b) => Compare(pairs, leftOf, a, b));
        return order;
    }

    private static int LongestChain(CandidatePairs pairs, int rightCount, int[] leftOf, int[] order)
    {
        if (order.Length == 0) return 0;
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

    /// <summary>
    /// The largest reach: the largest distance from a left source to a corner of the bounding box of every source on its chains (an
    /// upper bound on how far from the source the sources that decide its match can lie), on the observed positions.
    /// </summary>
    private static Units.Angle LargestReach(CandidatePairs pairs, UnitVectors left, UnitVectors right, int[] leftOf, int[] order)
    {
        if (order.Length == 0) return Units.Angle.FromRadians(0);
        var atLeft = Boxes(left);
        var atRight = Boxes(right);
        Span<double> box = stackalloc double[6];
        foreach (int k in order)
        {
            int l = leftOf[k], r = pairs.Right[k];
            for (int d = 0; d < 6; d++)
                box[d] = d < 3 ? Math.Min(atLeft[6 * l + d], atRight[6 * r + d]) : Math.Max(atLeft[6 * l + d], atRight[6 * r + d]);
            box.CopyTo(atLeft.AsSpan(6 * l, 6));
            box.CopyTo(atRight.AsSpan(6 * r, 6));
        }
        double worst = 0;
        for (int i = 0; i < pairs.LeftCount; i++)
        {
            if (pairs.CountOf(i) == 0) continue;
            double x = left.X[i], y = left.Y[i], z = left.Z[i];
            var b = atLeft.AsSpan(6 * i, 6);
            double dx = Math.Max(x - b[0], b[3] - x), dy = Math.Max(y - b[1], b[4] - y), dz = Math.Max(z - b[2], b[5] - z);
            worst = Math.Max(worst, Math.Sqrt(dx * dx + dy * dy + dz * dz));
        }
        // The chord of the farthest corner; as an angle (2 asin(c/2)), which is never smaller.
        return Units.Angle.FromRadians(2 * Math.Asin(Math.Min(1.0, worst / 2)));
    }

    /// <summary>Each point's degenerate box: min x, y, z then max x, y, z.</summary>
    private static double[] Boxes(UnitVectors v)
    {
        var b = new double[6 * v.Count];
        for (int i = 0; i < v.Count; i++)
        {
            b[6 * i] = b[6 * i + 3] = v.X[i];
            b[6 * i + 1] = b[6 * i + 4] = v.Y[i];
            b[6 * i + 2] = b[6 * i + 5] = v.Z[i];
        }
        return b;
    }
}
