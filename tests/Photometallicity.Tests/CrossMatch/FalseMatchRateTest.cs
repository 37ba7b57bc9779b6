using Photometallicity.CrossMatch;
using Photometallicity.Numerics;
using Photometallicity.Units;

namespace Photometallicity.Tests.CrossMatch;

/// <summary>
/// Chance coincidences. Reference: the Poisson probability that a circle of radius r holds at least one of
/// a uniform random set of points of surface density rho, P = 1 - exp(-pi rho r^2).
/// </summary>
public class FalseMatchRateTest
{
    // Source: P = 1 - exp(-pi rho r^2) by hand: pi x (100 / 3600) arcsec^-2 x 1 arcsec^2 = 0.0872665;
    // 1 - exp(-0.0872665) = 0.0835671.
    [Fact]
    public void ChanceProbability_HundredPerSqArcminAtOneArcsec()
    {
        Assert.Equal(0.0836, FalseMatchRate.ChanceProbability(100.0, Angle.FromArcseconds(1.0)), 4);
        Assert.Equal(0.0835671, FalseMatchRate.ChanceProbability(100.0, Angle.FromArcseconds(1.0)), 6);
    }

    private static (double[] Ra, double[] Dec) Uniform(Rng rng, int n, double ra0, double dec0, double halfDeg)
    {
        var ra = new double[n];
        var dec = new double[n];
        for (int i = 0; i < n; i++)
            (ra[i], dec[i]) = SyntheticField.Deproject(ra0, dec0, (2 * rng.NextDouble() - 1) * halfDeg * Math.PI / 180, (2 * rng.NextDouble() - 1) * halfDeg * Math.PI / 180);
        return (ra, dec);
    }

    // Source: the Poisson formula above. Two independent uniform fields of 0.5 x 0.5 deg (900 sq arcmin) with
    // 90 000 right sources (100 per sq arcmin): the measured (shifted-position) and expected (local density)
    // rates must both agree with 0.0836 within 4 binomial standard errors plus 3% for the field edges.
    [Theory]
    [InlineData(120.0, 15.0)]
    [InlineData(0.0, -60.0)]
    [InlineData(0.0, 89.8)]
    public void Rates_OnUniformRandomFieldsMatchPoisson(double ra0, double dec0)
    {
        var rng = new Rng(99);
        var (lra, ldec) = Uniform(rng, 20_000, ra0, dec0, 0.25);
        var (rra, rdec) = Uniform(rng, 90_000, ra0, dec0, 0.25);
        var r = CrossMatcher.Run(lra, ldec, rra, rdec, new CrossMatchOptions { Radius = Angle.FromArcseconds(1.0), SolveOffset = false });
        double p = FalseMatchRate.ChanceProbability(100.0, Angle.FromArcseconds(1.0));
        double tol = 4 * r.MeasuredFalseMatchRateError + 0.03 * p;
        Assert.True(Math.Abs(r.MeasuredFalseMatchRate - p) < tol, $"measured {r.MeasuredFalseMatchRate} vs {p} +/- {tol}");
        Assert.True(Math.Abs(r.ExpectedFalseMatchRate - p) < 0.05 * p, $"expected {r.ExpectedFalseMatchRate} vs {p}");
        // With no true counterparts, every match is a chance one: the matched fraction is the chance rate too
        // (slightly less, since 1:1 takes each right source once).
        double matchedFraction = (double)r.Matched / lra.Length;
        Assert.True(Math.Abs(matchedFraction - p) < 4 * Math.Sqrt(p * (1 - p) / lra.Length) + 0.05 * p, $"matched fraction {matchedFraction}");
    }

    // Source: the same formula; the rate scales as 1 - exp(-pi rho r^2) with the radius.
    [Fact]
    public void Measured_GrowsWithRadiusAsPoisson()
    {
        var rng = new Rng(5);
        var (lra, ldec) = Uniform(rng, 20_000, 30.0, 5.0, 0.25);
        var (rra, rdec) = Uniform(rng, 90_000, 30.0, 5.0, 0.25);
        foreach (double rad in new[] { 0.5, 2.0 })
        {
            var r = CrossMatcher.Run(lra, ldec, rra, rdec, new CrossMatchOptions { Radius = Angle.FromArcseconds(rad), SolveOffset = false });
            double p = FalseMatchRate.ChanceProbability(100.0, Angle.FromArcseconds(rad));
            Assert.True(Math.Abs(r.MeasuredFalseMatchRate - p) < 4 * r.MeasuredFalseMatchRateError + 0.04 * p, $"r = {rad}: measured {r.MeasuredFalseMatchRate} vs {p}");
        }
    }
}
