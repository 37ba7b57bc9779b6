namespace Photometallicity.Photometry;

/// <summary>
/// Per-star quality of the prepared photometry. Flags combine; <see cref="Ok"/> (0) means usable for the
/// metallicity index. A star with only <see cref="NoNarrowMatch"/> or <see cref="NarrowMissing"/> still has a
/// usable colour and magnitude for the membership step.
/// </summary>
[Flags]
public enum PhotometryStatus
{
    Ok = 0,
    NoNarrowMatch = 1,
    BroadbandMissing = 2,
    NarrowMissing = 4,
    ErrorTooLarge = 8,
    CatalogueFlag = 16,
    ColourOutOfRange = 32,
    ReddeningMissing = 64,
}
