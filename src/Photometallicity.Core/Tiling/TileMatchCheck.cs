using Photometallicity.CrossMatch;
using Photometallicity.Errors;

namespace Photometallicity.Tiling;

/// <summary>
/// Proof that a tile's cross-match of its owned sources equals the whole-field one. The one-to-one assignment
/// (<see cref="OneToOneMatcher"/>) of a source depends only on the connected component of the candidate-pair graph it
/// lies in (sources of other components never compete with it). A component whose sources all have ring 0 or 1 has
/// every candidate of every member inside the tile (their whole neighbourhoods within the margin are there), so it
/// is the same component as in the whole field and gets the same assignment. A component that reaches ring 2 could
/// continue outside the tile: the check then refuses the tile rather than guess.
/// </summary>
public static class TileMatchCheck
{
    /// <summary>Throws a <see cref="MethodException"/> when an owned left source's component reaches ring 2.</summary>
    public static void Require(CandidatePairs pairs, byte[] leftRing, byte[] rightRing, int tileIndex)
    {
        int nl = leftRing.Length, nr = rightRing.Length;
        var parent = new int[nl + nr];
        for (int i = 0; i < parent.Length; i++) parent[i] = i;
        int Find(int x)
        {
            while (parent[x] != x) { parent[x] = parent[parent[x]]; x = parent[x]; }
            return x;
        }
        for (int i = 0; i < nl; i++)
            for (int k = pairs.Start[i]; k < pairs.Start[i + 1]; k++)
            {
                int a = Find(i), b = Find(nl + pairs.Right[k]);
                if (a != b) parent[Math.Max(a, b)] = Math.Min(a, b);
            }
        var reachesEdge = new bool[parent.Length];
        for (int i = 0; i < nl; i++) if (leftRing[i] >= 2) reachesEdge[Find(i)] = true;
        for (int r = 0; r < nr; r++) if (rightRing[r] >= 2) reachesEdge[Find(nl + r)] = true;
        for (int i = 0; i < nl; i++)
        {
            if (leftRing[i] != 0 || pairs.CountOf(i) == 0 || !reachesEdge[Find(i)]) continue;
            throw new MethodException($"tile {tileIndex}: a chain of competing match candidates from an owned source (tile row {i + 1}) reaches the outer edge of the tile's margin, so its match cannot be proved equal to the whole-field one; split again with a larger --margin");
        }
    }
}
