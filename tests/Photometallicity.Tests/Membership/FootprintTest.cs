using Photometallicity.Membership;
using Photometallicity.Numerics;

namespace Photometallicity.Tests.Membership;

/// <summary>
/// The footprint normalisation: the profile's integral over the covered cells, checked against the analytic Plummer
/// enclosed fraction (Plummer 1911) and against a Monte Carlo of points drawn from the Plummer profile by its inverse
/// cumulative distribution (independent of the integration code).
/// </summary>
public class FootprintTest
{
    private static Footprint Square(double half, int n) =>
        Footprint.FromMask(-half, -half, 2 * half / n, n, n, Enumerable.Repeat(true, n * n).ToArray());

    [Fact]
    public void Integrate_LargeFieldGivesAlmostOne()
    {
        // a square of half-side 300 a: the Plummer mass outside is below a^2 / (300 a)^2 ~ 1e-5
        var fp = Square(300, 96);
        var p = SurfaceDensityProfile.FromShape(ProfileKind.Plummer, 0.3, -0.2, 1.0, 0.4, 1.0).CreateEvaluator();
        Assert.Equal(1.0, fp.Integrate(p), 3);
        Assert.Equal(600.0 * 600.0, fp.Area, 6);
    }

    [Fact]
    public void Integrate_TruncatedFieldMatchesMonteCarlo()
    {
        // field [-10, 10]^2 arcmin, profile centred 1 arcmin inside the east edge: a good part of it falls outside
        var fp = Square(10, 40);
        var prof = SurfaceDensityProfile.FromShape(ProfileKind.Plummer, 9.0, 2.0, 2.0, 0.3, 0.5);
        double integral = fp.Integrate(prof.CreateEvaluator());
        Assert.True(integral < 0.85, $"integral {integral}");

        var rng = new Rng(5);
        int n = 400_000, inside = 0;
        for (int k = 0; k < n; k++)
        {
            var (x, y) = SyntheticField.SamplePlummer(rng, prof.X0, prof.Y0, prof.HalfLight, prof.Ellipticity, prof.PositionAngle);
            if (x >= -10 && x < 10 && y >= -10 && y < 10) inside++;
        }
        double mc = (double)inside / n;
        double se = Math.Sqrt(mc * (1 - mc) / n);
        Assert.True(Math.Abs(integral - mc) < 4 * se + 1e-3, $"integral {integral} vs Monte Carlo {mc} +- {se}");
    }

    [Fact]
    public void FromPoints_FillsHolesAndMeasuresArea()
    {
        // stars on a 30 x 20 arcmin rectangle with an empty disc (a masked bright star) in the middle
        var rng = new Rng(3);
        var x = new List<double>(); var y = new List<double>();
        while (x.Count < 20_000)
        {
            double a = 30 * rng.NextDouble(), b = 20 * rng.NextDouble();
            if ((a - 15) * (a - 15) + (b - 10) * (b - 10) < 4) continue;
            x.Add(a); y.Add(b);
        }
        var fp = Footprint.FromPoints(x.ToArray(), y.ToArray());
        Assert.True(fp.Contains(15, 10));
        Assert.Equal(600.0, fp.Area, 600 * 0.03);
    }
}
