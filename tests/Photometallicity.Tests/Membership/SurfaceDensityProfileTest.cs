using Photometallicity.Membership;

namespace Photometallicity.Tests.Membership;

/// <summary>
/// Checks against the analytic Plummer (1911, MNRAS 71, 460) and exponential forms as written by Martin, de Jong
/// &amp; Rix (2008, ApJ 684, 1075, eqs. 4-6): unit integral over the plane, half the light inside the half-light
/// ellipse, enclosed fraction R^2 / (R^2 + a^2) for Plummer and 1 - (1 + x) e^-x for the exponential.
/// The integrals are done here by a polar grid in elliptical coordinates, independent of the footprint code.
/// </summary>
public class SurfaceDensityProfileTest
{
    private static double Enclosed(SurfaceDensityProfile p, double rMax)
    {
        // integrate over the ellipse r_ell <= rMax with a Cartesian grid fine against the minor scale
        var ev = p.CreateEvaluator();
        double h = p.HalfLight * (1 - p.Ellipticity) / 60.0;
        int n = (int)Math.Ceiling(rMax / h);
        double sum = 0;
        for (int ix = -n; ix < n; ix++)
            for (int iy = -n; iy < n; iy++)
            {
                double x = p.X0 + (ix + 0.5) * h, y = p.Y0 + (iy + 0.5) * h;
                if (ev.EllipticalRadius(x, y) <= rMax) sum += ev.Density(x, y);
            }
        return sum * h * h;
    }

    [Theory]
    [InlineData(ProfileKind.Plummer, 0.0, 0.0)]
    [InlineData(ProfileKind.Plummer, 0.4, 35.0)]
    [InlineData(ProfileKind.Exponential, 0.3, 120.0)]
    public void Density_HalfTheLightInsideHalfLightEllipse(ProfileKind kind, double e, double paDeg)
    {
        var p = SurfaceDensityProfile.FromShape(kind, 1.5, -2.0, 2.0, e, paDeg * Math.PI / 180);
        Assert.Equal(0.5, Enclosed(p, p.HalfLight), 3);
    }

    [Fact]
    public void Plummer_EnclosedFractionMatchesAnalyticAndTotalIsOne()
    {
        var p = SurfaceDensityProfile.FromShape(ProfileKind.Plummer, 0, 0, 1.0, 0.25, 0.7);
        foreach (double r in new[] { 0.5, 2.0, 10.0 })
            Assert.Equal(r * r / (r * r + 1), Enclosed(p, r), 3); // Plummer 1911: R^2 / (R^2 + a^2)
        // beyond 10 a only 1/101 remains: the total tends to 1
        Assert.Equal(1.0, Enclosed(p, 10.0) + 1.0 / 101.0, 3);
    }

    [Fact]
    public void Exponential_EnclosedFractionMatchesAnalytic()
    {
        var p = SurfaceDensityProfile.FromShape(ProfileKind.Exponential, 0, 0, 1.0, 0.0, 0);
        double re = 1.0 / SurfaceDensityProfile.ExponentialHalfLightRatio;
        foreach (double r in new[] { 0.5, 3.0 })
        {
            double x = r / re;
            Assert.Equal(1 - (1 + x) * Math.Exp(-x), Enclosed(p, r), 3);
        }
        // the constant solves 1 - (1 + x) e^-x = 1/2 (Martin et al. 2008 quote 1.68)
        double k = SurfaceDensityProfile.ExponentialHalfLightRatio;
        Assert.Equal(0.5, (1 + k) * Math.Exp(-k), 12);
    }

    [Fact]
    public void EllipticalRadius_MajorAxisAlongPositionAngle()
    {
        // PA 30 deg east of north: the major axis points to (sin 30, cos 30) in (east, north)
        var ev = SurfaceDensityProfile.FromShape(ProfileKind.Plummer, 0, 0, 1, 0.5, 30 * Math.PI / 180).CreateEvaluator();
        double t = 30 * Math.PI / 180;
        Assert.Equal(2.0, ev.EllipticalRadius(2 * Math.Sin(t), 2 * Math.Cos(t)), 12);
        Assert.Equal(2.0, ev.EllipticalRadius(1 * Math.Cos(t), -1 * Math.Sin(t)), 12); // minor axis: b = (1 - e) a
    }
}
