using Microsoft.Extensions.Logging.Abstractions;
using Photometallicity.Configuration;
using Photometallicity.Metallicity;
using Photometallicity.Pipeline;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Metallicity;

/// <summary>
/// The compact likelihood storage (per-star stride, half precision; see <see cref="FehLikelihoods"/>) against every grid
/// point of the same windows, on the committed invented field (samples/): the metallicity distribution fitted by the
/// membership step, and the membership probabilities, barely move, while the store shrinks several times over.
/// </summary>
public class FehLikelihoodCompactionTest
{
    [Fact]
    public void SamplesField_CompactLikelihoods_GiveTheSameMdfAsEveryGridPoint()
    {
        using var dir = new TempDir();
        var config = ConfigLoader.Load(RepoPaths.Samples("config.json"), dir.Path);
        var r = PipelineRunner.Run(config, NullLogger.Instance, null, new RunScope(PipelineStage.Metallicity));
        var options = new MetallicityOptions
        {
            GridMin = config.Metallicity.GridMin, GridMax = config.Metallicity.GridMax, GridStep = config.Metallicity.GridStep,
            PriorMean = config.Metallicity.PriorMean, PriorSigma = config.Metallicity.PriorSigma,
        };
        var compact = r.Metallicity!;
        var full = MetallicityAssigner.Run(r.Photometry.Index, r.Model, options with { StoreEveryGridPoint = true });
        Assert.All(full.Likelihoods.Stride!, k => Assert.Equal(1, k));
        Assert.Equal(full.Feh, compact.Feh);
        Assert.Equal(full.Status, compact.Status);
        Assert.True(compact.Likelihoods.Values.Length * 4 < full.Likelihoods.Values.Length,
            $"{compact.Likelihoods.Values.Length} stored values against {full.Likelihoods.Values.Length}");
        // Windows now span the whole grid where the calibration extrapolates (a saturated index leaves a likelihood flat down to
        // the grid's end, with a steep flank on the other side that bounds the stride), so the bound is on the mean length
        // (measured: 49.6 values, longest 410).
        double meanLength = compact.Likelihoods.Length.Where(l => l > 0).Average(l => (double)l);
        Assert.True(meanLength <= 60, $"mean stored window {meanLength:F1} values, longest {compact.Likelihoods.Length.Max()}");

        var b = r.Inputs.Broadband;
        double[] ra = b.RequireDoubles(config.Broadband.RaColumn), dec = b.RequireDoubles(config.Broadband.DecColumn);
        double[] magErr = PhotometryStep.BandColumn(config.Blue, config.Blue.ErrColumn, b, r.Inputs.Narrowband, r.Match.RightIndex);
        var withCompact = MembershipStep.Run(config, r.Inputs, ra, dec, r.Photometry, compact, magErr, NullLogger.Instance);
        var withFull = MembershipStep.Run(config, r.Inputs, ra, dec, r.Photometry, full, magErr, NullLogger.Instance);
        var (mc, mf) = (withCompact.Mdf!, withFull.Mdf!);
        // Measured when written: 2.6e-5 dex in the mean, -3.7e-5 in sigma, 0.0028 at most in a membership probability,
        // 77 163 values stored instead of 459 369. (On the 3 x 10^6-star demo field: -1.4e-5 and -1.8e-5 dex, 0.019 at most,
        // 174 of 2.6 million stars above 0.005, 43 M values instead of 255 M.)
        Assert.InRange(mc.Mean - mf.Mean, -0.001, 0.001);
        Assert.InRange(mc.Sigma - mf.Sigma, -0.001, 0.001);
        double worst = 0;
        int over = 0;
        for (int i = 0; i < withFull.PMember.Length; i++)
            if (double.IsFinite(withFull.PMember[i]))
            {
                double dp = Math.Abs(withCompact.PMember[i] - withFull.PMember[i]);
                if (dp > 0.005) over++;
                worst = Math.Max(worst, dp);
            }
        string what = $"largest change of a membership probability {worst}, {over} above 0.005; mean {mc.Mean - mf.Mean:E2}, sigma {mc.Sigma - mf.Sigma:E2}";
        Assert.True(worst < 0.01 && over < 5, what);
    }

    [Theory]
    [InlineData(5, 41, 0, 0)]
    [InlineData(9, 171, 0, 8)]
    [InlineData(10, 152, 1, 0)]
    [InlineData(3, 7, 0, 0)]
    [InlineData(4, 6, 0, 1)]
    public void EndCorrectedWeights_AddUpToTheSpan_AndSumAStraightLineExactly(int k, int span, int rLo, int rHi)
    {
        int count = (span - 1 - rLo - rHi) / k + 1;
        Assert.Equal(span - 1 - rLo - rHi, (count - 1) * k); // the cases are consistent
        var w = new double[count];
        StarSolver.EndCorrectedWeights(w, k, span, rLo, rHi);
        Assert.Equal(span, w.Sum(), 10);
        // f(j) = 2 + 0.3 j over the L points j = 0 .. L-1, samples at rLo + m k.
        double exact = Enumerable.Range(0, span).Sum(j => 2 + 0.3 * j);
        double approx = Enumerable.Range(0, count).Sum(m => w[m] * (2 + 0.3 * (rLo + m * k)));
        Assert.Equal(exact, approx, 9);
    }

    [Fact]
    public void EndCorrectedWeights_SumARisingExponentialCutAtAnEdge_ToBetterThan3e3()
    {
        // A likelihood rising towards a hard domain edge, like exp(j / 46) over 171 points, sampled every 9 points with the
        // 8 points beyond the last sample: k at every sample would be off by -8.5 %, (k + 1)/2 at the ends with the 8 points
        // at the last sample's value by -1.3 %; the end-corrected weights by -0.2 % (computed when written).
        const int k = 9, span = 171, rHi = 8;
        int count = (span - 1 - rHi) / k + 1;
        var w = new double[count];
        StarSolver.EndCorrectedWeights(w, k, span, 0, rHi);
        double exact = Enumerable.Range(0, span).Sum(j => Math.Exp(j / 46.0));
        double approx = Enumerable.Range(0, count).Sum(m => w[m] * Math.Exp(m * k / 46.0));
        Assert.InRange(approx / exact - 1, -3e-3, 3e-3);
    }
}
