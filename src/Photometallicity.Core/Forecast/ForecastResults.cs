using Photometallicity.Metallicity;

namespace Photometallicity.Forecast;

/// <summary>Outcome of a forecast search.</summary>
public enum ForecastStatus
{
    /// <summary>The requested precision is reached; the value is the boundary found by bisection.</summary>
    Ok = 0,
    /// <summary>Not reachable: even the brightest magnitude searched (or an infinitely deep band) misses the precision.</summary>
    NotReachable = 1,
    /// <summary>Reached everywhere searched: the value is the search bound, the true boundary lies beyond it.</summary>
    BeyondSearchRange = 2,
    /// <summary>The colour and [Fe/H] lie outside the calibration's validity domain.</summary>
    OutsideCalibration = 3,
}

/// <summary>
/// Expected precision for one red giant. Magnitudes: BlueMag is the dereddened blue magnitude; the band errors are those at the
/// observed magnitudes. SigmaFeh is the exact posterior half-width (84th - 16th percentile) / 2 for a star whose index lies on
/// the best-fit model (no noise draw), marginalised over the ensemble; SigmaFehAnalytic = sigma_eff / |df/dF| is the small-error
/// limit (first-order error propagation, common practice) without calibration error, and SigmaFehAnalyticCalibration adds the
/// ensemble's spread of f in quadrature to sigma_eff.
/// </summary>
public sealed record PrecisionPoint(
    double BlueMag, double Colour, double Feh, double Index,
    double SigmaBlue, double SigmaRed, double SigmaNarrow,
    double SigmaIndex, double SigmaColour, double CovIndexColour, double SigmaEff, double DIndexDFeh,
    double SigmaFeh, double FehMedian, double SigmaFehAnalytic, double SigmaFehAnalyticCalibration, MetallicityStatus Status);

/// <summary>Faintest blue magnitude (apparent and absolute, dereddened) at which a red giant of this colour and [Fe/H] reaches the precision.</summary>
public sealed record LimitingMagnitude(double DistanceModulus, double Colour, double Feh, double PrecisionDex,
    double BlueApparent, double BlueAbsolute, ForecastStatus Status);

/// <summary>The 5-sigma depth one band needs (others fixed) for the precision at the given blue magnitude.</summary>
public sealed record DepthRequirement(ForecastBand Band, double BlueMag, double Colour, double Feh, double PrecisionDex,
    double RequiredDepth5Sigma, double CurrentDepth5Sigma, ForecastStatus Status);
