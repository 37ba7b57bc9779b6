namespace Photometallicity.Metallicity;

/// <summary>
/// Per-star [Fe/H] summary, one entry per input row in input order. Feh, FehLo, FehHi are the posterior median and the 16th
/// and 84th percentiles (dex), NaN where the status gives no value. For IndexAboveRange / IndexBelowRange, Feh is NaN and the
/// one-sided limit is in FehLimit with LimitSide saying which side; it is also copied into FehLo (lower limit: the 16th
/// percentile of the posterior inside the domain) or FehHi (upper limit: the 84th), the other being NaN.
/// Likelihoods holds the ensemble-marginalised likelihood (no prior) of every star with a value (Ok, PosteriorTruncated).
/// </summary>
public sealed record MetallicityResult
{
    public required double[] Feh { get; init; }
    public required double[] FehLo { get; init; }
    public required double[] FehHi { get; init; }
    public required double[] FehLimit { get; init; }
    public required FehLimitSide[] LimitSide { get; init; }
    public required MetallicityStatus[] Status { get; init; }
    public required FehLikelihoods Likelihoods { get; init; }

    /// <summary>Number of stars with each status (every status present, zero included).</summary>
    public required IReadOnlyDictionary<MetallicityStatus, int> Counts { get; init; }

    /// <summary>Colour-node spacing of the tabulated model (mag) and the number of ensemble members used.</summary>
    public required double ColourNodeStep { get; init; }
    public required int EnsembleMembers { get; init; }

    public int Count => Feh.Length;

    /// <summary>Number of stars with each status, every status present (zero included), in the enum's order.</summary>
    public static IReadOnlyDictionary<MetallicityStatus, int> CountsOf(MetallicityStatus[] status)
    {
        var counts = Enum.GetValues<MetallicityStatus>().ToDictionary(s => s, _ => 0);
        foreach (var s in status) counts[s]++;
        return counts;
    }
}
