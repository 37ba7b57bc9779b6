namespace Photometallicity.Calibration;

/// <summary>Options of the calibration stage. Defaults are common practice unless a source is named.</summary>
public sealed record CalibrationOptions
{
    /// <summary>Number of bootstrap resamples (0 = no ensemble).</summary>
    public int Bootstrap { get; init; } = 1000;

    /// <summary>Master seed; the stage derives its streams from it by name.</summary>
    public ulong Seed { get; init; }

    /// <summary>Degree of the forward model's colour polynomial (1..3); null = chosen by cross-validation.</summary>
    public int? Degree { get; init; }

    /// <summary>Highest colour degree cross-validation may choose (1..3).</summary>
    public int MaxDegree { get; init; } = 2;

    /// <summary>Interior [Fe/H] knots of the monotone ramps (0..4); null = chosen by cross-validation.</summary>
    public int? Knots { get; init; }

    /// <summary>Most interior knots cross-validation may choose (0..4).</summary>
    public int MaxKnots { get; init; } = 2;

    /// <summary>
    /// The model's form: true (default) the monotone model (<see cref="MonotoneBasis"/>); false the full 2-D polynomial of
    /// total degree <see cref="Degree"/> (or 1..<see cref="MaxDegree"/> by cross-validation), which is not monotonic by
    /// construction (kept for comparison with earlier calibrations).
    /// </summary>
    public bool Monotone { get; init; } = true;

    /// <summary>
    /// Only the separable form (a shared [Fe/H] shape whose amplitude changes with colour, <see cref="SeparableBasis"/>); false
    /// (default) lets cross-validation also try the form whose shape may change with colour (<see cref="MonotoneBasis"/>).
    /// </summary>
    public bool SeparableOnly { get; init; }

    /// <summary>Fit an outlier component (default); false gives the plain effective-variance likelihood, every standard good.</summary>
    public bool Outliers { get; init; } = true;

    /// <summary>Cross-validation folds (whole clusters stay in one fold).</summary>
    public int Folds { get; init; } = 5;

    /// <summary>The filter set the standards' photometry belongs to; recorded in the model.</summary>
    public required FilterSet Filters { get; init; }

    /// <summary>Standards with log g above this are rejected as not giants; null = no cut (LogG is then ignored).</summary>
    public double? MaxLogG { get; init; }


    /// <summary>Maximum threads for the bootstrap; null = all cores. Results do not depend on it.</summary>
    public int? MaxThreads { get; init; }

    /// <summary>Free-form provenance copied into the model (version, checksums); the stage adds seed and degree.</summary>
    public IReadOnlyDictionary<string, string>? Provenance { get; init; }

    /// <summary>Throws <see cref="Errors.InputException"/> for an option out of range, naming the key.</summary>
    public void Validate()
    {
        static Errors.InputException Bad(string key, object v, string range) =>
            new($"calibration option '{key}' = {v} is outside the allowed range {range}.", column: key);
        if (Bootstrap < 0 || Bootstrap > 1_000_000) throw Bad("bootstrap", Bootstrap, "[0, 1000000]");
        int top = Monotone ? 3 : 4;
        if (Degree is { } d && (d < 1 || d > top)) throw Bad("degree", d, $"[1, {top}]");
        if (MaxDegree < 1 || MaxDegree > top) throw Bad("max_degree", MaxDegree, $"[1, {top}]");
        if (Knots is { } k && (k < 0 || k > 4)) throw Bad("knots", k, "[0, 4]");
        if (MaxKnots < 0 || MaxKnots > 4) throw Bad("max_knots", MaxKnots, "[0, 4]");
        if (Folds < 2 || Folds > 100) throw Bad("folds", Folds, "[2, 100]");
        if (MaxThreads is { } t && t < 1) throw Bad("threads", t, "[1, cores]");
    }
}
