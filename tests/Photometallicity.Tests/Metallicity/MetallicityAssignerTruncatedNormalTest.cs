using MathNet.Numerics.Distributions;
using Photometallicity.Calibration;
using Photometallicity.Metallicity;

namespace Photometallicity.Tests.Metallicity;

/// <summary>
/// With a model linear in [Fe/H] (X0 = 0.2 + 0.1 C + 0.3 [Fe/H]), identical ensemble members and a flat prior, the posterior
/// is a normal N(mu, sigma^2), mu = (X0 - 0.2 - 0.1 C0) / 0.3, sigma = sigma_eff / 0.3, truncated to the domain [lo, hi]; its
/// q-quantile is mu + sigma Phi^-1(Phi(alpha) + q (Phi(beta) - Phi(alpha))), alpha = (lo - mu) / sigma, beta = (hi - mu) / sigma
/// (the truncated normal's inverse CDF, e.g. Johnson, Kotz &amp; Balakrishnan 1994, "Continuous Univariate Distributions" vol. 1,
/// ch. 13; Phi from MathNet.Numerics).
/// </summary>
public class MetallicityAssignerTruncatedNormalTest
{
    [Theory]
    [InlineData(-1.5, 0.03)]   // interior
    [InlineData(-0.05, 0.03)]  // next to the upper edge: truncated
    [InlineData(-2.9, 0.06)]   // next to the lower edge, broader
    public void Run_LinearModel_PercentilesOfTruncatedNormal(double fehTrue, double sigmaIndex)
    {
        var basis = new PolynomialBasis2D(1, 1.4, 0.6, -1.5, 1.5);
        // f = c0 + c1 u + c2 v with u = (C - 1.4) / 0.6, v = (F + 1.5) / 1.5  =>  0.2 + 0.1 C + 0.3 F
        double[] coef = [0.2 + 0.1 * 1.4 + 0.3 * -1.5, 0.1 * 0.6, 0.3 * 1.5];
        double lo = -3.0, hi = 0.0, sint = 0.01;
        var model = new CalibrationModel
        {
            Basis = basis, Coefficients = coef, CoefficientCovariance = new double[9], SigmaInt = sint,
            EnsembleCoefficients = [coef, coef, coef], EnsembleSigmaInt = [sint, sint, sint],
            Domain = new ValidityDomain([(1.0, lo), (1.8, lo), (1.8, hi), (1.0, hi)], []), Filters = SyntheticCalibration.Filters,
        };
        double c0 = 1.3, varC = 0.01 * 0.01, cov = -0.5 * 0.01 * sigmaIndex;
        double x0 = 0.2 + 0.1 * c0 + 0.3 * fehTrue;
        var phot = SyntheticCalibration.Photometry([x0], [c0], [sigmaIndex * sigmaIndex], [varC], [cov]);
        var r = MetallicityAssigner.Run(phot, model, new MetallicityOptions { GridStep = 0.002, GridMin = -3.5, GridMax = 0.5 });

        double g = 0.1;
        double seff = Math.Sqrt(sigmaIndex * sigmaIndex + g * g * varC - 2 * g * cov + sint * sint);
        double mu = (x0 - 0.2 - 0.1 * c0) / 0.3, sigma = seff / 0.3;
        double pa = Normal.CDF(0, 1, (lo - mu) / sigma), pb = Normal.CDF(0, 1, (hi - mu) / sigma);
        double Q(double q) => mu + sigma * Normal.InvCDF(0, 1, pa + q * (pb - pa));
        Assert.Equal(Q(0.5), r.Feh[0], 0.002);
        Assert.Equal(Q(0.16), r.FehLo[0], 0.002);
        Assert.Equal(Q(0.84), r.FehHi[0], 0.002);
        // The truncation flag: more than 16 % of the untruncated likelihood beyond an edge.
        bool truncated = 1 - pb > 0.16 || pa > 0.16;
        Assert.Equal(truncated ? MetallicityStatus.PosteriorTruncated : MetallicityStatus.Ok, r.Status[0]);
    }
}
