using Photometallicity.Metallicity;

namespace Photometallicity.Membership;

/// <summary>
/// A Gaussian metallicity distribution N(F; mu, sigma) convolved with each star's own stored [Fe/H] likelihood:
/// Z_i = sum_m N(F_m; mu, sigma) L_i(F_m) h_i over the star's stored values (midpoint rule at the star's own spacing
/// h_i = stride x grid step, the exact use of the stored samples; see <see cref="FehLikelihoods"/>). The Gaussian is tabulated once per parameter value on the whole grid, so a
/// star costs one dot product over its window. The first and second moments of F under the star's posterior
/// q_ij proportional to N(F_j) L_ij give the EM update of (mu, sigma) with F as the latent true [Fe/H]
/// (Dempster, Laird &amp; Rubin 1977, JRSS B 39, 1): mu' = sum w E[F] / sum w, sigma'^2 = sum w E[(F - mu')^2] / sum w.
/// </summary>
internal sealed class GaussianOnGrid
{
    private readonly FehLikelihoods _l;
    private readonly double[] _g, _gF, _gF2;

    public GaussianOnGrid(FehLikelihoods likelihoods, double mean, double sigma)
    {
        _l = likelihoods;
        Mean = mean;
        Sigma = sigma;
        int m = likelihoods.GridCount;
        _g = new double[m]; _gF = new double[m]; _gF2 = new double[m];
        double inv = 1.0 / sigma, norm = likelihoods.GridStep / (Math.Sqrt(2 * Math.PI) * sigma);
        for (int j = 0; j < m; j++)
        {
            double f = likelihoods.GridValue(j);
            double z = (f - mean) * inv;
            double g = norm * Math.Exp(-0.5 * z * z);
            _g[j] = g; _gF[j] = g * f; _gF2[j] = g * f * f;
        }
    }

    public double Mean { get; }
    public double Sigma { get; }

    /// <summary>Z_i (dimensionless: the likelihood density integrated against the MDF).</summary>
    public double Convolve(int star)
    {
        var w = _l.Window(star);
        int s = _l.Start[star], k = _l.StrideOf(star);
        double z = 0;
        for (int m = 0, j = s; m < w.Length; m++, j += k) z += (double)w[m] * _g[j];
        return z * k;
    }

    /// <summary>Z_i together with the posterior moments E[F] and E[F^2].</summary>
    public double Convolve(int star, out double m1, out double m2)
    {
        var w = _l.Window(star);
        int s = _l.Start[star], k = _l.StrideOf(star);
        double z = 0, a = 0, b = 0;
        for (int m = 0, j = s; m < w.Length; m++, j += k)
        {
            double l = (double)w[m];
            z += l * _g[j]; a += l * _gF[j]; b += l * _gF2[j];
        }
        if (z > 0) { m1 = a / z; m2 = b / z; }
        else { m1 = m2 = 0; }
        return z * k;
    }
}
