using Photometallicity.Membership;

namespace Photometallicity.Tests.Membership;

/// <summary>The truncated exponential magnitude distribution against direct numerical integration (midpoint rule).</summary>
public class LuminosityFunctionTest
{
    [Theory]
    [InlineData(0.7)]
    [InlineData(-0.4)]
    [InlineData(1e-9)]
    public void LogDensity_IntegratesToOneAndFitRecoversMean(double beta)
    {
        var lf = new LuminosityFunction(18, 24, beta);
        int n = 60_000;
        double h = 6.0 / n, sum = 0, mean = 0;
        for (int k = 0; k < n; k++)
        {
            double m = 18 + (k + 0.5) * h, p = Math.Exp(lf.LogDensity(m));
            sum += p * h; mean += m * p * h;
        }
        Assert.Equal(1.0, sum, 6);
        var fit = new LuminosityFunction(18, 24, 0).Fit(mean);
        Assert.Equal(beta, fit.Beta, 5);
    }
}
