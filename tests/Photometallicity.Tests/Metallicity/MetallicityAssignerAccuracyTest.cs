using Photometallicity.Metallicity;
using Xunit.Abstractions;

namespace Photometallicity.Tests.Metallicity;

/// <summary>
/// Posterior calibration on synthetic stars drawn from a known forward model (<see cref="SyntheticCalibration"/>): the truths
/// come from the flat prior and the ensemble distribution, so the 16-84 % intervals must contain the truth ~68 % of the time
/// (the definition of a credible interval under its own prior), the median of (feh - true) must be ~0, and the normalised
/// residual (feh - true) / sigma, sigma = (hi - lo) / 2, must have a robust width (1.4826 MAD; the normal-consistent MAD,
/// Rousseeuw &amp; Croux 1993, JASA 88, 1273) of ~1.
/// </summary>
public class MetallicityAssignerAccuracyTest(ITestOutputHelper output)
{
    private static readonly Lazy<Photometallicity.Calibration.CalibrationModel> Model = new(() => SyntheticCalibration.Build(200, 0.01, 11));

    private (double Bias, double Width, double Coverage, int N) Stats(SyntheticCalibration.Stars stars, MetallicityResult r)
    {
        var d = new List<double>();
        var z = new List<double>();
        int inside = 0;
        for (int i = 0; i < r.Count; i++)
        {
            if (r.Status[i] is not (MetallicityStatus.Ok or MetallicityStatus.PosteriorTruncated)) continue;
            double t = stars.TrueFeh[i];
            d.Add(r.Feh[i] - t);
            z.Add((r.Feh[i] - t) / ((r.FehHi[i] - r.FehLo[i]) / 2));
            if (t >= r.FehLo[i] && t <= r.FehHi[i]) inside++;
        }
        double med = Median(d);
        double zmed = Median(z);
        double mad = 1.4826 * Median(z.Select(v => Math.Abs(v - zmed)).ToList());
        var s = (med, mad, inside / (double)d.Count, d.Count);
        output.WriteLine($"n = {s.Item4} of {r.Count}, median bias {s.med:F4} dex, robust width {s.mad:F3}, coverage {s.Item3:F3}; " +
                         string.Join(", ", r.Counts.Where(kv => kv.Value > 0).Select(kv => $"{kv.Key} {kv.Value}")));
        return s;
    }

    private static double Median(List<double> v)
    {
        var a = v.OrderBy(x => x).ToArray();
        return a.Length % 2 == 1 ? a[a.Length / 2] : 0.5 * (a[a.Length / 2 - 1] + a[a.Length / 2]);
    }

    [Fact]
    public void Run_WholeDomain_CalibratedPosteriors()
    {
        var stars = SyntheticCalibration.Draw(8000, 21, 0.01, (0.005, 0.02), (0.01, 0.03));
        var r = MetallicityAssigner.Run(stars.Photometry, Model.Value, new MetallicityOptions());
        var (bias, width, cov, n) = Stats(stars, r);
        Assert.True(n > 7000);
        Assert.InRange(bias, -0.02, 0.02);
        Assert.InRange(width, 0.9, 1.1);
        Assert.InRange(cov, 0.63, 0.73);
    }

    [Fact]
    public void Run_LowFehWhereIndexLosesSensitivity_CalibratedPosteriors()
    {
        // dX/dF is 3-6 times smaller here than at [Fe/H] = 0; true [Fe/H] kept 0.3 dex inside the domain's lower edge.
        var stars = SyntheticCalibration.Draw(8000, 22, 0.01, (0.005, 0.02), (0.01, 0.03), fehLo: -3.0, fehHi: -2.5);
        var r = MetallicityAssigner.Run(stars.Photometry, Model.Value, new MetallicityOptions());
        var (bias, width, cov, n) = Stats(stars, r);
        Assert.True(n > 7000);
        Assert.InRange(bias, -0.02, 0.02);
        Assert.InRange(width, 0.9, 1.1);
        Assert.InRange(cov, 0.63, 0.73);
    }
}
