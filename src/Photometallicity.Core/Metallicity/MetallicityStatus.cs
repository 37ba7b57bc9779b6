namespace Photometallicity.Metallicity;

/// <summary>
/// Why a star has, or lacks, an [Fe/H] value. Exactly one code per star.
/// <list type="table">
/// <item><term>Ok</term><description>feh, feh_lo, feh_hi are the posterior median, 16th and 84th percentiles.</description></item>
/// <item><term>PosteriorTruncated</term><description>values given, but more than
/// <see cref="MetallicityOptions.TruncationFraction"/> of the likelihood (in the index, best-fit model) lies beyond a domain edge:
/// the percentiles are pulled towards that edge.</description></item>
/// <item><term>IndexAboveRange</term><description>the index exceeds the model's largest value in the domain at this colour by more
/// than <see cref="MetallicityOptions.LimitSigmas"/> sigma_eff: feh is NaN and a one-sided limit is given (see <see cref="FehLimitSide"/>).</description></item>
/// <item><term>IndexBelowRange</term><description>likewise below the model's smallest value.</description></item>
/// <item><term>ColourOutsideCalibration</term><description>the colour lies outside the domain's colour span (or where the domain
/// is narrower than two grid points).</description></item>
/// <item><term>NonMonotonic</term><description>the colour falls in an interval the calibration excludes because the model is not
/// monotonic in [Fe/H] there (a second, false root).</description></item>
/// <item><term>Extrapolated</term><description>values given from a full posterior, but (colour, posterior median) lies outside the
/// convex hull of the accepted standards: the calibration is extrapolated there and its model-form error, measured on the
/// standards, is part of the interval.</description></item>
/// <item><term>BadPhotometry</term><description>the photometry status is not Ok, or the index, colour or their (co)variances are not finite.</description></item>
/// </list>
/// </summary>
public enum MetallicityStatus
{
    Ok = 0,
    PosteriorTruncated = 1,
    IndexAboveRange = 2,
    IndexBelowRange = 3,
    ColourOutsideCalibration = 4,
    NonMonotonic = 5,
    BadPhotometry = 6,
    Extrapolated = 7,
}

/// <summary>
/// The side of a one-sided [Fe/H] limit. <see cref="Lower"/>: the star's [Fe/H] is at least the limit (feh_lo holds it, feh and
/// feh_hi are NaN). <see cref="Upper"/>: at most the limit (feh_hi holds it, feh and feh_lo are NaN).
/// </summary>
public enum FehLimitSide
{
    None = 0,
    Lower = 1,
    Upper = 2,
}
