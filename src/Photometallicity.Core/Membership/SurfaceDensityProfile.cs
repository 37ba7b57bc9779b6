namespace Photometallicity.Membership;

/// <summary>Radial law of the target's surface density.</summary>
public enum ProfileKind
{
    /// <summary>Plummer (1911, MNRAS 71, 460): Sigma(r) proportional to (1 + r^2/a^2)^-2, a = half-light radius.</summary>
    Plummer,

    /// <summary>Exponential: Sigma(r) proportional to exp(-r / r_e), r_h = 1.67835 r_e.</summary>
    Exponential,
}

/// <summary>
/// An elliptical surface-density profile on the tangent plane, normalised to 1 over the infinite plane
/// (Martin, de Jong &amp; Rix 2008, ApJ 684, 1075, eqs. 4-6). With (x, y) = (xi - x0, eta - y0), position angle
/// theta east of north and ellipticity e = 1 - b/a, the elliptical radius is
/// r^2 = [(x cos theta - y sin theta) / (1 - e)]^2 + (x sin theta + y cos theta)^2, i.e. the major-axis radius.
/// Plummer: Sigma = (1 + r^2/r_h^2)^-2 / (pi r_h^2 (1 - e)); half the light lies inside r = r_h
/// (enclosed fraction R^2 / (R^2 + r_h^2), Plummer 1911).
/// Exponential: Sigma = exp(-r/r_e) / (2 pi r_e^2 (1 - e)), r_e = r_h / 1.67835, where 1.67835 solves
/// 1 - (1 + x) e^-x = 1/2 (Martin et al. 2008 quote r_h = 1.68 r_e).
/// Shape is held as (k1, k2) = e (cos 2 theta, sin 2 theta), which stays regular at e = 0.
/// </summary>
public readonly record struct SurfaceDensityProfile(ProfileKind Kind, double X0, double Y0, double HalfLight, double K1, double K2)
{
    /// <summary>x / r_e at half light for the exponential disc: root of 1 - (1 + x) exp(-x) = 0.5.</summary>
    public const double ExponentialHalfLightRatio = 1.6783469900166612;

    public double Ellipticity => Math.Sqrt(K1 * K1 + K2 * K2);

    /// <summary>Position angle, east of north, in radians in [0, pi).</summary>
    public double PositionAngle
    {
        get
        {
            double t = 0.5 * Math.Atan2(K2, K1);
            return t < 0 ? t + Math.PI : t;
        }
    }

    public static SurfaceDensityProfile FromShape(ProfileKind kind, double x0, double y0, double halfLight, double ellipticity, double positionAngleRad)
        => new(kind, x0, y0, halfLight, ellipticity * Math.Cos(2 * positionAngleRad), ellipticity * Math.Sin(2 * positionAngleRad));

    /// <summary>Precomputed constants for fast evaluation.</summary>
    public Evaluator CreateEvaluator() => new(this);

    /// <summary>A profile with its trigonometric and normalising constants computed once.</summary>
    public readonly struct Evaluator
    {
        private readonly double _x0, _y0, _c, _s, _invOneMinusE, _invScale, _norm, _minor;
        private readonly bool _plummer;

        public Evaluator(SurfaceDensityProfile p)
        {
            double e = p.Ellipticity, t = p.PositionAngle;
            _x0 = p.X0; _y0 = p.Y0;
            _c = Math.Cos(t); _s = Math.Sin(t);
            _invOneMinusE = 1.0 / (1.0 - e);
            _plummer = p.Kind == ProfileKind.Plummer;
            double scale = _plummer ? p.HalfLight : p.HalfLight / ExponentialHalfLightRatio;
            _invScale = 1.0 / scale;
            _norm = _plummer ? 1.0 / (Math.PI * scale * scale * (1.0 - e)) : 1.0 / (2.0 * Math.PI * scale * scale * (1.0 - e));
            _minor = scale * (1.0 - e);
        }

        /// <summary>Scale length along the minor axis (arcmin): the profile changes on no shorter scale near the centre.</summary>
        public double MinorScale => _minor;

        public double X0 => _x0;
        public double Y0 => _y0;

        /// <summary>Elliptical (major-axis) radius of a point, in the tangent-plane unit.</summary>
        public double EllipticalRadius(double xi, double eta)
        {
            double x = xi - _x0, y = eta - _y0;
            double u = (x * _c - y * _s) * _invOneMinusE;
            double v = x * _s + y * _c;
            return Math.Sqrt(u * u + v * v);
        }

        /// <summary>Surface density (per unit area of the tangent plane), integrating to 1 over the plane.</summary>
        public double Density(double xi, double eta)
        {
            double x = xi - _x0, y = eta - _y0;
            double u = (x * _c - y * _s) * _invOneMinusE;
            double v = x * _s + y * _c;
            double q = (u * u + v * v) * _invScale * _invScale;
            if (_plummer)
            {
                double w = 1.0 / (1.0 + q);
                return _norm * w * w;
            }
            return _norm * Math.Exp(-Math.Sqrt(q));
        }
    }
}
