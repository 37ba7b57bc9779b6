using Photometallicity.Numerics;

namespace Photometallicity.Calibration;

/// <summary>
/// The independent units of the standards: each individual star is one unit, each cluster (group id &gt;= 0)
/// is one unit holding all its usable members, because members share one literature [Fe/H] and so are not
/// independent. Units are what the bootstrap resamples and what cross-validation assigns to folds.
/// </summary>
internal sealed class ResampleUnits
{
    private ResampleUnits(int[] start, int[] members)
    {
        Start = start;
        Members = members;
    }

    /// <summary>Unit u holds Members[Start[u] .. Start[u + 1] - 1].</summary>
    public int[] Start { get; }
    public int[] Members { get; }
    public int Count => Start.Length - 1;
    public int Size(int u) => Start[u + 1] - Start[u];

    public static ResampleUnits Build(int[] group, bool[] usable)
    {
        var byGroup = new SortedDictionary<int, List<int>>();
        var units = new List<List<int>>();
        for (int i = 0; i < group.Length; i++)
        {
            if (!usable[i]) continue;
            if (group[i] < 0) { units.Add([i]); continue; }
            if (!byGroup.TryGetValue(group[i], out var list))
            {
                list = [];
                byGroup[group[i]] = list;
                units.Add(list); // units ordered by first appearance: deterministic
            }
            list.Add(i);
        }
        var start = new int[units.Count + 1];
        var members = new int[units.Sum(u => u.Count)];
        int k = 0;
        for (int u = 0; u < units.Count; u++)
        {
            start[u] = k;
            foreach (int i in units[u]) members[k++] = i;
        }
        start[units.Count] = k;
        return new ResampleUnits(start, members);
    }

    /// <summary>Draws Count units with replacement into per-star multiplicities (Efron &amp; Tibshirani 1993, ch. 6; blocks as units).</summary>
    public void Draw(Rng rng, Span<double> multiplicity)
    {
        multiplicity.Clear();
        int n = Count;
        for (int d = 0; d < n; d++)
        {
            int u = rng.NextInt(n);
            for (int k = Start[u]; k < Start[u + 1]; k++) multiplicity[Members[k]] += 1.0;
        }
    }

    /// <summary>
    /// Assigns units to <paramref name="folds"/> folds of about equal numbers of stars: units in a seeded random
    /// order, largest first, each to the fold with the fewest stars so far (ties: lowest fold). Returns the fold
    /// of every standard (-1 for standards in no unit).
    /// </summary>
    public int[] AssignFolds(int folds, int standardCount, ulong seed)
    {
        var rng = new Rng(seed);
        var order = Enumerable.Range(0, Count).ToArray();
        for (int i = order.Length - 1; i > 0; i--)
        {
            int j = rng.NextInt(i + 1);
            (order[i], order[j]) = (order[j], order[i]);
        }
        var sorted = order.Select((u, rank) => (u, rank)).OrderByDescending(t => Size(t.u)).ThenBy(t => t.rank).Select(t => t.u);
        var load = new int[folds];
        var fold = Enumerable.Repeat(-1, standardCount).ToArray();
        foreach (int u in sorted)
        {
            int best = 0;
            for (int f = 1; f < folds; f++) if (load[f] < load[best]) best = f;
            load[best] += Size(u);
            for (int k = Start[u]; k < Start[u + 1]; k++) fold[Members[k]] = best;
        }
        return fold;
    }
}
