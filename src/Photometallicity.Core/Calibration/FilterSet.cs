namespace Photometallicity.Calibration;

/// <summary>
/// The filters a calibration belongs to: the three bands' names, their extinction coefficients
/// A_band / E(B-V), the index colour coefficient k and the photometric system label. Two filter sets are
/// compatible when names, system and k agree (coefficients within 1e-6).
/// </summary>
public sealed record FilterSet(
    string System,
    string BlueBand,
    string RedBand,
    string NarrowBand,
    double ColourCoefficient,
    double BlueExtinction,
    double RedExtinction,
    double NarrowExtinction)
{
    /// <summary>Null when compatible; otherwise a sentence saying what differs.</summary>
    public string? Difference(FilterSet other)
    {
        var d = new List<string>();
        if (System != other.System) d.Add($"photometric system '{System}' vs '{other.System}'");
        if (BlueBand != other.BlueBand || RedBand != other.RedBand || NarrowBand != other.NarrowBand)
            d.Add($"bands ({BlueBand}, {RedBand}, {NarrowBand}) vs ({other.BlueBand}, {other.RedBand}, {other.NarrowBand})");
        if (Math.Abs(ColourCoefficient - other.ColourCoefficient) > 1e-6)
            d.Add($"colour coefficient k = {ColourCoefficient} vs {other.ColourCoefficient}");
        if (Math.Abs(BlueExtinction - other.BlueExtinction) > 1e-6 || Math.Abs(RedExtinction - other.RedExtinction) > 1e-6 ||
            Math.Abs(NarrowExtinction - other.NarrowExtinction) > 1e-6)
            d.Add("extinction coefficients differ");
        return d.Count == 0 ? null : string.Join("; ", d);
    }
}
