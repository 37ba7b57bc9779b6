using Photometallicity.Catalogues;
using Photometallicity.Numerics;

namespace Photometallicity.Demo;

/// <summary>
/// The individual spectroscopic standards of a <see cref="DemoVariant"/> field: an invented spectroscopic survey of
/// members, chosen by magnitude only (never by [Fe/H]), with a known share given a wrong [Fe/H]. The truth is
/// recorded per standard (<c>truth_bad</c> 0/1, <c>truth_feh</c>); the pipeline reads only the columns its config names.
/// </summary>
internal static class VariantStandards
{
    public static Table Make(Rng rng, DemoVariant v, DemoTruth truth, string[] id, double[] ra, double[] dec, bool[] member,
        double[] fehTrue, double[] red0, bool[] detected)
    {
        var picked = v.Standards switch
        {
            StandardsSelection.Bright => Bright(rng, v, member, red0),
            StandardsSelection.Spread => Spread(rng, v, truth, member, red0, detected),
            StandardsSelection.None => [],
            _ => throw new ArgumentException($"standards selection {v.Standards} is not drawn here", nameof(v)),
        };
        int n = picked.Length;
        int nBad = (int)Math.Round(v.BadShare * n, MidpointRounding.AwayFromZero);
        var bad = new bool[n];
        foreach (int k in Shuffled(rng, n).Take(nBad)) bad[k] = true;
        var sid = new string[n];
        var sra = new double[n];
        var sdec = new double[n];
        var feh = new double[n];
        var err = new double[n];
        var tbad = new int[n];
        var tfeh = new double[n];
        for (int k = 0; k < n; k++)
        {
            int i = picked[k];
            sid[k] = $"S{k + 1:D4}";
            sra[k] = ra[i];
            sdec[k] = dec[i];
            err[k] = 0.05 + 0.07 * rng.NextDouble(); // invented spectroscopic errors, as the demo's
            feh[k] = fehTrue[i] + rng.NextGaussian(0, err[k]);
            if (bad[k]) feh[k] += DemoVariant.BadOffset(rng);
            tbad[k] = bad[k] ? 1 : 0;
            tfeh[k] = fehTrue[i];
        }
        var t = new Table(n, "standards.csv");
        t.Add(new Column<string>("star", sid));
        t.Add(new Column<double>("ra", DemoGenerator.WrapAll(DemoGenerator.Round(sra, 7)), unit: "deg"));
        t.Add(new Column<double>("dec", DemoGenerator.Round(sdec, 7), unit: "deg"));
        t.Add(new Column<double>("feh_spec", DemoGenerator.Round(feh, 3), unit: "dex"));
        t.Add(new Column<double>("feh_spec_err", DemoGenerator.Round(err, 3), unit: "dex"));
        t.Add(new Column<int>("truth_bad", tbad, description: "invented truth, for checking only: 1 = given a wrong [Fe/H]"));
        t.Add(new Column<double>("truth_feh", DemoGenerator.Round(tfeh, 4), unit: "dex", description: "invented truth, for checking only"));
        return t;
    }

    /// <summary>Members within <see cref="DemoVariant.BrightRangeMag"/> of the brightest member in the red band, drawn at random.</summary>
    private static int[] Bright(Rng rng, DemoVariant v, bool[] member, double[] red0)
    {
        double tip = double.PositiveInfinity;
        for (int i = 0; i < member.Length; i++) if (member[i]) tip = Math.Min(tip, red0[i]);
        var pool = Enumerable.Range(0, member.Length).Where(i => member[i] && red0[i] < tip + v.BrightRangeMag).ToArray();
        return Shuffled(rng, pool.Length).Take(v.StandardsCount).Select(k => pool[k]).OrderBy(i => i).ToArray();
    }

    /// <summary>Members evenly over red magnitude (equal numbers per 0.5 mag) from the tip to mu + SpreadFaintLimitRel, with a narrow-band detection.</summary>
    private static int[] Spread(Rng rng, DemoVariant v, DemoTruth truth, bool[] member, double[] red0, bool[] detected)
    {
        double faint = truth.DistanceModulus + v.SpreadFaintLimitRel;
        double tip = double.PositiveInfinity;
        for (int i = 0; i < member.Length; i++) if (member[i]) tip = Math.Min(tip, red0[i]);
        int bins = Math.Max(1, (int)Math.Ceiling((faint - tip) / 0.5));
        var pools = new List<int>[bins];
        for (int b = 0; b < bins; b++) pools[b] = [];
        for (int i = 0; i < member.Length; i++)
        {
            if (!member[i] || !detected[i] || red0[i] >= faint) continue;
            pools[Math.Min(bins - 1, (int)((red0[i] - tip) / 0.5))].Add(i);
        }
        // Round-robin over the bins: each bin gives its share, a thin bin's remainder goes to the others.
        var order = pools.Select(p => Shuffled(rng, p.Count).Select(k => p[k]).ToList()).ToArray();
        var picked = new List<int>();
        int round = 0;
        while (picked.Count < v.StandardsCount && order.Any(o => o.Count > round))
        {
            foreach (var o in order)
                if (o.Count > round && picked.Count < v.StandardsCount) picked.Add(o[round]);
            round++;
        }
        picked.Sort();
        return picked.ToArray();
    }

    /// <summary>A random permutation of 0..n-1 (Fisher-Yates).</summary>
    internal static int[] Shuffled(Rng rng, int n)
    {
        var p = Enumerable.Range(0, n).ToArray();
        for (int i = n - 1; i > 0; i--)
        {
            int j = rng.NextInt(i + 1);
            (p[i], p[j]) = (p[j], p[i]);
        }
        return p;
    }
}
