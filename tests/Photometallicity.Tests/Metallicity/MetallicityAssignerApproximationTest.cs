using Photometallicity.Metallicity;
using Xunit.Abstractions;

namespace Photometallicity.Tests.Metallicity;

/// <summary>
/// The fast paths (strided evaluation with ln L interpolation, rotating ensemble subsets) against the exact mixture over every
/// member at every grid point, on the same synthetic stars: the percentiles must agree to a small fraction of the posterior
/// width (the tolerances the options document: eps = 0.03 for the subset, 1 / (8 P^2) in ln L for the stride).
/// </summary>
public class MetallicityAssignerApproximationTest(ITestOutputHelper output)
{
    [Fact]
    public void Run_FastPaths_AgreeWithExactMixture()
    {
        var model = SyntheticCalibration.Build(160, 0.01, 31);
        // Faint-ish stars: broad likelihoods, where stride and subset both act (measured with 300 members and 1500 stars:
        // median 0.004, 99th percentile 0.020, largest 0.034 sigma).
        var stars = SyntheticCalibration.Draw(400, 32, 0.01, (0.01, 0.05), (0.02, 0.10));
        var fast = MetallicityAssigner.Run(stars.Photometry, model, new MetallicityOptions());
        var exact = MetallicityAssigner.Run(stars.Photometry, model, new MetallicityOptions { MaxEvaluationStride = 1, EnsembleSubsetTolerance = 0 });
        var dev = new List<double>();
        for (int i = 0; i < stars.TrueFeh.Length; i++)
        {
            Assert.Equal(exact.Status[i], fast.Status[i]);
            if (double.IsNaN(exact.Feh[i])) continue;
            double sigma = (exact.FehHi[i] - exact.FehLo[i]) / 2;
            dev.Add(Math.Max(Math.Abs(fast.Feh[i] - exact.Feh[i]), Math.Max(Math.Abs(fast.FehLo[i] - exact.FehLo[i]), Math.Abs(fast.FehHi[i] - exact.FehHi[i]))) / sigma);
        }
        dev.Sort();
        double p99 = dev[(int)(0.99 * (dev.Count - 1))], max = dev[^1];
        output.WriteLine($"{dev.Count} stars: |fast - exact| / sigma median {dev[dev.Count / 2]:F4}, 99th percentile {p99:F4}, max {max:F4}");
        Assert.True(dev.Count > 370);
        Assert.True(p99 < 0.04, $"99th percentile deviation {p99} sigma");
        Assert.True(max < 0.08, $"largest deviation {max} sigma");
    }
}
