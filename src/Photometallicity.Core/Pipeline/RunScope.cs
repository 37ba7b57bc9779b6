namespace Photometallicity.Pipeline;

/// <summary>The last stage a run goes to.</summary>
public enum PipelineStage
{
    Calibration,
    Metallicity,
    Membership,
}

/// <summary>
/// How much of the pipeline to run: up to <see cref="StopAfter"/>, and with a calibration read from
/// <see cref="CalibrationPath"/> instead of fitted (the single-stage verbs `calibrate`, `assign`, `members`).
/// </summary>
public sealed record RunScope(PipelineStage StopAfter = PipelineStage.Membership, string? CalibrationPath = null)
{
    /// <summary>Per-star products computed elsewhere (on survey tiles) that the run takes instead of computing them.</summary>
    public PerStarProducts? Precomputed { get; init; }

    public static RunScope Whole { get; } = new();
}

/// <summary>
/// The per-star products of the cross-match and metallicity stages for every broadband row of the field, in input
/// order, as the tiles of a split survey computed them (see Tiling.TileMerger).
/// </summary>
public sealed record PerStarProducts(CrossMatch.CrossMatchResult Match, Metallicity.MetallicityResult Metallicity, Metallicity.MetallicityResult? DwarfMetallicity);
