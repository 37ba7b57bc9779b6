namespace Photometallicity.Pipeline;

/// <summary>
/// Where narrow-band detection is complete. The narrow band is usually the shallow one, and at fixed broadband
/// magnitude a metal-rich giant is fainter in it, so a sample selected on narrow-band detection is biased
/// metal-poor near the limit. This measures the fraction of broadband sources with a narrow-band partner in
/// bins of broadband magnitude and finds the faintest magnitude down to which the fraction stays at or above
/// <see cref="Threshold"/> of its bright-end plateau (the plateau is the median fraction of the brightest third
/// of the bins). Common practice; the 90% threshold is a conventional choice, not a published value.
/// </summary>
public sealed record NarrowCompleteness(double CompleteToMag, double Plateau, double[] BinCentres, double[] MatchedFraction, int[] BinCounts)
{
    public const double Threshold = 0.9;
    public const double BinWidth = 0.25; // mag

    public static NarrowCompleteness Measure(double[] mag, bool[] hasNarrow, bool[]? consider = null)
    {
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        for (int i = 0; i < mag.Length; i++)
        {
            if (!double.IsFinite(mag[i]) || (consider is not null && !consider[i])) continue;
            lo = Math.Min(lo, mag[i]);
            hi = Math.Max(hi, mag[i]);
        }
        if (!double.IsFinite(lo)) return new NarrowCompleteness(double.NaN, double.NaN, [], [], []);
        int nb = Math.Max(1, (int)Math.Ceiling((hi - lo) / BinWidth + 1e-9));
        var n = new int[nb];
        var m = new int[nb];
        for (int i = 0; i < mag.Length; i++)
        {
            if (!double.IsFinite(mag[i]) || (consider is not null && !consider[i])) continue;
            int b = Math.Min(nb - 1, (int)((mag[i] - lo) / BinWidth));
            n[b]++;
            if (hasNarrow[i]) m[b]++;
        }
        var centres = new double[nb];
        var frac = new double[nb];
        for (int b = 0; b < nb; b++)
        {
            centres[b] = lo + (b + 0.5) * BinWidth;
            frac[b] = n[b] > 0 ? (double)m[b] / n[b] : double.NaN;
        }
        var bright = Enumerable.Range(0, Math.Max(1, nb / 3)).Where(b => n[b] >= 5).Select(b => frac[b]).Order().ToArray();
        double plateau = bright.Length > 0 ? bright[bright.Length / 2] : frac.Where(double.IsFinite).DefaultIfEmpty(double.NaN).Max();
        double complete = double.NaN;
        for (int b = 0; b < nb; b++)
        {
            if (n[b] < 5) continue;
            if (frac[b] >= Threshold * plateau) complete = lo + (b + 1) * BinWidth;
            else if (double.IsFinite(complete)) break;
        }
        return new NarrowCompleteness(complete, plateau, centres, frac, n);
    }
}
