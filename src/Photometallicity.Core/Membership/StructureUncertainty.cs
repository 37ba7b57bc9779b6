using MathNet.Numerics.LinearAlgebra;

namespace Photometallicity.Membership;

/// <summary>
/// Errors of the structural parameters and of the target fraction from the observed information: the Hessian of
/// the full mixture log-likelihood ln L(x0, y0, ln r_h, k1, k2, f) = sum_i ln(f Sigma_i / Phi e^{T_i} + (1 - f) e^{F_i} / Area)
/// by central finite differences, with the non-spatial terms T_i, F_i held at their fitted values; the covariance is
/// the inverse of minus the Hessian (Efron &amp; Hinkley 1978, Biometrika 65, 457, observed information).
/// </summary>
internal static class StructureUncertainty
{
    public static Matrix<double>? Covariance(MixtureData d, MixtureParameters p, double[] otherT, double[] otherF, int threads)
    {
        var pr = p.Profile;
        var t0 = new[] { pr.X0, pr.Y0, Math.Log(pr.HalfLight), pr.K1, pr.K2, p.Fraction };
        double a = pr.HalfLight;
        double fstep = Math.Max(1e-3 * p.Fraction, 1e-7);
        fstep = Math.Min(fstep, 0.5 * Math.Min(p.Fraction, 1 - p.Fraction));
        var h = new[] { 0.01 * a, 0.01 * a, 0.01, 0.01, 0.01, fstep };
        int n = t0.Length;
        double lnArea = Math.Log(d.Footprint.Area);
        var pos = d.Positioned;

        double LogL(double[] t)
        {
            var ev = new SurfaceDensityProfile(pr.Kind, t[0], t[1], Math.Exp(t[2]), t[3], t[4]).CreateEvaluator();
            double lnPhi = Math.Log(d.Footprint.Integrate(ev));
            double lnF = Math.Log(t[5]), lnF1 = Math.Log(1 - t[5]);
            var s = ChunkedReduction.Sum(pos.Length, 1, threads, (lo, hi, acc) =>
            {
                double q = 0;
                for (int k = lo; k < hi; k++)
                {
                    int i = pos[k];
                    double la = lnF + Math.Log(ev.Density(d.X[i], d.Y[i])) - lnPhi + otherT[i];
                    double lb = lnF1 - lnArea + otherF[i];
                    double ll = MixtureEStep.LogSumExp(la, lb);
                    if (!double.IsNegativeInfinity(ll)) q += ll;
                }
                acc[0] = q;
            });
            return s[0];
        }

        double At(int i, double di, int j, double dj)
        {
            var t = (double[])t0.Clone();
            t[i] += di; if (j >= 0) t[j] += dj;
            return LogL(t);
        }

        var hess = Matrix<double>.Build.Dense(n, n);
        double f0 = LogL(t0);
        for (int i = 0; i < n; i++)
        {
            double fp = At(i, h[i], -1, 0), fm = At(i, -h[i], -1, 0);
            hess[i, i] = (fp - 2 * f0 + fm) / (h[i] * h[i]);
            for (int j = 0; j < i; j++)
            {
                double v = (At(i, h[i], j, h[j]) - At(i, h[i], j, -h[j]) - At(i, -h[i], j, h[j]) + At(i, -h[i], j, -h[j])) / (4 * h[i] * h[j]);
                hess[i, j] = v; hess[j, i] = v;
            }
        }
        var info = -hess;
        try
        {
            var chol = info.Cholesky();
            var cov = chol.Solve(Matrix<double>.Build.DenseIdentity(n));
            for (int i = 0; i < n; i++) if (!(cov[i, i] > 0) || !double.IsFinite(cov[i, i])) return null;
            return cov;
        }
        catch (ArgumentException)
        {
            return null;
        }
    }
}
