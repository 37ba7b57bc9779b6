using Photometallicity.Calibration;

namespace Photometallicity.Tests.Calibration;

/// <summary>
/// The maximum-likelihood fit with intrinsic scatter against an independent optimiser. Reference: scipy 1.10.1 /
/// numpy 1.24.2 (Debian python3-scipy), minimising -2 ln L = sum [r^2 / (s_i^2 + s^2) + ln(s_i^2 + s^2)] over the
/// six coefficients of a plain quadratic in (C0, [Fe/H]) and ln s with BFGS then Nelder-Mead (xatol 1e-12), on the
/// invented data below (errors in the index only, so the likelihood is exact and has no gradient terms). The data
/// were drawn with numpy.random.default_rng(2026) from the invented model
/// 0.4 + 0.55 C + 0.3 F + 0.1 C^2 + 0.15 C F + 0.06 F^2 with sigma_int 0.03 mag; the script:
/// <code>
/// T = np.stack([np.ones(n), c, f, c*c, c*f, f*f], axis=1)
/// nll = lambda q: np.sum((x - T @ q[:6])**2 / (sx**2 + np.exp(2*q[6])) + np.log(sx**2 + np.exp(2*q[6])))
/// res = minimize(nll, [*lstsq(T, x), log(0.03)], method='BFGS'); then method='Nelder-Mead' from res.x
/// </code>
/// Result: -2 ln L = -165.34832374455192, sigma_int = 0.02229021439625036 mag, f(1.0, -2.0) = 0.3606416210489664,
/// f(1.2, -1.5) = 0.619729110208569, f(1.4, -1.0) = 0.8854443924352444. Tolerances: 1e-4 mag for sigma_int (the
/// profile search stops at 1e-3 in ln sigma_int) and 2e-5 mag for the model values.
/// The fit then corrects sigma_int for the degrees of freedom the coefficients take (residuals scaled by n / (n - p) = 30 / 24 in
/// the sigma_int objective, coefficients re-solved by weighted least squares at the new sigma_int, iterated to convergence with
/// scipy.optimize.minimize_scalar, bounded, xatol 1e-13): sigma_int = 0.029030709670186863 mag, f(1.0, -2.0) = 0.36092199009884846,
/// f(1.2, -1.5) = 0.6203985808779118, f(1.4, -1.0) = 0.8835712301080595. The model carries sigma_int marginalised over its
/// uncertainty: the posterior mean of sigma_int^2 under a flat prior on sigma_int at those coefficients, from scipy.integrate.quad
/// (epsrel 1e-12) of s^2 L(s) and L(s) over [0, 10 max(s, rms)]: sqrt(E[s^2]) = 0.031787351497382585 mag; tolerance 1e-6 mag
/// (our trapezoid rule on 2000 points).
/// </summary>
public class ReferenceLikelihoodTest
{
    private static readonly double[] C = [0.9431, 1.3119, 1.1738, 1.0964, 1.0839, 1.4324, 1.5241, 0.9419, 1.3222, 1.0386, 1.5736, 1.5359, 1.3087, 1.4022, 1.2121, 1.4607, 1.1587, 1.0710, 1.0223, 0.9811, 1.2207, 1.1447, 1.3305, 0.8103, 1.1582, 1.0921, 0.9563, 1.2759, 1.1483, 1.0400];
    private static readonly double[] F = [-2.023, -0.826, -0.965, -1.308, -1.779, -0.696, -1.386, -1.621, -0.779, -1.825, -1.147, -1.835, -1.929, -1.138, -1.990, -1.512, -1.356, -2.060, -1.084, -1.413, -1.281, -1.730, -1.644, -1.509, -1.554, -1.184, -1.361, -1.651, -2.397, -0.971];
    private static readonly double[] Sx = [0.0308, 0.0231, 0.0300, 0.0137, 0.0462, 0.0496, 0.0123, 0.0243, 0.0392, 0.0226, 0.0327, 0.0267, 0.0410, 0.0483, 0.0455, 0.0348, 0.0164, 0.0479, 0.0109, 0.0219, 0.0213, 0.0369, 0.0295, 0.0137, 0.0105, 0.0342, 0.0297, 0.0341, 0.0326, 0.0456];
    private static readonly double[] X = [0.38013, 0.93837, 0.72749, 0.59647, 0.46978, 1.01423, 0.87510, 0.47180, 0.85364, 0.37931, 0.92033, 0.71413, 0.66024, 0.84303, 0.50603, 0.72019, 0.60360, 0.29881, 0.64495, 0.55899, 0.68687, 0.59055, 0.65799, 0.41064, 0.59631, 0.67705, 0.57348, 0.58039, 0.27482, 0.70022];

    [Fact]
    public void Run_MatchesScipyMaximumLikelihood()
    {
        int n = C.Length;
        var st = new CalibrationStandards
        {
            Id = Enumerable.Range(0, n).Select(i => $"ref{i}").ToArray(),
            Colour0 = C, Index0 = X, Feh = F,
            VarColour = new double[n], CovIndexColour = new double[n], FehErr = new double[n],
            VarIndex = Sx.Select(s => s * s).ToArray(),
            Group = Enumerable.Repeat(-1, n).ToArray(), GroupName = [],
        };
        var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 0, degree: 2) with { Monotone = false, Outliers = false });
        Assert.Equal(n, r.Model.StandardsUsed);
        Assert.Equal(0.029030709670186863, r.SigmaIntMaximumLikelihood, 1e-4);
        Assert.Equal(0.031787351497382585, r.Model.SigmaInt, 1e-5);
        Assert.Equal(0.36092199009884846, r.Model.Evaluate(1.0, -2.0), 2e-5);
        Assert.Equal(0.6203985808779118, r.Model.Evaluate(1.2, -1.5), 2e-5);
        Assert.Equal(0.8835712301080595, r.Model.Evaluate(1.4, -1.0), 2e-5);
    }
}
