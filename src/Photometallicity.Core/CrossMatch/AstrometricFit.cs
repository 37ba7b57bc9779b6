using System.Runtime.CompilerServices;
namespace Photometallicity.CrossMatch;

/// <summary>The outcome of fitting an <see cref="AstrometricTransform"/> to matched pairs.</summary>
public sealed record AstrometricFitResult(
    AstrometricTransform Transform,
    double ErrorXiRad,
    double ErrorEtaRad,
    double ScatterXiRad,
    double ScatterEtaRad,
    int Used,
    int Clipped);

/// <summary>
/// Fits the tangent-plane transform from left to right coordinates of pairs by linear least squares with
/// iterative 3-sigma clipping. The offset alone is the mean of (right - left). With rotation and scale, the
/// similarity xi' = a xi - b eta + dXi, eta' = b xi + a eta + dEta is linear in (a, b, dXi, dEta) and has the
/// closed-form least-squares solution about the centroids (u, v left and u', v' right, centred):
/// a = sum(u u' + v v') / sum(u^2 + v^2), b = sum(u v' - v u') / sum(u^2 + v^2)
/// (the 2-D case of Umeyama 1991, IEEE TPAMI 13, 376, without the orthogonality constraint; common practice).
/// Clipping: the first round uses a robust scatter (1.4826 x median absolute deviation, about the median;
/// Rousseeuw &amp; Croux 1993, JASA 88, 1273, for the constant), later rounds the standard deviation of the kept
/// pairs; a pair is kept when both residual components lie within 3 sigma (3 sigma: common practice).
/// Errors of the offset: the scatter of the kept residuals / sqrt(N).
/// </summary>
public static class AstrometricFit
{
    private const double ClipSigma = 3.0;
    private const int MaxClipRounds = 10;
    private const int MadSample = 20_000;
    // Floor on the clipping scatter (1e-11 rad = 2 micro-arcsec) so that noise-free data are not clipped away.
    private const double SigmaFloorRad = 1e-11;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static AstrometricFitResult Fit(double[] lXi, double[] lEta, double[] rXi, double[] rEta, bool rotationScale)
    {
        int n = lXi.Length;
        var keep = new bool[n];
        Array.Fill(keep, true);
        var t = Solve(lXi, lEta, rXi, rEta, keep, rotationScale);
        var resXi = new double[n];
        var resEta = new double[n];
        int used = n;
        for (int round = 0; round < MaxClipRounds; round++)
        {
            Residuals(t, lXi, lEta, rXi, rEta, resXi, resEta);
            double cXi, cEta, sXi, sEta;
            if (round == 0)
            {
                (cXi, sXi) = MedianAndMad(resXi);
                (cEta, sEta) = MedianAndMad(resEta);
            }
            else
            {
                cXi = cEta = 0.0;
                (sXi, sEta) = Scatter(resXi, resEta, keep);
            }
            sXi = Math.Max(sXi, SigmaFloorRad);
            sEta = Math.Max(sEta, SigmaFloorRad);
            int changed = 0, count = 0;
            for (int i = 0; i < n; i++)
            {
                bool k = Math.Abs(resXi[i] - cXi) <= ClipSigma * sXi && Math.Abs(resEta[i] - cEta) <= ClipSigma * sEta;
                if (k != keep[i]) changed++;
                keep[i] = k;
                if (k) count++;
            }
            if (count < (rotationScale ? 3 : 1)) break;
            used = count;
            t = Solve(lXi, lEta, rXi, rEta, keep, rotationScale);
            if (changed == 0) break;
        }
        Residuals(t, lXi, lEta, rXi, rEta, resXi, resEta);
        var (scXi, scEta) = Scatter(resXi, resEta, keep);
        double sqrtN = Math.Sqrt(Math.Max(1, used));
        return new AstrometricFitResult(t, scXi / sqrtN, scEta / sqrtN, scXi, scEta, used, n - used);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static AstrometricTransform Solve(double[] lXi, double[] lEta, double[] rXi, double[] rEta, bool[] keep, bool rotationScale)
    {
        double mlx = 0, mly = 0, mrx = 0, mry = 0;
        int n = 0;
        for (int i = 0; i < keep.Length; i++)
        {
            if (!keep[i]) continue;
            mlx += lXi[i];
            mly += lEta[i];
            mrx += rXi[i];
            mry += rEta[i];
            n++;
        }
        if (n == 0) return AstrometricTransform.Identity;
        mlx /= n;
        mly /= n;
        mrx /= n;
        mry /= n;
        if (!rotationScale) return new AstrometricTransform(1.0, 0.0, mrx - mlx, mry - mly);
        double suu = 0, sa = 0, sb = 0;
        for (int i = 0; i < keep.Length; i++)
        {
            if (!keep[i]) continue;
            double u = lXi[i] - mlx, v = lEta[i] - mly, up = rXi[i] - mrx, vp = rEta[i] - mry;
            suu += u * u + v * v;
            sa += u * up + v * vp;
            sb += u * vp - v * up;
        }
        if (!(suu > 0)) return new AstrometricTransform(1.0, 0.0, mrx - mlx, mry - mly);
        double a = sa / suu, b = sb / suu;
        return new AstrometricTransform(a, b, mrx - (a * mlx - b * mly), mry - (b * mlx + a * mly));
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Residuals(AstrometricTransform t, double[] lXi, double[] lEta, double[] rXi, double[] rEta, double[] resXi, double[] resEta)
    {
        for (int i = 0; i < lXi.Length; i++)
        {
            var (px, py) = t.Forward(lXi[i], lEta[i]);
            resXi[i] = rXi[i] - px;
            resEta[i] = rEta[i] - py;
        }
    }

    private static (double Xi, double Eta) Scatter(double[] resXi, double[] resEta, bool[] keep)
    {
        double sx = 0, sy = 0;
        int n = 0;
        for (int i = 0; i < keep.Length; i++)
        {
            if (!keep[i]) continue;
            sx += resXi[i] * resXi[i];
            sy += resEta[i] * resEta[i];
            n++;
        }
        return n < 2 ? (0.0, 0.0) : (Math.Sqrt(sx / (n - 1)), Math.Sqrt(sy / (n - 1)));
    }

    /// <summary>Median and 1.4826 x MAD of a deterministic stride subsample (at most 20 000 values).</summary>
    private static (double Median, double Sigma) MedianAndMad(double[] values)
    {
        int stride = Math.Max(1, values.Length / MadSample);
        var s = new List<double>(values.Length / stride + 1);
        for (int i = 0; i < values.Length; i += stride) s.Add(values[i]);
        var a = s.ToArray();
        double med = Median(a);
        for (int i = 0; i < a.Length; i++) a[i] = Math.Abs(a[i] - med);
        return (med, 1.4826 * Median(a));
    }

    private static double Median(double[] a)
    {
        if (a.Length == 0) return 0.0;
        Array.Sort(a);
        int m = a.Length / 2;
        return a.Length % 2 == 1 ? a[m] : 0.5 * (a[m - 1] + a[m]);
    }
}
