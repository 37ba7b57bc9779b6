using Photometallicity.Calibration;
using Photometallicity.Metallicity;
using Photometallicity.Numerics;
using Photometallicity.Pipeline;

namespace Photometallicity.Tests.Pipeline;

/// <summary>
/// For a linear model X = a + b [Fe/H] whose ensemble members differ only in a, every star's [Fe/H] moves by
/// -(a_m - a)/b under member m (first-order error propagation, common practice), so the calibration error of the
/// members' mean is std(a_m)/b exactly.
/// </summary>
public class MdfCalibrationErrorTest
{
    [Fact]
    public void Of_ConstantTermSpread_GivesItsShiftInFeh()
    {
        var basis = new PolynomialBasis2D(1, 1.0, 0.5, -1.5, 1.0); // terms 1, u, v with v = [Fe/H] + 1.5
        double[] best = [-0.3, 0.2, 0.3];
        var rng = new Rng(5);
        var a = Enumerable.Range(0, 400).Select(_ => best[0] + rng.NextGaussian(0, 0.01)).ToArray();
        var model = new CalibrationModel
        {
            Basis = basis, Coefficients = best, CoefficientCovariance = new double[9], SigmaInt = 0.02,
            EnsembleCoefficients = a.Select(x => new[] { x, best[1], best[2] }).ToArray(), EnsembleSigmaInt = a.Select(_ => 0.02).ToArray(),
            Domain = new ValidityDomain([(0.5, -3.0), (1.5, -3.0), (1.5, 0.0), (0.5, 0.0)], []), Filters = new FilterSet("s", "b", "r", "n", 1, 3, 2, 4),
        };
        int n = 1000;
        var colour = Enumerable.Range(0, n).Select(i => 0.6 + 0.8 * i / n).ToArray();
        var feh = Enumerable.Range(0, n).Select(i => -2.5 + 2.0 * ((i * 7) % n) / n).ToArray();
        var result = new MetallicityResult
        {
            Feh = feh, FehLo = feh.Select(f => f - 0.2).ToArray(), FehHi = feh.Select(f => f + 0.2).ToArray(), FehLimit = new double[n], LimitSide = new FehLimitSide[n], Status = new MetallicityStatus[n],
            Likelihoods = new FehLikelihoods { GridMin = -4, GridStep = 0.01, GridCount = 1, Offset = new int[n], Start = new int[n], Length = new int[n], Values = [] },
            Counts = new Dictionary<MetallicityStatus, int>(), ColourNodeStep = 0.01, EnsembleMembers = 400,
        };
        var p = Enumerable.Repeat(1.0, n).ToArray();
        double mean = a.Average();
        double expected = Math.Sqrt(a.Sum(x => (x - mean) * (x - mean)) / (a.Length - 1)) / 0.3;
        Assert.Equal(expected, MdfCalibrationError.Of(model, colour, result, p), 10);
    }

    /// <summary>
    /// Members that differ only in the constant term move every star alike: the spread's calibration error is zero. Members
    /// whose [Fe/H] slope differs by a factor (1 + e_m) stretch every star's distance from the slope's pivot by 1 / (1 + e_m), so
    /// the spread's error is the observed spread times sd(e) to first order (error propagation, common practice).
    /// </summary>
    [Fact]
    public void OfMeanAndSpread_ConstantShiftLeavesTheSpread_SlopeSpreadScalesIt()
    {
        var basis = new PolynomialBasis2D(1, 1.0, 0.5, -1.5, 1.0);
        double[] best = [-0.3, 0.2, 0.3];
        var rng = new Rng(7);
        int n = 1000;
        var colour = Enumerable.Range(0, n).Select(i => 0.6 + 0.8 * i / n).ToArray();
        var feh = Enumerable.Range(0, n).Select(i => -2.5 + 2.0 * ((i * 7) % n) / n).ToArray();
        var result = new MetallicityResult
        {
            Feh = feh, FehLo = feh.Select(f => f - 0.2).ToArray(), FehHi = feh.Select(f => f + 0.2).ToArray(), FehLimit = new double[n],
            LimitSide = new FehLimitSide[n], Status = new MetallicityStatus[n],
            Likelihoods = new FehLikelihoods { GridMin = -4, GridStep = 0.01, GridCount = 1, Offset = new int[n], Start = new int[n], Length = new int[n], Values = [] },
            Counts = new Dictionary<MetallicityStatus, int>(), ColourNodeStep = 0.01, EnsembleMembers = 400,
        };
        var p = Enumerable.Repeat(1.0, n).ToArray();
        CalibrationModel Model(double[][] ens) => new()
        {
            Basis = basis, Coefficients = best, CoefficientCovariance = new double[9], SigmaInt = 0.02,
            EnsembleCoefficients = ens, EnsembleSigmaInt = ens.Select(_ => 0.02).ToArray(),
            Domain = new ValidityDomain([(0.5, -3.0), (1.5, -3.0), (1.5, 0.0), (0.5, 0.0)], []), Filters = new FilterSet("s", "b", "r", "n", 1, 3, 2, 4),
        };
        var shifted = Enumerable.Range(0, 400).Select(_ => new[] { best[0] + rng.NextGaussian(0, 0.01), best[1], best[2] }).ToArray();
        Assert.True(MdfCalibrationError.OfMeanAndSpread(Model(shifted), colour, result, p).Spread < 1e-9);

        var eps = Enumerable.Range(0, 400).Select(_ => rng.NextGaussian(0, 0.02)).ToArray();
        var stretched = eps.Select(e => new[] { best[0], best[1], best[2] * (1 + e) }).ToArray();
        double mean = feh.Average(), spread = Math.Sqrt(feh.Sum(f => (f - mean) * (f - mean)) / n);
        double em = eps.Average(), sdEps = Math.Sqrt(eps.Sum(e => (e - em) * (e - em)) / (eps.Length - 1));
        var (_, spreadErr) = MdfCalibrationError.OfMeanAndSpread(Model(stretched), colour, result, p);
        Assert.InRange(spreadErr / (spread * sdEps), 0.9, 1.1);
    }
}
