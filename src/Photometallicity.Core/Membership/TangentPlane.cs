using Photometallicity.Units;

namespace Photometallicity.Membership;

/// <summary>
/// Gnomonic (TAN) projection about a reference point: standard coordinates xi (towards east) and eta (towards
/// north), here in arcminutes. Forward: xi = cos d sin(a - a0) / D, eta = (cos d0 sin d - sin d0 cos d cos(a - a0)) / D,
/// D = sin d0 sin d + cos d0 cos d cos(a - a0); inverse: a = a0 + atan2(xi, cos d0 - eta sin d0),
/// d = atan2(sin d0 + eta cos d0, hypot(xi, cos d0 - eta sin d0)) (Calabretta &amp; Greisen 2002, A&amp;A 395, 1077,
/// TAN projection, eqs. 54-55 in native coordinates; written here in the usual "standard coordinates" form).
/// RA differences are taken through sin/cos, so the wrap at RA = 0 needs no special case, and the projection
/// is regular at the poles. Points on the far hemisphere (D &lt;= 0) cannot be projected.
/// </summary>
public sealed class TangentPlane
{
    private const double ArcminPerRadian = 180.0 * 60.0 / Math.PI;
    private readonly double _ra0, _sinDec0, _cosDec0;

    public TangentPlane(SkyPosition reference)
    {
        Reference = reference;
        _ra0 = reference.Ra.Radians;
        _sinDec0 = Math.Sin(reference.Dec.Radians);
        _cosDec0 = Math.Cos(reference.Dec.Radians);
    }

    public SkyPosition Reference { get; }

    /// <summary>Projects (RA, Dec) in degrees; returns false (and NaN) for non-finite input or the far hemisphere.</summary>
    public bool TryProject(double raDeg, double decDeg, out double xiArcmin, out double etaArcmin)
    {
        xiArcmin = etaArcmin = double.NaN;
        if (!double.IsFinite(raDeg) || !double.IsFinite(decDeg) || decDeg < -90 || decDeg > 90) return false;
        double dra = raDeg * (Math.PI / 180.0) - _ra0;
        double dec = decDeg * (Math.PI / 180.0);
        double sd = Math.Sin(dec), cd = Math.Cos(dec);
        double cdra = Math.Cos(dra);
        double d = _sinDec0 * sd + _cosDec0 * cd * cdra;
        if (!(d > 1e-9)) return false;
        xiArcmin = cd * Math.Sin(dra) / d * ArcminPerRadian;
        etaArcmin = (_cosDec0 * sd - _sinDec0 * cd * cdra) / d * ArcminPerRadian;
        return true;
    }

    /// <summary>The sky position of standard coordinates (xi, eta) in arcminutes.</summary>
    public SkyPosition Deproject(double xiArcmin, double etaArcmin)
    {
        double xi = xiArcmin / ArcminPerRadian, eta = etaArcmin / ArcminPerRadian;
        double den = _cosDec0 - eta * _sinDec0;
        double ra = _ra0 + Math.Atan2(xi, den);
        double dec = Math.Atan2(_sinDec0 + eta * _cosDec0, Math.Sqrt(xi * xi + den * den));
        return SkyPosition.FromDegrees(ra * (180.0 / Math.PI), Math.Clamp(dec * (180.0 / Math.PI), -90.0, 90.0));
    }
}
