using Photometallicity.Calibration;
using Photometallicity.Metallicity;
using Photometallicity.Photometry;

namespace Photometallicity.Tests.Metallicity;

/// <summary>
/// Statuses, limits, row bookkeeping, stored likelihoods and determinism of <see cref="MetallicityAssigner"/>, on the invented
/// model of <see cref="SyntheticCalibration"/> (truth: X0 = f(C, F) of its analytic form).
/// </summary>
public class MetallicityAssignerStatusTest
{
    private static readonly Lazy<CalibrationModel> Model = new(() => SyntheticCalibration.Build(40, 0.01, 5));

    private static double F(double c, double feh) => SyntheticCalibration.Model(SyntheticCalibration.Parameters, c, feh);

    private static MetallicityResult RunRows(params (double X, double C, PhotometryStatus S)[] rows)
    {
        int n = rows.Length;
        var phot = SyntheticCalibration.Photometry(rows.Select(r => r.X).ToArray(), rows.Select(r => r.C).ToArray(),
            Enumerable.Repeat(0.02 * 0.02, n).ToArray(), Enumerable.Repeat(0.01 * 0.01, n).ToArray(), new double[n], rows.Select(r => r.S).ToArray());
        return MetallicityAssigner.Run(phot, Model.Value, new MetallicityOptions());
    }

    [Fact]
    public void Run_EveryRowKeepsItsPlaceWithAStatus()
    {
        var r = RunRows(
            (F(1.2, -1.0), 1.2, PhotometryStatus.Ok),
            (double.NaN, 1.2, PhotometryStatus.NarrowMissing),
            (F(1.5, -2.0), 1.5, PhotometryStatus.Ok),
            (F(1.2, -1.0), 2.6, PhotometryStatus.Ok),
            (double.NaN, 1.3, PhotometryStatus.Ok),
            (F(1.8, -0.5), 1.8, PhotometryStatus.Ok));
        Assert.Equal(6, r.Count);
        Assert.Equal(
            [MetallicityStatus.Ok, MetallicityStatus.BadPhotometry, MetallicityStatus.Ok, MetallicityStatus.ColourOutsideCalibration,
             MetallicityStatus.BadPhotometry, MetallicityStatus.Ok], r.Status);
        Assert.Equal(-1.0, r.Feh[0], 0.05);
        Assert.Equal(-2.0, r.Feh[2], 0.1);
        Assert.Equal(-0.5, r.Feh[5], 0.05);
        foreach (int i in new[] { 1, 3, 4 })
        {
            Assert.True(double.IsNaN(r.Feh[i]) && double.IsNaN(r.FehLo[i]) && double.IsNaN(r.FehHi[i]));
            Assert.False(r.Likelihoods.Has(i));
        }
        Assert.Equal(3, r.Counts[MetallicityStatus.Ok]);
        Assert.Equal(2, r.Counts[MetallicityStatus.BadPhotometry]);
        Assert.Equal(6, r.Counts.Values.Sum());
    }

    [Fact]
    public void Run_IndexFarAboveRange_GivesLowerLimitNotValue()
    {
        // The model rises with [Fe/H]; at colour 1.5 the domain spans [-3.38, -0.125] dex. An index 0.5 mag above the model at
        // the top means "more metal-rich than the calibration reaches": a lower limit at the edge; likewise an upper limit below.
        var (lo, hi) = SyntheticCalibration.Domain.FehRangeAt(1.5)!.Value;
        var r = RunRows((F(1.5, hi) + 0.5, 1.5, PhotometryStatus.Ok), (F(1.5, lo) - 0.5, 1.5, PhotometryStatus.Ok));
        Assert.Equal(MetallicityStatus.IndexAboveRange, r.Status[0]);
        Assert.True(double.IsNaN(r.Feh[0]) && double.IsNaN(r.FehHi[0]));
        Assert.Equal(FehLimitSide.Lower, r.LimitSide[0]);
        Assert.Equal(r.FehLimit[0], r.FehLo[0]);
        Assert.InRange(r.FehLimit[0], hi - 0.3, hi + 1e-9);
        Assert.Equal(MetallicityStatus.IndexBelowRange, r.Status[1]);
        Assert.Equal(FehLimitSide.Upper, r.LimitSide[1]);
        Assert.True(double.IsNaN(r.Feh[1]) && double.IsNaN(r.FehLo[1]));
        Assert.Equal(r.FehLimit[1], r.FehHi[1]);
        Assert.InRange(r.FehLimit[1], lo - 1e-9, lo + 0.3);
    }

