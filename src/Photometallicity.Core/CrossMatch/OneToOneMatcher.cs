using System.Runtime.CompilerServices;
namespace Photometallicity.CrossMatch;

/// <summary>
/// One-to-one assignment of right rows to left rows from all candidate pairs within the radius: the pairs are
/// put in one global order (separation, then left index, then right index) and accepted greedily when neither
/// side is taken yet. So contention goes to the closer pair and the loser falls back to its next candidate
/// within the radius. The order is total, so the result does not depend on threads or input chunking.
/// (Greedy nearest-first assignment: common practice in catalogue cross-matching.)
/// </summary>
public static class OneToOneMatcher
{
    private readonly record struct Pair(double Chord2, int Left, int Right) : IComparable<Pair>
    {
        public int CompareTo(Pair o)
        {
            int c = Chord2.CompareTo(o.Chord2);
            if (c != 0) return c;
            c = Left.CompareTo(o.Left);
            return c != 0 ? c : Right.CompareTo(o.Right);
        }
    }

    /// <summary>Right index per left row (-1 when none) and the squared chord of the accepted pair (+inf when none).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static (int[] RightIndex, double[] Chord2) Assign(CandidatePairs pairs, int rightCount)
    {
        int nLeft = pairs.LeftCount;
        var rightIndex = new int[nLeft];
        var chord = new double[nLeft];
        Array.Fill(rightIndex, -1);
        Array.Fill(chord, double.PositiveInfinity);
        var rightTaken = new bool[rightCount];

        // Uncontested pairs (the left has one candidate, which no other left shares) need no sorting.
        var rightUse = pairs.RightCounts(rightCount);
        var contested = new List<Pair>();
        for (int i = 0; i < nLeft; i++)
        {
            for (int k = pairs.Start[i]; k < pairs.Start[i + 1]; k++)
            {
                int r = pairs.Right[k];
                if (pairs.CountOf(i) == 1 && rightUse[r] == 1)
                {
                    rightIndex[i] = r;
                    chord[i] = pairs.Chord2[k];
                    rightTaken[r] = true;
                }
                else
                {
                    contested.Add(new Pair(pairs.Chord2[k], i, r));
                }
            }
        }
        var sorted = contested.ToArray();
        Array.Sort(sorted);
        foreach (var p in sorted)
        {
            if (rightIndex[p.Left] >= 0 || rightTaken[p.Right]) continue;
            rightIndex[p.Left] = p.Right;
            chord[p.Left] = p.Chord2;
            rightTaken[p.Right] = true;
        }
        return (rightIndex, chord);
    }
}
