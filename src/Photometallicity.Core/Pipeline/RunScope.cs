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
    public static RunScope Whole { get; } = new();
}
