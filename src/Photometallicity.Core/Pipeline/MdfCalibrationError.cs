using Photometallicity.Calibration;
using Photometallicity.Metallicity;

namespace Photometallicity.Pipeline;

/// <summary>
/// The calibration's share of the error of the members' mean [Fe/H]. Each star's posterior marginalises over the
/// bootstrap ensemble, but the calibration error is common to all stars, so it does not average down with their number
/// as the statistical error does. For each ensemble member m and each star i (with an [Fe/H], weighted by p_member) the
/// shift dF = (f_best - f_m) / (df_m/dF) at the star's colour and median [Fe/H] is the change of [Fe/H] that member would
/// make (first order, common practice; the member includes its draw of the model-form error beyond the standards). Stars are
/// weighted as a likelihood fit of the distribution weights them, by p_member / (s_i^2 + 0.3^2) with s_i half the star's 16-84%
/// interval and 0.3 dex a typical spread of a dwarf galaxy's distribution (a project choice; it only sets how much broad,
/// weakly constraining stars count), and a shift is capped at the star's own interval (a star whose [Fe/H] a member cannot
/// pin down has a broad posterior and moves the fit little). The standard deviation over the ensemble of the weighted mean
/// shift is the calibration error of the mean. Uses at most <see cref="MaxStars"/> stars, taken at even steps (deterministic).
/// </summary>
public static class MdfCalibrationError
{
    public const int MaxStars = 4000;

    public static double Of(CalibrationModel model, double[] colour0, MetallicityResult feh, double[] pMember) =>
        OfMeanAndSpread(model, colour0, feh, pMember).Mean;

    /// <summary>
    /// The calibration's common error of the members' mean and of their spread (dex). For the spread, each member m moves every
    /// star by its own shift dF_i,m; the change of the weighted standard deviation of the stars' [Fe/H] under member m is that
    /// member's change of the spread (first order: the intrinsic spread moves with the observed one); the standard deviation of
    /// the changes over the ensemble is the spread's calibration error.
    /// </summary>
    public static (double Mean, double Spread) OfMeanAndSpread(CalibrationModel model, double[] colour0, MetallicityResult feh, double[] pMember)
    {
        var rows = Enumerable.Range(0, colour0.Length)
            .Where(i => double.IsFinite(feh.Feh[i]) && double.IsFinite(pMember[i]) && pMember[i] > 0 && double.IsFinite(colour0[i])).ToArray();
        var ens = model.EnsembleCoefficients;
        if (rows.Length == 0 || ens.Length < 2) return (double.NaN, double.NaN);
        int step = Math.Max(1, rows.Length / MaxStars);
        var pick = rows.Where((_, k) => k % step == 0).ToArray();
        var basis = model.Basis;
        var shifts = new double[ens.Length];
        var spreads = new double[ens.Length];
        double baseSpread = WeightedSpread(pick, i => feh.Feh[i], i => Weight(feh, pMember, i));
        for (int m = 0; m < ens.Length; m++)
        {
            double sw = 0, s = 0, s1 = 0, s2 = 0;
            foreach (int i in pick)
            {
                double c = colour0[i], f = feh.Feh[i], half = 0.5 * (feh.FehHi[i] - feh.FehLo[i]);
                if (!(half > 0)) continue;
                double w = pMember[i] / (half * half + 0.09);
                // The member with its draw of the model-form error beyond the standards (none inside them).
                var sl = model.MemberSlice(m, c);
                double slope = (sl.At(f + 0.01).Value - sl.At(f - 0.01).Value) / 0.02;
                if (!(Math.Abs(slope) > 1e-6)) continue;
                double df = Math.Clamp((basis.Value(model.Coefficients, c, f) - sl.At(f).Value) / slope, -2 * half, 2 * half);
                s += w * df;
                sw += w;
                s1 += w * (f + df);
                s2 += w * (f + df) * (f + df);
            }
            shifts[m] = sw > 0 ? s / sw : double.NaN;
            spreads[m] = sw > 0 ? Math.Sqrt(Math.Max(0, s2 / sw - (s1 / sw) * (s1 / sw))) - baseSpread : double.NaN;
        }
        return (Sd(shifts), Sd(spreads));
    }

    private static double Weight(MetallicityResult feh, double[] pMember, int i)
    {
        double half = 0.5 * (feh.FehHi[i] - feh.FehLo[i]);
        return half > 0 ? pMember[i] / (half * half + 0.09) : 0;
    }

    private static double WeightedSpread(int[] rows, Func<int, double> value, Func<int, double> weight)
    {
        double sw = 0, s1 = 0, s2 = 0;
        foreach (int i in rows) { double w = weight(i), v = value(i); if (!(w > 0)) continue; sw += w; s1 += w * v; s2 += w * v * v; }
        return sw > 0 ? Math.Sqrt(Math.Max(0, s2 / sw - (s1 / sw) * (s1 / sw))) : double.NaN;
    }

    private static double Sd(double[] values)
    {
        var ok = values.Where(double.IsFinite).ToArray();
        if (ok.Length < 2) return double.NaN;
        double mean = ok.Average();
        return Math.Sqrt(ok.Sum(x => (x - mean) * (x - mean)) / (ok.Length - 1));
    }
}
