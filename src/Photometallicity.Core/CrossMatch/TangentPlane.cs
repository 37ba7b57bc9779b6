using System.Runtime.CompilerServices;
namespace Photometallicity.CrossMatch;

/// <summary>
/// The gnomonic (tangent-plane) projection about a field centre, in the vector form: with the centre C and
/// the local east E and north N unit vectors, a point p has standard coordinates
/// xi = (p.E)/(p.C), eta = (p.N)/(p.C), and the inverse is p = normalise(C + xi E + eta N)
/// (Calabretta &amp; Greisen 2002, A&amp;A 395, 1077, the TAN projection, written with vectors).
/// No trigonometry per point and nothing special at the poles. At the centre, xi and eta are
/// [delta RA cos Dec, delta Dec] in radians.
/// </summary>
public sealed class TangentPlane
{
    private readonly double _cx, _cy, _cz, _ex, _ey, _ez, _nx, _ny, _nz;

    private TangentPlane(double cx, double cy, double cz)
    {
        _cx = cx;
        _cy = cy;
        _cz = cz;
        // East = z x C / |z x C|; at a pole any perpendicular direction will do (the +y axis is used).
        double ex = -cy, ey = cx, ez = 0.0;
        double en = Math.Sqrt(ex * ex + ey * ey);
        if (en < 1e-12)
        {
            ex = 0.0;
            ey = 1.0;
            en = 1.0;
        }
        _ex = ex / en;
        _ey = ey / en;
        _ez = ez / en;
        // North = C x E.
        _nx = cy * _ez - cz * _ey;
        _ny = cz * _ex - cx * _ez;
        _nz = cx * _ey - cy * _ex;
        (CentreRaDeg, CentreDecDeg) = UnitVectors.ToDegrees(cx, cy, cz);
    }

    /// <summary>The plane about a given centre (a unit vector, as <see cref="CentreVector"/> returns it).</summary>
    public static TangentPlane FromCentre(double cx, double cy, double cz) => new(cx, cy, cz);

    /// <summary>The centre as a unit vector, exactly as the plane uses it.</summary>
    public (double X, double Y, double Z) CentreVector => (_cx, _cy, _cz);

    public double CentreRaDeg { get; }
    public double CentreDecDeg { get; }

    /// <summary>Largest angle (degrees) between the centre and any of the points it was made for.</summary>
    public double RadiusDeg { get; private init; }

    /// <summary>
    /// The plane about the normalised mean of the unit vectors (works across RA = 0/360 and at the poles).
    /// Null when the points have no meaningful centre (spread over the whole sphere).
    /// </summary>
    public static TangentPlane? AboutMean(UnitVectors p)
    {
        double sx = 0, sy = 0, sz = 0;
        for (int i = 0; i < p.Count; i++)
        {
            sx += p.X[i];
            sy += p.Y[i];
            sz += p.Z[i];
        }
        double norm = Math.Sqrt(sx * sx + sy * sy + sz * sz);
        if (p.Count == 0 || norm < 1e-6 * p.Count) return null;
        sx /= norm;
        sy /= norm;
        sz /= norm;
        double minCos = 1.0;
        for (int i = 0; i < p.Count; i++) minCos = Math.Min(minCos, p.X[i] * sx + p.Y[i] * sy + p.Z[i] * sz);
        return new TangentPlane(sx, sy, sz) { RadiusDeg = Math.Acos(Math.Clamp(minCos, -1.0, 1.0)) * 180.0 / Math.PI };
    }

    /// <summary>Standard coordinates (radians) of a unit vector; NaN for points 90 deg or more from the centre.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public (double Xi, double Eta) Project(double x, double y, double z)
    {
        double c = x * _cx + y * _cy + z * _cz;
        if (!(c > 0)) return (double.NaN, double.NaN);
        return ((x * _ex + y * _ey + z * _ez) / c, (x * _nx + y * _ny + z * _nz) / c);
    }

    /// <summary>The unit vector of standard coordinates (radians).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public (double X, double Y, double Z) Deproject(double xi, double eta)
    {
        double x = _cx + xi * _ex + eta * _nx;
        double y = _cy + xi * _ey + eta * _ny;
        double z = _cz + xi * _ez + eta * _nz;
        double inv = 1.0 / Math.Sqrt(x * x + y * y + z * z);
        return (x * inv, y * inv, z * inv);
    }

    /// <summary>Standard coordinates of every vector (parallel over fixed chunks).</summary>
    public (double[] Xi, double[] Eta) ProjectAll(UnitVectors p)
    {
        var xi = new double[p.Count];
        var eta = new double[p.Count];
        Chunks.For(p.Count, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (_, lo, hi) =>
        {
            for (int i = lo; i < hi; i++) (xi[i], eta[i]) = Project(p.X[i], p.Y[i], p.Z[i]);
        });
        return (xi, eta);
    }
}
