using Photometallicity.Calibration;
using Photometallicity.Configuration;
using Photometallicity.CrossMatch;
using Photometallicity.Membership;
using Photometallicity.Metallicity;

namespace Photometallicity.Pipeline;

/// <summary>Everything a run produced, in memory; <see cref="RunOutputWriter"/> turns it into files.</summary>
public sealed record PipelineResult
{
    public required PipelineConfig Config { get; init; }
    public required InputCatalogues Inputs { get; init; }
    public required CrossMatchResult Match { get; init; }
    public required PhotometryProducts Photometry { get; init; }
    public required StandardsProducts Standards { get; init; }
    public required CalibrationResult Calibration { get; init; }
    public required MetallicityResult Metallicity { get; init; }
    public required MembershipResult Membership { get; init; }
    public required NarrowCompleteness Completeness { get; init; }
    public required StarRows Stars { get; init; }
    public required IReadOnlyList<string> Warnings { get; init; }
    public required IReadOnlyList<(string Stage, double Seconds)> Timings { get; init; }
}
