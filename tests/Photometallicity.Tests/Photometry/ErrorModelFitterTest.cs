using Photometallicity.Errors;
using Photometallicity.Numerics;
using Photometallicity.Photometry;

namespace Photometallicity.Tests.Photometry;

public class ErrorModelFitterTest
{
    [Theory]
    [InlineData(24.5, 0.01)]
    [InlineData(22.0, 0.03)]
    public void Fit_RecoversKnownDepthAndFloor(double depth, double floor)
    {
        // Synthetic catalogue from the model itself (PhotometricErrorModel), errors scattered by 5% and 2% wild outliers;
        // the fit must recover depth to 0.05 mag and floor to 15%.
        var truth = new PhotometricErrorModel("g", depth, floor);
        var rng = Seeds.For(99, "error-model-test");
        int n = 5000;
        var mag = new double[n];
        var err = new double[n];
        for (int i = 0; i < n; i++)
        {
            mag[i] = depth - 7 + 7.5 * Math.Sqrt(rng.NextDouble()); // more faint stars than bright ones
            err[i] = truth.Sigma(mag[i]) * (1 + 0.05 * rng.NextGaussian());
            if (rng.NextDouble() < 0.02) err[i] *= 5;
        }
        var fit = ErrorModelFitter.Fit("g", mag, err);
        Assert.Equal("g", fit.Band);
        Assert.InRange(fit.Depth5Sigma, depth - 0.05, depth + 0.05);
        Assert.InRange(fit.Floor, floor * 0.85, floor * 1.15);
    }

    [Fact]
    public void Fit_ExactModelIsRecoveredExactly()
    {
        var truth = new PhotometricErrorModel("i", 23.3, 0.02);
        var mag = Enumerable.Range(0, 200).Select(i => 17.0 + 0.035 * i).ToArray();
        var err = mag.Select(truth.Sigma).ToArray();
        var fit = ErrorModelFitter.Fit("i", mag, err);
        Assert.Equal(23.3, fit.Depth5Sigma, 2);
        Assert.Equal(0.02, fit.Floor, 3);
    }

    [Fact]
    public void Fit_TooFewStarsIsMethodException()
    {
        var mag = new double[] { 18, 19, 20, 21, 22, 23, double.NaN, 24, 25, 26 };
        var err = new double[] { 0.01, 0.01, 0.02, 0.03, 0.05, 0.1, 0.1, 0.2, 0.4, -1 };
        var e = Assert.Throws<MethodException>(() => ErrorModelFitter.Fit("nb", mag, err));
        Assert.Contains("8 stars", e.Message);
    }
}
