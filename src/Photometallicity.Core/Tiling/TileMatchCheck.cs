using Photometallicity.CrossMatch;
using Photometallicity.Errors;

namespace Photometallicity.Tiling;

/// <summary>
/// Proof that a tile's cross-match of its owned sources equals the whole-field one. Whether a pair is accepted by the
/// one-to-one assignment depends only on the pairs reachable from it along chains of adjacent pairs that come earlier
/// in the assignment's order (see <see cref="CandidateChains"/>). If every source on those chains has ring 0 or 1,
/// the tile holds each of their complete neighbourhoods within the margin, so the chains, the order and the outcome are
/// those of the whole field. A chain that reaches a ring-2 source could continue outside the tile: the check then
/// refuses the tile rather than guess.
/// </summary>
public static class TileMatchCheck
{
    /// <summary>Throws a <see cref="MethodException"/> when the chains of an owned left source reach ring 2.</summary>
    public static void Require(CandidatePairs pairs, byte[] leftRing, byte[] rightRing, int tileIndex)
    {
        int nl = leftRing.Length, nr = rightRing.Length, p = pairs.PairCount;
        var leftOf = CandidateChains.LeftOf(pairs);
        // Pairs of each right source, in compressed-row form.
        var rightStart = new int[nr + 1];
        foreach (int r in pairs.Right) rightStart[r + 1]++;
        for (int r = 0; r < nr; r++) rightStart[r + 1] += rightStart[r];
        var fill = (int[])rightStart.Clone();
        var byRight = new int[p];
        for (int k = 0; k < p; k++) byRight[fill[pairs.Right[k]]++] = k;

        var visited = new bool[p];
        var stack = new Stack<int>();
        for (int i = 0; i < nl; i++)
        {
            if (leftRing[i] != 0) continue;
            for (int k = pairs.Start[i]; k < pairs.Start[i + 1]; k++)
                if (!visited[k]) { visited[k] = true; stack.Push(k); }
            while (stack.Count > 0)
            {
                int e = stack.Pop();
                int l = leftOf[e], r = pairs.Right[e];
                if (leftRing[l] >= 2 || rightRing[r] >= 2)
                    throw new MethodException($"tile {tileIndex}: a chain of competing match candidates from an owned source (tile row {i + 1}) reaches the outer edge of the tile's margin, so its match cannot be proved equal to the whole-field one; split again with a larger --margin");
                for (int k = pairs.Start[l]; k < pairs.Start[l + 1]; k++)
                    if (!visited[k] && CandidateChains.Compare(pairs, leftOf, k, e) < 0) { visited[k] = true; stack.Push(k); }
                for (int q = rightStart[r]; q < rightStart[r + 1]; q++)
                {
                    int k = byRight[q];
                    if (!visited[k] && CandidateChains.Compare(pairs, leftOf, k, e) < 0) { visited[k] = true; stack.Push(k); }
                }
            }
        }
    }
}
