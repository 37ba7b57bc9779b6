namespace Photometallicity.Calibration;

/// <summary>
/// The calibration stage's outputs: the model, every standard's verdict (input order), the cross-validation
/// scores by degree and the diagnostics of the fit.
/// </summary>
public sealed record CalibrationResult
{
    public required CalibrationModel Model { get; init; }

    /// <summary>One verdict per input standard, in input order.</summary>
    public required StandardVerdict[] PerStandard { get; init; }

    /// <summary>
    /// Cross-validated mean squared index residual (mag^2) for degree d at index d - 1; NaN where the degree was
    /// not eligible or not tried.
    /// </summary>
    public required double[] CvScoreByDegree { get; init; }

    /// <summary>Standard error of each CV score (mag^2), same layout.</summary>
    public required double[] CvScoreErrorByDegree { get; init; }

    /// <summary>Why a degree was not eligible (degree -&gt; reason).</summary>
    public required IReadOnlyDictionary<int, string> IneligibleDegrees { get; init; }

    public required int Degree { get; init; }

    /// <summary>Why this degree: fixed by the user, or the CV rule that chose it.</summary>
    public required string DegreeReason { get; init; }

    /// <summary>Cross-validated residual RMS of the accepted standards in the index (mag) and in [Fe/H] (dex).</summary>
    public double CvRmsIndex { get; init; }
    public double CvRmsDex { get; init; }

    /// <summary>+1 when the index increases with [Fe/H] over the domain, -1 when it decreases.</summary>
    public int FehSlopeSign { get; init; }

    /// <summary>Sentences on colour intervals excluded from the domain for lost or reversed sensitivity.</summary>
    public required IReadOnlyList<string> MonotonicityNotes { get; init; }

    /// <summary>Bootstrap replicates that had to be redrawn because their resample could not be fitted.</summary>
    public int BootstrapRedrawn { get; init; }

    /// <summary>Bootstrap standard error of each coefficient (NaN without an ensemble).</summary>
    public required double[] BootstrapStandardErrors { get; init; }

    /// <summary>Clipping passes of the best fit (more than EffectiveVarianceFit.MaxClipIterations: the kept set did not settle).</summary>
    public int ClippingPasses { get; init; }

    public IEnumerable<StandardVerdict> Rejected => PerStandard.Where(v => !v.Accepted);
}
