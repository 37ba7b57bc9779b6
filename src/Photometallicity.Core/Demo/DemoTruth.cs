namespace Photometallicity.Demo;

/// <summary>
/// The known truth of the invented demonstration field. EVERYTHING HERE IS INVENTED: the galaxy, its name,
/// its coordinates, its distance, the filters, the index behaviour and every number. No real object.
/// </summary>
public sealed record DemoTruth
{
    public const string GalaxyName = "Vellum Dwarf (invented)";

    /// <summary>Above this many stars the invented field grows into a survey mosaic instead of getting denser.</summary>
    public const int SurveyScaleFrom = 1_000_000;

    /// <summary>
    /// The truth for a field of <paramref name="stars"/> stars: the defaults up to <see cref="SurveyScaleFrom"/>; beyond,
    /// the galaxy keeps the members it has at that size and the square field widens so that the foreground's surface
    /// density stays what it is there (a wide survey field, not an ever more crowded one: at 10^7 stars in the default
    /// field the stars would lie a fraction of an arcsecond apart, where no cross-match is meaningful).
    /// </summary>
    public static DemoTruth ForStars(int stars)
    {
        var t = new DemoTruth();
        if (stars <= SurveyScaleFrom) return t;
        double members = t.MemberFraction * SurveyScaleFrom, foreground = (1 - t.MemberFraction) * SurveyScaleFrom;
        return t with
        {
            MemberFraction = members / stars,
            FieldHalfWidthArcmin = t.FieldHalfWidthArcmin * Math.Sqrt((stars - members) / foreground),
        };
    }

    public double CentreRaDeg { get; init; } = 137.62;   // invented
    public double CentreDecDeg { get; init; } = -38.47;  // invented
    public double DistanceModulus { get; init; } = 21.2; // invented
    public double HalfLightArcmin { get; init; } = 3.2;  // invented (major-axis half-light radius)
    public double Ellipticity { get; init; } = 0.30;     // invented, 1 - b/a
    public double PositionAngleDeg { get; init; } = 40;  // invented, east of north
    public double FieldHalfWidthArcmin { get; init; } = 18; // square field in the tangent plane
    public double MemberFraction { get; init; } = 0.40;
    public double MeanFeh { get; init; } = -1.65;        // invented MDF mean (dex)
    public double SigmaFeh { get; init; } = 0.38;        // invented MDF intrinsic spread (dex)
    public double ColourCoefficient { get; init; } = 1.0; // k of the index, invented filters
    public double OffsetRaCosDecArcsec { get; init; } = 0.35;  // narrow minus broadband, invented
    public double OffsetDecArcsec { get; init; } = -0.22;      // narrow minus broadband, invented
    public double MeanEbv { get; init; } = 0.045;        // invented foreground reddening
    public double BlueDepth5 { get; init; } = 25.4;      // 5-sigma depths (mag), invented
    public double RedDepth5 { get; init; } = 24.4;
    public double NarrowDepth5 { get; init; } = 24.8;
    public double ErrorFloor { get; init; } = 0.008;
    /// <summary>
    /// Extinction coefficients A/E(B-V) used to redden the invented stars (blue, red, narrow): those of the invented
    /// filter curves under Fitzpatrick (1999) with R_V = 3.1, as the demo config asks the pipeline to compute them.
    /// </summary>
    public double[] ExtinctionCoefficients { get; init; } = DemoFilters.ExtinctionCoefficients();
    public double IntrinsicIndexScatter { get; init; } = 0.02; // mag, invented
    public double DwarfIndexOffset { get; init; } = 0.12;      // mag: invented gravity effect of foreground dwarfs

    /// <summary>
    /// The invented index behaviour of red giants: X0 = f(C0, [Fe/H]). At fixed colour the index grows with [Fe/H],
    /// more strongly for cooler (redder) stars, and loses sensitivity towards the lowest [Fe/H]: the slope
    /// 0.08 + 0.12 ([Fe/H] + 3.8) mag/dex (at C0 = 1) falls from 0.34 at [Fe/H] = -1.65 to 0.10 at -3.6.
    /// Invented for the demonstration; not a published relation.
    /// </summary>
    public static double GiantIndex(double colour0, double feh)
    {
        double u = feh + 3.8;
        double g = 0.08 * u + 0.06 * u * u;
        return -1.15 + 0.25 * (colour0 - 1.0) + (1.0 + 0.6 * (colour0 - 1.0)) * g;
    }

    /// <summary>The invented red-giant branch: dereddened colour C0 against absolute blue magnitude and [Fe/H].</summary>
    public static double GiantColour(double absBlue, double feh)
    {
        double e = Math.Exp(-(absBlue + 2.6) / 1.1);
        return 0.68 + 0.06 * (feh + 1.7) + (0.42 + 0.25 * (feh + 1.7)) * e;
    }
}