    [Fact]
    public void Run_IndexJustBeyondEdge_FlaggedTruncatedWithValues()
    {
        double hi = SyntheticCalibration.Domain.FehRangeAt(1.5)!.Value.FehHi;
        var r = RunRows((F(1.5, hi) + 0.01, 1.5, PhotometryStatus.Ok));
        Assert.Equal(MetallicityStatus.PosteriorTruncated, r.Status[0]);
        Assert.True(r.FehLo[0] < r.Feh[0] && r.Feh[0] < r.FehHi[0]);
        Assert.True(r.FehHi[0] <= hi);
    }

    [Fact]
    public void Run_ExcludedColour_NonMonotonic()
    {
        var baseModel = Model.Value;
        var model = baseModel with { Domain = new ValidityDomain(baseModel.Domain.Hull, [(1.6, 1.7)]) };
        var phot = SyntheticCalibration.Photometry([F(1.65, -1), F(1.5, -1)], [1.65, 1.5], [4e-4, 4e-4], [1e-4, 1e-4], [0, 0]);
        var r = MetallicityAssigner.Run(phot, model, new MetallicityOptions());
        Assert.Equal([MetallicityStatus.NonMonotonic, MetallicityStatus.Ok], r.Status);
    }

    [Fact]
    public void Run_StoredLikelihood_NormalisedAndPeakedAtTruth()
    {
        var r = RunRows((F(1.4, -1.5), 1.4, PhotometryStatus.Ok));
        var like = r.Likelihoods;
        Assert.True(like.Has(0));
        var w = like.Window(0);
        double sum = 0;
        int peak = 0;
        for (int j = 0; j < w.Length; j++) { sum += (double)w[j]; if (w[j] > w[peak]) peak = j; }
        Assert.Equal(1.0, sum * like.Spacing(0), 3); // half-precision values: 5e-4 relative rounding each
        Assert.Equal(-1.5, like.GridValue(like.GridIndex(0, peak)), 0.03);
        // The stored samples stay inside the span above 1e-6 of the peak and reach into its tails (an end sample carries
        // an end weight of at least ~0.4 of an interior one, see StarSolver.EndCorrectedWeights).
        double p = (double)w[peak];
        Assert.True((double)w[0] >= 0.3e-6 * p && (double)w[^1] >= 0.3e-6 * p);
        Assert.True((double)w[0] < 1e-3 * p && (double)w[^1] < 1e-3 * p);
    }

    [Fact]
    public void Run_GaussianPrior_PullsTowardsPriorMean()
    {
        var phot = SyntheticCalibration.Photometry([F(1.4, -2.0)], [1.4], [0.03 * 0.03], [1e-4], [0]);
        var flat = MetallicityAssigner.Run(phot, Model.Value, new MetallicityOptions());
        var prior = MetallicityAssigner.Run(phot, Model.Value, new MetallicityOptions { PriorMean = -1.0, PriorSigma = 0.3 });
        Assert.True(prior.Feh[0] > flat.Feh[0] + 0.05);
        Assert.True(prior.FehHi[0] - prior.FehLo[0] < flat.FehHi[0] - flat.FehLo[0]);
        // The stored likelihood excludes the prior.
        Assert.Equal(flat.Likelihoods.Window(0).ToArray(), prior.Likelihoods.Window(0).ToArray());
    }

    [Fact]
    public void Run_SameResultWhateverTheThreadCount()
    {
        var stars = SyntheticCalibration.Draw(1000, 8, 0.01, (0.005, 0.03), (0.01, 0.08));
        var one = MetallicityAssigner.Run(stars.Photometry, Model.Value, new MetallicityOptions { MaxDegreeOfParallelism = 1, ChunkSize = 256 });
        var all = MetallicityAssigner.Run(stars.Photometry, Model.Value, new MetallicityOptions { ChunkSize = 256 });
        Assert.Equal(one.Feh, all.Feh);
        Assert.Equal(one.FehLo, all.FehLo);
        Assert.Equal(one.FehHi, all.FehHi);
        Assert.Equal(one.Status, all.Status);
        Assert.Equal(one.Likelihoods.Offset, all.Likelihoods.Offset);
        Assert.Equal(one.Likelihoods.Start, all.Likelihoods.Start);
        Assert.Equal(one.Likelihoods.Stride, all.Likelihoods.Stride);
        Assert.Equal(one.Likelihoods.Values, all.Likelihoods.Values);
    }

    [Fact]
    public void Options_Invalid_NameTheKey()
    {
        var e = Assert.Throws<Photometallicity.Errors.InputException>(() => new MetallicityOptions { PriorMean = 0 }.Validate());
        Assert.Contains("metallicity.prior", e.Message);
        e = Assert.Throws<Photometallicity.Errors.InputException>(() => new MetallicityOptions { GridStep = -1 }.Validate());
        Assert.Contains("grid_step", e.Message);
    }
}
