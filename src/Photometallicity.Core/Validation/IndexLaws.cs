using Photometallicity.Demo;

namespace Photometallicity.Validation;

/// <summary>The invented index laws of the validation fields.</summary>
public enum IndexLawKind
{
    /// <summary>Nearly linear in [Fe/H] at every colour (<see cref="IndexLaws.NearlyLinear"/>).</summary>
    Linear,
    /// <summary>Loses sensitivity towards low [Fe/H]: the demo's own law (<see cref="DemoTruth.GiantIndex"/>).</summary>
    Saturating,
    /// <summary>Strong C0^2 and C0*[Fe/H] terms (<see cref="IndexLaws.ColourCurved"/>).</summary>
    Curved,
}

/// <summary>
/// Invented index laws X0 = f(C0, [Fe/H]) (mag) of red giants for the validation fields. EVERY LAW HERE IS INVENTED
/// (shaped after the demo's <see cref="DemoTruth.GiantIndex"/>: an index of order -1.6 to +0.5 mag over colours 0.4 to
/// 2.0 and [Fe/H] -4 to +0.5); none is a published relation. Each increases with [Fe/H] at fixed colour over
/// [Fe/H] in [-4, 0.5] and C0 in [0.4, 2.0] (checked in the tests).
/// </summary>
public static class IndexLaws
{
    public static Func<double, double, double> Of(IndexLawKind kind) => kind switch
    {
        IndexLawKind.Linear => NearlyLinear,
        IndexLawKind.Saturating => DemoTruth.GiantIndex,
        IndexLawKind.Curved => ColourCurved,
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, null),
    };

    public static string Name(IndexLawKind kind) => kind switch
    {
        IndexLawKind.Linear => "linear",
        IndexLawKind.Saturating => "saturating",
        IndexLawKind.Curved => "curved",
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, null),
    };

    /// <summary>A short text of the law, for the truth file.</summary>
    public static string Formula(IndexLawKind kind) => kind switch
    {
        IndexLawKind.Linear => "X0 = -1.0 + 0.25 (C0-1) + (0.25 + 0.10 (C0-1)) ([Fe/H]+1.65) + 0.01 ([Fe/H]+1.65)^2",
        IndexLawKind.Saturating => "u = [Fe/H]+3.8; X0 = -1.15 + 0.25 (C0-1) + (1 + 0.6 (C0-1)) (0.08 u + 0.06 u^2)",
        IndexLawKind.Curved => "X0 = -1.05 + 0.30 (C0-1) - 0.35 (C0-1)^2 + (0.26 + 0.20 (C0-1)) ([Fe/H]+1.65) + 0.015 ([Fe/H]+1.65)^2",
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, null),
    };

    /// <summary>Invented: slope 0.25 + 0.10 (C0 - 1) mag/dex, with a faint quadratic term (slope stays above 0.14 mag/dex).</summary>
    public static double NearlyLinear(double colour0, double feh)
    {
        double c = colour0 - 1.0, f = feh + 1.65;
        return -1.0 + 0.25 * c + (0.25 + 0.10 * c) * f + 0.01 * f * f;
    }

    /// <summary>Invented: a strong C0^2 term (-0.35 mag per mag^2) and a strong C0*[Fe/H] term (0.20 mag per mag dex).</summary>
    public static double ColourCurved(double colour0, double feh)
    {
        double c = colour0 - 1.0, f = feh + 1.65;
        return -1.05 + 0.30 * c - 0.35 * c * c + (0.26 + 0.20 * c) * f + 0.015 * f * f;
    }
}
