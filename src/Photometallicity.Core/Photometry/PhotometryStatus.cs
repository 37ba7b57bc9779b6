namespace Photometallicity.Photometry;

/// <summary>
/// Per-star quality of the prepared photometry. Flags combine (bitwise OR); <see cref="Ok"/> (0) means usable for the
/// metallicity index. A star whose only flags are narrow-band ones (<see cref="NoNarrowMatch"/>,
/// <see cref="NarrowMissing"/>, <see cref="NarrowErrorTooLarge"/>) still has a usable colour and magnitude for the
/// membership step (<see cref="IndexPhotometry.HasUsableColour"/>).
/// </summary>
[Flags]
public enum PhotometryStatus
{
    /// <summary>All three bands measured, errors within limits, not flagged, colour inside the window.</summary>
    Ok = 0,

    /// <summary>The broadband row has no narrow-band partner (cross-match found none): index not computed.</summary>
    NoNarrowMatch = 1,

    /// <summary>Blue or red magnitude or its error is missing, not finite, or the error is negative: colour not computed.</summary>
    BroadbandMissing = 2,

    /// <summary>A narrow-band partner exists but its magnitude or error is missing, not finite, or the error is negative.</summary>
    NarrowMissing = 4,

    /// <summary>The blue or red magnitude error exceeds its maximum (values still computed).</summary>
    ErrorTooLarge = 8,

    /// <summary>The input catalogue flagged the row (nonzero flag; values still computed).</summary>
    CatalogueFlag = 16,

    /// <summary>The dereddened colour lies outside the configured colour window (values still computed).</summary>
    ColourOutOfRange = 32,

    /// <summary>E(B-V) or its error is missing, not finite, or the error is negative: nothing dereddened.</summary>
    ReddeningMissing = 64,

    /// <summary>The narrow-band magnitude error exceeds its maximum (index still computed).</summary>
    NarrowErrorTooLarge = 128,
}
