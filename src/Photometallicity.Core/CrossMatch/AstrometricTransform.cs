using System.Runtime.CompilerServices;
namespace Photometallicity.CrossMatch;

/// <summary>
/// A similarity transform in the tangent plane from broadband (left) standard coordinates to where the
/// narrow-band (right) catalogue puts the same star: <c>xi' = a xi - b eta + dXi</c>, <c>eta' = b xi + a eta + dEta</c>
/// (radians). Scale = sqrt(a^2 + b^2), rotation = atan2(b, a) (counter-clockwise from east towards north).
/// A pure offset has a = 1, b = 0. The correction applied to the right catalogue is the inverse map.
/// </summary>
public readonly record struct AstrometricTransform(double A, double B, double DXi, double DEta)
{
    public static AstrometricTransform Identity => new(1.0, 0.0, 0.0, 0.0);

    public double Scale => Math.Sqrt(A * A + B * B);
    public double RotationRadians => Math.Atan2(B, A);

    /// <summary>Left standard coordinates mapped into the right catalogue's frame.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public (double Xi, double Eta) Forward(double xi, double eta) => (A * xi - B * eta + DXi, B * xi + A * eta + DEta);

    /// <summary>Right standard coordinates corrected into the left catalogue's frame.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public (double Xi, double Eta) Inverse(double xi, double eta)
    {
        double u = xi - DXi, v = eta - DEta, s = 1.0 / (A * A + B * B);
        return (s * (A * u + B * v), s * (-B * u + A * v));
    }

    /// <summary>
    /// Largest displacement (radians) between this transform and another over a field of the given radius:
    /// the change in offset plus the change in the linear part times the radius.
    /// </summary>
    public double DistanceTo(AstrometricTransform o, double fieldRadiusRad)
    {
        double dOff = Math.Sqrt((DXi - o.DXi) * (DXi - o.DXi) + (DEta - o.DEta) * (DEta - o.DEta));
        double dLin = Math.Sqrt((A - o.A) * (A - o.A) + (B - o.B) * (B - o.B));
        return dOff + dLin * fieldRadiusRad;
    }
}
