namespace Photometallicity.Calibration;

/// <summary>Options of the calibration stage. Defaults are common practice unless a source is named.</summary>
public sealed record CalibrationOptions
{
    /// <summary>Number of bootstrap resamples (0 = no ensemble).</summary>
    public int Bootstrap { get; init; } = 1000;

    /// <summary>Master seed; the stage derives its streams from it by name.</summary>
    public ulong Seed { get; init; }

    /// <summary>Polynomial degree of the forward model; null = chosen by cross-validation.</summary>
    public int? Degree { get; init; }

    /// <summary>Highest degree cross-validation may choose (1..4).</summary>
    public int MaxDegree { get; init; } = 3;

    /// <summary>Standards whose residual exceeds this many effective sigmas are rejected (iterative clipping).</summary>
    public double ClipSigma { get; init; } = 3.5;

    /// <summary>Cross-validation folds (whole clusters stay in one fold).</summary>
    public int Folds { get; init; } = 5;

    /// <summary>The filter set the standards' photometry belongs to; recorded in the model.</summary>
    public required FilterSet Filters { get; init; }

    /// <summary>Standards with log g above this are rejected as not giants; null = no cut (LogG is then ignored).</summary>
    public double? MaxLogG { get; init; }

    /// <summary>
    /// |df/d[Fe/H]| below this (mag per dex) counts as lost sensitivity: such colours are excluded from the
    /// validity domain (a project choice, no published source).
    /// </summary>
    public double MinSensitivity { get; init; } = 0.01;

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
        if (Degree is { } d && (d < 1 || d > 4)) throw Bad("degree", d, "[1, 4]");
        if (MaxDegree < 1 || MaxDegree > 4) throw Bad("max_degree", MaxDegree, "[1, 4]");
        if (!(ClipSigma >= 2.0)) throw Bad("clip_sigma", ClipSigma, "[2, infinity)");
        if (Folds < 2 || Folds > 100) throw Bad("folds", Folds, "[2, 100]");
        if (!(MinSensitivity >= 0)) throw Bad("min_sensitivity", MinSensitivity, "[0, infinity)");
        if (MaxThreads is { } t && t < 1) throw Bad("threads", t, "[1, cores]");
    }
}
