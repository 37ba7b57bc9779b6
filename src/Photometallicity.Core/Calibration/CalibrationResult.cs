namespace Photometallicity.Calibration;

/// <summary>
/// The calibration stage's outputs: the model, every standard's verdict (input order), the cross-validation scores of the
/// model forms tried and the diagnostics of the fit.
/// </summary>
public sealed record CalibrationResult
{
    public required CalibrationModel Model { get; init; }

    /// <summary>One verdict per input standard, in input order.</summary>
    public required StandardVerdict[] PerStandard { get; init; }

    /// <summary>Every model form tried: its description, cross-validated mean log-likelihood per standard and its standard error (NaN where it could not be fitted), and why not.</summary>
    public required IReadOnlyList<FormScore> CvScores { get; init; }

    /// <summary>The chosen form's colour degree.</summary>
    public required int Degree { get; init; }

    /// <summary>Why this form: the cross-validation rule that chose it, or the user's fixed choice.</summary>
    public required string DegreeReason { get; init; }

    /// <summary>Cross-validated residual RMS of the accepted standards in the index (mag) and in [Fe/H] (dex).</summary>
    public double CvRmsIndex { get; init; }
    public double CvRmsDex { get; init; }

    /// <summary>
    /// Maximum-likelihood sigma_int (mag) of the kept standards, corrected for the degrees of freedom the coefficients take; the
    /// model carries the posterior mean of sigma_int^2 instead (see MixtureFit.PosteriorMeanSigmaInt2).
    /// </summary>
    public double SigmaIntMaximumLikelihood { get; init; }

    /// <summary>Fitted share of bad standards (the outlier component's weight).</summary>
    public double OutlierFraction { get; init; }

    /// <summary>Sentences on how the extrapolation error was measured.</summary>
    public required IReadOnlyList<string> Notes { get; init; }

    /// <summary>Bootstrap replicates that had to be redrawn because their resample could not be fitted.</summary>
    public int BootstrapRedrawn { get; init; }

    /// <summary>Bootstrap standard error of each coefficient (NaN without an ensemble).</summary>
    public required double[] BootstrapStandardErrors { get; init; }

    /// <summary>Expectation-maximisation passes of the best fit (more than 200: it did not settle).</summary>
    public int FitPasses { get; init; }

    public IEnumerable<StandardVerdict> Rejected => PerStandard.Where(v => !v.Accepted);
}

/// <summary>One model form's cross-validation score.</summary>
public sealed record FormScore(string Form, int Coefficients, double Score, double StandardError, string? Failure);
