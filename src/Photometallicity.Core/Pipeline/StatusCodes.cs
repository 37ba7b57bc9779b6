using Photometallicity.Metallicity;
using Photometallicity.Photometry;

namespace Photometallicity.Pipeline;

/// <summary>
/// The `status` codes of stars.csv (documented in README.md, "Status codes"). Photometric problems come first
/// (the most basic one wins); a star with usable photometry carries its [Fe/H] status.
/// </summary>
public static class StatusCodes
{
    public static string Photometry(PhotometryStatus s)
    {
        if (s == PhotometryStatus.Ok) return "ok";
        if (s.HasFlag(PhotometryStatus.BroadbandMissing)) return "broadband_missing";
        if (s.HasFlag(PhotometryStatus.ReddeningMissing)) return "reddening_missing";
        if (s.HasFlag(PhotometryStatus.CatalogueFlag)) return "catalogue_flag";
        if (s.HasFlag(PhotometryStatus.ErrorTooLarge)) return "error_too_large";
        if (s.HasFlag(PhotometryStatus.ColourOutOfRange)) return "colour_out_of_range";
        if (s.HasFlag(PhotometryStatus.NoNarrowMatch)) return "no_narrow_match";
        if (s.HasFlag(PhotometryStatus.NarrowMissing)) return "narrow_missing";
        if (s.HasFlag(PhotometryStatus.NarrowErrorTooLarge)) return "narrow_error_too_large";
        return "bad_photometry";
    }

    public static string Star(PhotometryStatus phot, MetallicityStatus feh)
    {
        if (phot != PhotometryStatus.Ok) return Photometry(phot);
        return feh switch
        {
            MetallicityStatus.Ok => "ok",
            MetallicityStatus.PosteriorTruncated => "posterior_truncated",
            MetallicityStatus.IndexAboveRange => "index_above_range",
            MetallicityStatus.IndexBelowRange => "index_below_range",
            MetallicityStatus.ColourOutsideCalibration => "colour_outside_calibration",
            MetallicityStatus.NonMonotonic => "non_monotonic",
            MetallicityStatus.Extrapolated => "extrapolated",
            _ => "bad_photometry",
        };
    }
}
