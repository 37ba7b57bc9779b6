using Photometallicity.Numerics;

namespace Photometallicity.Demo;

/// <summary>How the spectroscopic standards of an invented field are drawn (see <see cref="DemoVariant"/>).</summary>
public enum StandardsSelection
{
    /// <summary>The demo's own selection: bright members weighted to spread over [Fe/H], a few bad ones and foreground dwarfs.</summary>
    Demo,
    /// <summary>Members in the brightest <see cref="DemoVariant.BrightRangeMag"/> of the giant branch (red band), drawn at random, without regard to [Fe/H].</summary>
    Bright,
    /// <summary>Members drawn evenly in red magnitude over the whole branch down to <see cref="DemoVariant.SpreadFaintLimitRel"/> below the distance modulus.</summary>
    Spread,
    /// <summary>No individual standards (the field is calibrated on cluster fields written beside it).</summary>
    None,
}

/// <summary>
/// A variation of the invented demo field, for the validation suite: another invented index law, another choice of
/// standards, a share of bad standards recorded per standard, and more truth per star. Without a variant
/// (<see cref="DemoGenerator.Generate"/> with null) the demo field is generated exactly as before. All invented.
/// </summary>
public sealed record DemoVariant
{
    /// <summary>The giants' index law X0 = f(C0, [Fe/H]) (mag); the foreground dwarfs sit <see cref="DemoTruth.DwarfIndexOffset"/> off it.</summary>
    public Func<double, double, double> GiantIndex { get; init; } = DemoTruth.GiantIndex;

    public StandardsSelection Standards { get; init; } = StandardsSelection.Bright;

    /// <summary>Number of individual standards drawn (not for <see cref="StandardsSelection.Demo"/> or <see cref="StandardsSelection.None"/>).</summary>
    public int StandardsCount { get; init; } = 200;

    /// <summary>Share of the individual standards given a wrong [Fe/H] (0.5 to 1.2 dex off, random sign); rounded to a whole number of standards.</summary>
    public double BadShare { get; init; }

    /// <summary>Bright mode: magnitudes below the brightest member (red band) from which the standards come.</summary>
    public double BrightRangeMag { get; init; } = 2.0;

    /// <summary>Spread mode: the faintest standard's dereddened red magnitude relative to the distance modulus.</summary>
    public double SpreadFaintLimitRel { get; init; } = 1.5;

    /// <summary>Master seed name of the standards draw (a stream of its own, so the stars do not depend on it).</summary>
    public const string StandardsStream = "validation-standards";

    /// <summary>The wrong-[Fe/H] offsets: 0.5 to 1.2 dex, random sign (invented, for the suite).</summary>
    public static double BadOffset(Rng rng) => (rng.NextDouble() < 0.5 ? -1 : 1) * (0.5 + 0.7 * rng.NextDouble());
}
