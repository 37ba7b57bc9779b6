namespace Photometallicity.Validation;

/// <summary>One true member as the scoring sees it: the truth and what the run gave it.</summary>
public readonly record struct ScoredStar(double FehTrue, double Feh, double FehLo, double FehHi, string Status, bool NarrowDetected, double NarrowSnr)
{
    /// <summary>A value: any status whose feh is finite (ok, posterior_truncated, and any later status with full values).</summary>
    public bool HasValue => double.IsFinite(Feh);

    /// <summary>A limit: index above range with a finite lower limit, or below range with a finite upper limit.</summary>
    public bool HasLimit => !HasValue && ((Status == "index_above_range" && double.IsFinite(FehLo)) || (Status == "index_below_range" && double.IsFinite(FehHi)));

    /// <summary>(feh - truth) over the posterior's half-width on the truth's side: feh_hi - feh when the truth is above, feh - feh_lo otherwise.</summary>
    public double Pull
    {
        get
        {
            double d = Feh - FehTrue;
            double s = FehTrue > Feh ? FehHi - Feh : Feh - FehLo;
            return s > 0 && double.IsFinite(s) ? d / s : double.NaN;
        }
    }

    public bool Covered => FehLo <= FehTrue && FehTrue <= FehHi;
}

/// <summary>The numbers of one magnitude bin (or any set of members).</summary>
public sealed record BinScore
{
    public int Members { get; init; }
    public int NarrowDetected { get; init; }
    public int WithValue { get; init; }
    public int WithLimit { get; init; }
    /// <summary>Share of the narrow-detected members given a value or a limit.</summary>
    public double ShareValueOrLimit { get; init; } = double.NaN;
    /// <summary>Median of feh - truth over the members with a value (dex).</summary>
    public double MedianBias { get; init; } = double.NaN;
    /// <summary>1.4826 x the median absolute deviation of the pulls.</summary>
    public double PullWidth { get; init; } = double.NaN;
    /// <summary>Share of the members with a value whose [feh_lo, feh_hi] holds the truth.</summary>
    public double Coverage68 { get; init; } = double.NaN;
    /// <summary>Median (feh_hi - feh_lo) / 2 (dex).</summary>
    public double MedianHalfWidth { get; init; } = double.NaN;
}

/// <summary>Scores sets of members against their truth.</summary>
public static class Scoring
{
    /// <summary>Scale of the MAD to a Gaussian sigma, 1 / Phi^-1(3/4) = 1.4826 (Rousseeuw &amp; Croux 1993, JASA 88, 1273).</summary>
    public const double MadToSigma = 1.4826;

    public static BinScore Score(IReadOnlyList<ScoredStar> members)
    {
        int detected = 0, value = 0, limit = 0, assigned = 0;
        var bias = new List<double>();
        var pulls = new List<double>();
        var half = new List<double>();
        int covered = 0;
        foreach (var s in members)
        {
            if (s.NarrowDetected)
            {
                detected++;
                if (s.HasValue || s.HasLimit) assigned++;
            }
            if (s.HasLimit) limit++;
            if (!s.HasValue) continue;
            value++;
            bias.Add(s.Feh - s.FehTrue);
            double p = s.Pull;
            if (double.IsFinite(p)) pulls.Add(p);
            if (s.Covered) covered++;
            half.Add(0.5 * (s.FehHi - s.FehLo));
        }
        return new BinScore
        {
            Members = members.Count,
            NarrowDetected = detected,
            WithValue = value,
            WithLimit = limit,
            ShareValueOrLimit = detected > 0 ? (double)assigned / detected : double.NaN,
            MedianBias = Median(bias),
            PullWidth = pulls.Count > 0 ? MadToSigma * Mad(pulls) : double.NaN,
            Coverage68 = value > 0 ? (double)covered / value : double.NaN,
            MedianHalfWidth = Median(half),
        };
    }

    public static double Median(IReadOnlyList<double> v)
    {
        var f = v.Where(double.IsFinite).ToArray();
        if (f.Length == 0) return double.NaN;
        Array.Sort(f);
        int n = f.Length;
        return n % 2 == 1 ? f[n / 2] : 0.5 * (f[n / 2 - 1] + f[n / 2]);
    }

    /// <summary>Median absolute deviation about the median (unscaled).</summary>
    public static double Mad(IReadOnlyList<double> v)
    {
        double m = Median(v);
        return Median(v.Select(x => Math.Abs(x - m)).ToArray());
    }
}
