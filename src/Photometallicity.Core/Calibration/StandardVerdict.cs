namespace Photometallicity.Calibration;

/// <summary>What the calibration decided about one standard.</summary>
public enum StandardStatus
{
    Accepted,
    /// <summary>More likely an outlier than not under the fit's mixture (binary, non-member, bad spectrum, ...).</summary>
    RejectedOutlier,
    /// <summary>A measurement is missing or not finite.</summary>
    Unusable,
    /// <summary>log g above the giant limit.</summary>
    RejectedLogG,
}

/// <summary>
/// One standard's outcome: status and reason, residual of the index about the best fit (mag, observed minus
/// model), the same in effective sigmas and in [Fe/H] (dex, photometric minus spectroscopic, = residual /
/// (df/d[Fe/H])), the cross-validated residual (from the fit without the standard's fold), and the probability that the
/// standard is an outlier under the fit's mixture (NaN for standards not in the fit).
/// </summary>
public sealed record StandardVerdict(
    string Id,
    StandardStatus Status,
    string Reason,
    double ResidualIndex,
    double ResidualSigma,
    double ResidualDex,
    double CvResidualIndex,
    double CvResidualDex,
    double POutlier = double.NaN)
{
    public bool Accepted => Status == StandardStatus.Accepted;
}
