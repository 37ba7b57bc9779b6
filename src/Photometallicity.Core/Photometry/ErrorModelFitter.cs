using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;
using Photometallicity.Errors;

namespace Photometallicity.Photometry;

/// <summary>
/// Fits <see cref="PhotometricErrorModel"/> to a catalogue's (magnitude, error) pairs. The model
/// err^2 = (1.0857 / SNR(m))^2 + floor^2 with SNR = 5 * 10^(-0.4 (m - D)) is linear in two parameters:
/// <code>
///   err^2 = A u + F,   u = 10^(0.8 (m - m_ref)),   A = (1.0857 / 5)^2 10^(-0.8 (D - m_ref)),   F = floor^2
/// </code>
/// Robust fit (common practice): stars with finite magnitude and positive finite error are sorted by magnitude
/// and grouped in bins of equal count; each bin gives its median magnitude and median error, so outliers
/// (blends, cosmic rays) do not pull the fit. (A, F) then minimise sum ((e_j^2 - A u_j - F) / e_j^2)^2 over
/// bins (relative residuals, since err^2 spans decades); if F comes out negative the fit is repeated with F = 0.
/// One pass then drops bins whose relative residual exceeds 5 robust sigma (1.4826 MAD) and refits.
/// </summary>
public static class ErrorModelFitter
{
    /// <summary>Fewest usable stars the fit accepts.</summary>
    public const int MinStars = 10;

    private const double StarsPerBin = 25;
    private const int MaxBins = 40, MinBins = 3;

    public static PhotometricErrorModel Fit(string band, double[] mag, double[] err, ILogger? logger = null)
    {
        logger ??= NullLogger.Instance;
        Guard.SameLength(mag.Length, err.Length, nameof(mag), nameof(err));
        var order = Enumerable.Range(0, mag.Length)
            .Where(i => double.IsFinite(mag[i]) && double.IsFinite(err[i]) && err[i] > 0)
            .OrderBy(i => mag[i]).ThenBy(i => i).ToArray();
        int n = order.Length;
        if (n < MinStars)
            throw new MethodException($"error model of band '{band}': {n} stars with a finite magnitude and a positive error, at least {MinStars} needed (of {mag.Length} rows)");

        int bins = Math.Clamp((int)(n / StarsPerBin), MinBins, MaxBins);
        var bm = new double[bins];
        var be = new double[bins];
        for (int j = 0; j < bins; j++)
        {
            int from = (int)((long)j * n / bins), to = (int)((long)(j + 1) * n / bins);
            bm[j] = Median(order[from..to].Select(i => mag[i]).ToArray());
            be[j] = Median(order[from..to].Select(i => err[i]).ToArray());
        }
        if (bm[^1] - bm[0] < 0.1)
            throw new MethodException($"error model of band '{band}': the {n} usable stars span only {bm[^1] - bm[0]:F3} mag in binned magnitude; a fit needs a range");

        double mRef = bm[^1];
        var keep = Enumerable.Repeat(true, bins).ToArray();
        var (a, f) = Solve(bm, be, keep, mRef);
        var resid = new double[bins];
        for (int j = 0; j < bins; j++) resid[j] = (be[j] * be[j] - a * U(bm[j], mRef) - f) / (be[j] * be[j]);
        double mad = 1.4826 * Median(resid.Select(x => Math.Abs(x - Median(resid))).ToArray());
        int dropped = 0;
        if (mad > 0)
        {
            double med = Median(resid);
            for (int j = 0; j < bins; j++)
                if (Math.Abs(resid[j] - med) > 5 * mad) { keep[j] = false; dropped++; }
            if (dropped > 0 && bins - dropped >= 2) (a, f) = Solve(bm, be, keep, mRef);
        }
        if (!(a > 0))
            throw new MethodException($"error model of band '{band}': errors do not grow with magnitude (fitted noise amplitude {a:G3}); cannot fit a depth");

        double c = PhotometricErrorModel.MagPerFractionalFlux / 5.0;
        double depth = mRef - 1.25 * Math.Log10(a / (c * c));
        var model = new PhotometricErrorModel(band, depth, Math.Sqrt(Math.Max(f, 0)));
        logger.LogInformation("error model {Band}: 5-sigma depth {Depth:F3} mag, floor {Floor:F4} mag, from {Stars} stars in {Bins} bins ({Dropped} bins rejected)",
            band, model.Depth5Sigma, model.Floor, n, bins, dropped);
        return model;
    }

    private static double U(double m, double mRef) => Math.Pow(10.0, 0.8 * (m - mRef));

    /// <summary>Weighted linear least squares for (A, F) with weights 1/e^4; F clamped to 0 by refitting A alone.</summary>
    private static (double A, double F) Solve(double[] m, double[] e, bool[] keep, double mRef)
    {
        double suu = 0, su = 0, s1 = 0, suy = 0, sy = 0;
        for (int j = 0; j < m.Length; j++)
        {
            if (!keep[j]) continue;
            double y = e[j] * e[j], w = 1.0 / (y * y), u = U(m[j], mRef);
            suu += w * u * u; su += w * u; s1 += w; suy += w * u * y; sy += w * y;
        }
        double det = suu * s1 - su * su;
        double a = (suy * s1 - su * sy) / det;
        double f = (suu * sy - su * suy) / det;
        if (double.IsFinite(a) && double.IsFinite(f) && f >= 0) return (a, f);
        return (suy / suu, 0.0);
    }

    private static double Median(double[] v)
    {
        var s = (double[])v.Clone();
        Array.Sort(s);
        int h = s.Length / 2;
        return s.Length % 2 == 1 ? s[h] : 0.5 * (s[h - 1] + s[h]);
    }
}
