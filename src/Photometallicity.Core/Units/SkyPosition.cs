namespace Photometallicity.Units;

/// <summary>
/// A position on the celestial sphere (ICRS), right ascension in [0, 360) and declination in [-90, 90] degrees.
/// </summary>
public readonly record struct SkyPosition
{
    private SkyPosition(double raDeg, double decDeg)
    {
        RaDegrees = raDeg;
        DecDegrees = decDeg;
    }

    public double RaDegrees { get; }
    public double DecDegrees { get; }

    public Angle Ra => Angle.FromDegrees(RaDegrees);
    public Angle Dec => Angle.FromDegrees(DecDegrees);

    /// <summary>Creates a position; RA is wrapped into [0, 360), Dec must lie in [-90, 90].</summary>
    public static SkyPosition FromDegrees(double raDeg, double decDeg)
    {
        if (!double.IsFinite(raDeg) || !double.IsFinite(decDeg))
            throw new ArgumentException($"Sky position ({raDeg}, {decDeg}) deg is not finite.");
        if (decDeg < -90.0 || decDeg > 90.0)
            throw new ArgumentOutOfRangeException(nameof(decDeg), decDeg, $"Dec = {decDeg} deg is outside [-90, 90].");
        double ra = raDeg % 360.0;
        if (ra < 0) ra += 360.0;
        if (ra >= 360.0) ra = 0.0;
        return new SkyPosition(ra, decDeg);
    }

    /// <summary>Unit vector (x, y, z) of this position.</summary>
    public (double X, double Y, double Z) ToUnitVector()
    {
        double ra = Ra.Radians, dec = Dec.Radians;
        double cd = Math.Cos(dec);
        return (cd * Math.Cos(ra), cd * Math.Sin(ra), Math.Sin(dec));
    }

    public override string ToString() => $"({RaDegrees:F6}, {DecDegrees:+0.000000;-0.000000}) deg";
}
