using System.Runtime.CompilerServices;
using Photometallicity.Units;

namespace Photometallicity.CrossMatch;

/// <summary>
/// Great-circle separation between sky positions, exact at every angle from micro-arcseconds to 180 deg.
/// Vincenty's formula for the special case of a sphere (Vincenty 1975, Survey Review 23, 88, eq. 14):
/// <c>sep = atan2( sqrt((cos d2 sin da)^2 + (cos d1 sin d2 - sin d1 cos d2 cos da)^2),
///                 sin d1 sin d2 + cos d1 cos d2 cos da )</c>.
/// Unlike the cosine rule it keeps full precision at tiny angles, and unlike the haversine form it keeps it
/// near 180 deg. The RA difference is taken in degrees before conversion, so a pair straddling RA = 0/360
/// loses no digits; near the poles the formula needs no special case.
/// </summary>
public static class SkySeparation
{
    private const double DegToRad = Math.PI / 180.0;
    private const double RadToArcsec = 180.0 * 3600.0 / Math.PI;

    public static Angle Between(SkyPosition a, SkyPosition b) =>
        Angle.FromRadians(Radians(a.RaDegrees, a.DecDegrees, b.RaDegrees, b.DecDegrees));

    public static Angle Between(double ra1Deg, double dec1Deg, double ra2Deg, double dec2Deg) =>
        Angle.FromRadians(Radians(ra1Deg, dec1Deg, ra2Deg, dec2Deg));

    /// <summary>Separation in radians of two positions given in degrees.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static double Radians(double ra1Deg, double dec1Deg, double ra2Deg, double dec2Deg)
    {
        double dra = (ra2Deg - ra1Deg) * DegToRad;
        var (sd1, cd1) = Math.SinCos(dec1Deg * DegToRad);
        var (sd2, cd2) = Math.SinCos(dec2Deg * DegToRad);
        var (sdra, cdra) = Math.SinCos(dra);
        double num1 = cd2 * sdra;
        double num2 = cd1 * sd2 - sd1 * cd2 * cdra;
        double den = sd1 * sd2 + cd1 * cd2 * cdra;
        return Math.Atan2(Math.Sqrt(num1 * num1 + num2 * num2), den);
    }

    /// <summary>Separation in arcseconds of two positions given in degrees.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static double Arcseconds(double ra1Deg, double dec1Deg, double ra2Deg, double dec2Deg) =>
        Radians(ra1Deg, dec1Deg, ra2Deg, dec2Deg) * RadToArcsec;

    /// <summary>Element-wise separations in arcseconds of equally long position arrays (degrees).</summary>
    public static void Arcseconds(ReadOnlySpan<double> ra1Deg, ReadOnlySpan<double> dec1Deg,
        ReadOnlySpan<double> ra2Deg, ReadOnlySpan<double> dec2Deg, Span<double> arcsec)
    {
        int n = ra1Deg.Length;
        if (dec1Deg.Length != n || ra2Deg.Length != n || dec2Deg.Length != n || arcsec.Length != n)
            throw new ArgumentException($"Separation arrays differ in length: {n}, {dec1Deg.Length}, {ra2Deg.Length}, {dec2Deg.Length}, output {arcsec.Length}.");
        for (int i = 0; i < n; i++) arcsec[i] = Arcseconds(ra1Deg[i], dec1Deg[i], ra2Deg[i], dec2Deg[i]);
    }

    /// <summary>Element-wise separations of equally long position arrays (degrees), as a new array in arcseconds.</summary>
    public static double[] Arcseconds(double[] ra1Deg, double[] dec1Deg, double[] ra2Deg, double[] dec2Deg)
    {
        var result = new double[ra1Deg.Length];
        Arcseconds(ra1Deg, dec1Deg, ra2Deg, dec2Deg, result);
        return result;
    }

    /// <summary>Chord length between two points on the unit sphere separated by the given angle: 2 sin(theta/2).</summary>
    public static double Chord(Angle separation) => 2.0 * Math.Sin(0.5 * Math.Min(separation.Radians, Math.PI));

    /// <summary>The angle whose chord on the unit sphere has the given squared length: 2 asin(c/2).</summary>
    public static double RadiansFromChord2(double chord2) => 2.0 * Math.Asin(Math.Min(1.0, 0.5 * Math.Sqrt(chord2)));
}
