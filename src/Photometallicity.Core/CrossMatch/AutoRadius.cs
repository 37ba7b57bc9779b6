using Photometallicity.Units;

namespace Photometallicity.CrossMatch;

/// <summary>The radius chosen from the separation distribution, with the fitted model and a sentence saying why.</summary>
public sealed record AutoRadiusChoice(Angle Radius, string Reason, double SigmaArcsec, double TrueCount, double ChanceSlope, bool Fitted);

/// <summary>
/// Chooses the match radius from the separations of all pairs out to a few radii (after the offset correction).
/// All pairs rather than nearest neighbours: the chance term of all pairs is exactly linear in r (2 pi rho r
/// per left source for any density), whereas the chance nearest-neighbour density turns over once pi rho r^2
/// nears 1, which in crowded fields happens inside the histogram.
/// Model of the histogram of r (counts per bin [r0, r1]):
///   true matches: 2-D Gaussian position errors give a Rayleigh distribution of r (Rayleigh 1880, Phil. Mag.
///   10, 73), N_t [exp(-r0^2 / 2 s^2) - exp(-r1^2 / 2 s^2)];
///   chance pairs: density linear in r, so B (r1^2 - r0^2).
/// For each s on a grid the counts N_t, B &gt;= 0 follow from weighted linear least squares (weights 1/max(n,1));
/// the s with the smallest chi-square wins. The radius is the smaller of
///   r_995 = s sqrt(2 ln 200), which holds 99.5% of the true matches, and
///   r_x, where the chance density 2 B r overtakes the true density N_t r / s^2 exp(-r^2 / 2 s^2),
///   r_x = s sqrt(2 ln(N_t / (2 B s^2))).
/// Why: beyond r_995 a larger radius adds under 0.5% of the true partners while chance partners keep growing
/// as r^2; beyond r_x every extra ring of radius brings more chance partners than true ones. 99.5% is this
/// program's choice (no published source).
/// </summary>
public static class AutoRadius
{
    public const int Bins = 80;
    private const int SigmaGrid = 240;
    private const int MinPairs = 30;
    private static readonly double Completeness995 = Math.Sqrt(2.0 * Math.Log(200.0));

    /// <param name="counts">Pair counts in equal separation bins starting at 0.</param>
    /// <param name="widthArcsec">Bin width.</param>
    /// <param name="fallback">The radius kept when the fit is impossible.</param>
    public static AutoRadiusChoice Choose(double[] counts, double widthArcsec, Angle fallback)
    {
        double width = widthArcsec;
        double maxArcsec = width * counts.Length;
        double n = counts.Sum();
        if (n < MinPairs)
            return new AutoRadiusChoice(fallback, $"auto: only {n:0} pairs within {maxArcsec:0.##} arcsec, too few to fit the separation distribution (at least {MinPairs}); kept {fallback.Arcseconds:0.###} arcsec", double.NaN, n, double.NaN, false);

        double bestChi = double.PositiveInfinity, bestS = double.NaN, bestT = 0, bestB = 0;
        double sMin = width / 4, sMax = maxArcsec / 2;
        for (int g = 0; g < SigmaGrid; g++)
        {
            double s = sMin * Math.Pow(sMax / sMin, g / (double)(SigmaGrid - 1));
            var (t, b, chi) = FitAmplitudes(counts, width, s);
            if (chi < bestChi)
            {
                bestChi = chi;
                bestS = s;
                bestT = t;
                bestB = b;
            }
        }
        if (!(bestT > 0))
            return new AutoRadiusChoice(fallback, $"auto: the pair separations within {maxArcsec:0.##} arcsec show no true-match core above the chance term; kept {fallback.Arcseconds:0.###} arcsec", bestS, bestT, bestB, false);

        double r995 = bestS * Completeness995;
        double ratio = bestB > 0 ? bestT / (2 * bestB * bestS * bestS) : double.PositiveInfinity;
        double rx = ratio > 1 ? bestS * Math.Sqrt(2 * Math.Log(ratio)) : 0.0;
        string core = $"Rayleigh sigma {bestS:0.###} arcsec, about {bestT:0} true pairs, fitted to the separations of {n:0} pairs below {maxArcsec:0.##} arcsec";
        if (rx < r995)
        {
            double r = Math.Max(rx, width);
            return new AutoRadiusChoice(Angle.FromArcseconds(r),
                $"auto: {r:0.###} arcsec is where chance matches start to outnumber true ones ({core}); 99.5% completeness would need {r995:0.###} arcsec",
                bestS, bestT, bestB, true);
        }
        string cross = double.IsPositiveInfinity(ratio) ? "no chance term was detected" : $"chance matches outnumber true ones only beyond {rx:0.###} arcsec";
        return new AutoRadiusChoice(Angle.FromArcseconds(r995),
            $"auto: {r995:0.###} arcsec holds 99.5% of the true matches ({core}); {cross}",
            bestS, bestT, bestB, true);
    }

    /// <summary>Weighted least squares for the non-negative amplitudes at a fixed sigma; returns chi-square.</summary>
    private static (double T, double B, double Chi) FitAmplitudes(double[] counts, double width, double s)
    {
        // Design: f_t(bin) = exp(-r0^2/2s^2) - exp(-r1^2/2s^2), f_b(bin) = r1^2 - r0^2.
        double stt = 0, stb = 0, sbb = 0, sty = 0, sby = 0;
        var ft = new double[counts.Length];
        var fb = new double[counts.Length];
        for (int i = 0; i < counts.Length; i++)
        {
            double r0 = i * width, r1 = (i + 1) * width;
            ft[i] = Math.Exp(-r0 * r0 / (2 * s * s)) - Math.Exp(-r1 * r1 / (2 * s * s));
            fb[i] = r1 * r1 - r0 * r0;
            double w = 1.0 / Math.Max(counts[i], 1.0);
            stt += w * ft[i] * ft[i];
            stb += w * ft[i] * fb[i];
            sbb += w * fb[i] * fb[i];
            sty += w * ft[i] * counts[i];
            sby += w * fb[i] * counts[i];
        }
        double det = stt * sbb - stb * stb;
        double t = det > 0 ? (sty * sbb - sby * stb) / det : 0;
        double b = det > 0 ? (sby * stt - sty * stb) / det : 0;
        if (t < 0 || b < 0)
        {
            // One amplitude at its bound: refit the other alone and keep the better of the two.
            double tOnly = stt > 0 ? Math.Max(0, sty / stt) : 0, bOnly = sbb > 0 ? Math.Max(0, sby / sbb) : 0;
            double c1 = Chi(counts, ft, fb, tOnly, 0), c2 = Chi(counts, ft, fb, 0, bOnly);
            return c1 <= c2 ? (tOnly, 0, c1) : (0, bOnly, c2);
        }
        return (t, b, Chi(counts, ft, fb, t, b));
    }

    private static double Chi(double[] counts, double[] ft, double[] fb, double t, double b)
    {
        double chi = 0;
        for (int i = 0; i < counts.Length; i++)
        {
            double d = counts[i] - t * ft[i] - b * fb[i];
            chi += d * d / Math.Max(counts[i], 1.0);
        }
        return chi;
    }
}
