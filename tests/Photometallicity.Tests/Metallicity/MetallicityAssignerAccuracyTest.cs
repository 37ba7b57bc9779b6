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
    private static readonly Lazy<Photometallicity.Calibration.CalibrationModel> Model = new(() => SyntheticCalibration.Build(64, 0.01, 11));
    private static readonly Lazy<Photometallicity.Calibration.CalibrationModel> TightModel = new(() => SyntheticCalibration.Build(64, 0.005, 12));

    private static double MedianSigma(MetallicityResult r) =>
        Median(Enumerable.Range(0, r.Count).Where(i => !double.IsNaN(r.Feh[i])).Select(i => (r.FehHi[i] - r.FehLo[i]) / 2).ToList());

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
        var stars = SyntheticCalibration.Draw(2000, 21, 0.01, (0.005, 0.02), (0.01, 0.03));
        var r = MetallicityAssigner.Run(stars.Photometry, Model.Value, new MetallicityOptions());
        var (bias, width, cov, n) = Stats(stars, r);
        Assert.True(n > 1900);
        Assert.InRange(bias, -0.02, 0.02);
        Assert.InRange(width, 0.9, 1.1);
        Assert.InRange(cov, 0.63, 0.73);
    }

    [Fact]
    public void Run_LowFehWhereIndexLosesSensitivity_CalibratedPosteriors()
    {
        // dX/dF is 3-5 times smaller here than at [Fe/H] = -0.5; true [Fe/H] kept 0.3 dex or more inside the domain's lower
        // edge. Errors small enough that the posterior (~0.1 dex) is narrower than the region, so that the frequentist coverage
        // at fixed truth approaches the credible level. (With a flat prior in [Fe/H], the posterior median is pulled towards low
        // sensitivity by about -sigma^2 f''/f': measured -0.033 dex at sigma = 0.17 dex with band errors 0.002-0.006 mag; it
        // is a property of that estimator and prior (-0.023 dex at 0.13 dex), and measured -0.01 dex here, with 0.005 mag
        // intrinsic scatter.)
        (double, double) band = (0.001, 0.003), narrow = (0.002, 0.006);
        var stars = SyntheticCalibration.Draw(2000, 22, 0.005, band, narrow, fehLo: -3.0, fehHi: -2.5);
        var r = MetallicityAssigner.Run(stars.Photometry, TightModel.Value, new MetallicityOptions());
        var high = SyntheticCalibration.Draw(600, 23, 0.005, band, narrow, fehLo: -1.0, fehHi: -0.3);
        var rh = MetallicityAssigner.Run(high.Photometry, TightModel.Value, new MetallicityOptions());
        double lowSigma = MedianSigma(r), highSigma = MedianSigma(rh);
        output.WriteLine($"median sigma: {lowSigma:F3} dex at [-3.0, -2.5], {highSigma:F3} dex at [-1.0, -0.3]");
        Assert.True(lowSigma > 2.5 * highSigma, "the test region must be one where the index has lost sensitivity");
        var (bias, width, cov, n) = Stats(stars, r);
        Assert.True(n > 1900);
        Assert.InRange(bias, -0.02, 0.02);
        Assert.InRange(width, 0.9, 1.1);
        Assert.InRange(cov, 0.63, 0.73);
    }
}
