using Photometallicity.Membership;
using Photometallicity.Units;

namespace Photometallicity.Tests.Membership;

/// <summary>
/// The gnomonic projection against closed-form cases (a point on the equator 1 deg east of the reference has
/// xi = tan 1 deg, eta = 0; a point 1 deg north has eta = tan 1 deg) and against the test generator's independent
/// vector-rotation deprojection, across RA = 0 and near the pole.
/// </summary>
public class TangentPlaneTest
{
    private const double ArcminPerRad = 180 * 60 / Math.PI;

    [Fact]
    public void TryProject_ClosedFormCases()
    {
        var tp = new TangentPlane(SkyPosition.FromDegrees(0.5, 0.0));
        Assert.True(tp.TryProject(1.5, 0.0, out double xi, out double eta));
        Assert.Equal(Math.Tan(Math.PI / 180) * ArcminPerRad, xi, 9);
        Assert.Equal(0.0, eta, 9);
        Assert.True(tp.TryProject(359.5, 0.0, out xi, out _)); // across RA = 0
        Assert.Equal(-Math.Tan(Math.PI / 180) * ArcminPerRad, xi, 9);
        Assert.True(tp.TryProject(0.5, 1.0, out xi, out eta));
        Assert.Equal(0.0, xi, 9);
        Assert.Equal(Math.Tan(Math.PI / 180) * ArcminPerRad, eta, 9);
        Assert.False(tp.TryProject(180.5, 0.0, out _, out _)); // far hemisphere
    }

    [Theory]
    [InlineData(0.1, 12.0)]
    [InlineData(200.0, 88.0)]
    [InlineData(359.95, -89.5)]
    public void Deproject_InvertsIndependentVectorRotation(double ra0, double dec0)
    {
        var tp = new TangentPlane(SkyPosition.FromDegrees(ra0, dec0));
        foreach (var (xi, eta) in new[] { (25.0, -13.0), (-40.0, 31.0), (0.0, 0.0) })
        {
            var (ra, dec) = SyntheticField.ToSky(ra0, dec0, xi, eta);
            Assert.True(tp.TryProject(ra, dec, out double x, out double y));
            Assert.Equal(xi, x, 7);
            Assert.Equal(eta, y, 7);
            var back = tp.Deproject(x, y);
            Assert.Equal(dec, back.DecDegrees, 9);
            double dra = Math.IEEERemainder(back.RaDegrees - ra, 360.0);
            Assert.Equal(0.0, dra * Math.Cos(dec * Math.PI / 180), 9);
        }
    }
}
