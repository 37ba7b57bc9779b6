namespace Photometallicity.Photometry.Extinction;

/// <summary>
/// The extinction of a band in the low-extinction limit, from its transmission curve S(lambda), an extinction
/// law r(lambda) = A(lambda)/A_V and a source spectrum F_lambda:
/// <code>
///   A_band/E(B-V) = R_V * Int S l r f dl / Int S l f dl        (photon-counting detector: weights S l F_lambda)
///   lambda_eff    =       Int S l f l dl / Int S l f dl        (photon-weighted mean wavelength)
/// </code>
/// The first is the derivative of the band magnitude with respect to E(B-V) as E(B-V) tends to 0, for a
/// photon-counting detector (common practice). The effective wavelength here is the photon-weighted mean wavelength, one of the definitions in
/// Tokunaga &amp; Vacca (2005, PASP 117, 421; recalled from memory); it equals the extinction-weighted wavelength
/// only for a linear law. f is flat in F_lambda by default, or a Planck black body at the given temperature.
/// Integrals by the trapezoid rule on the curve's own grid.
/// </summary>
public static class BandExtinction
{
    /// <summary>Second radiation constant h c / k = 1.438776877e-2 m K (CODATA 2018), in Angstrom K.</summary>
    public const double SecondRadiationConstantAngstromK = 1.438776877e8;

    /// <summary>
    /// A config recipe in one call: loads the curve file, looks the law up by name, computes. InputException on a bad
    /// file, an unknown law or a value out of range.
    /// </summary>
    public static BandExtinctionResult FromFile(string curvePath, string lawName = ExtinctionLaws.DefaultName, double rv = 3.1, double? teffK = null) =>
        Compute(FilterCurve.Load(curvePath), ExtinctionLaws.FromName(lawName, curvePath), rv, teffK, curvePath);

    /// <summary>Band coefficients of <paramref name="curve"/> under <paramref name="law"/> with R_V = <paramref name="rv"/>.</summary>
    /// <param name="curve">The filter transmission curve.</param>
    /// <param name="law">The extinction law.</param>
    /// <param name="rv">R_V = A_V / E(B-V).</param>
    /// <param name="teffK">Black-body temperature of the source (K); null for a flat F_lambda spectrum.</param>
    /// <param name="file">The curve's file, for messages.</param>
    public static BandExtinctionResult Compute(FilterCurve curve, IExtinctionLaw law, double rv, double? teffK = null, string? file = null)
    {
        ExtinctionLaws.CheckRv(rv, "--rv");
        if (teffK is double t && !(t >= 500 && t <= 1.0e6))
            throw new Errors.InputException($"--teff: {t} K is outside 500-1000000 K");
        double[] wl = curve.Wavelengths, s = curve.Throughput;
        int n = wl.Length;
        ExtinctionLaws.CheckDomain(law, wl[0], wl[n - 1], file ?? $"filter curve '{curve.Name}'");

        var logSource = new double[n];
        double maxLog = double.NegativeInfinity;
        for (int i = 0; i < n; i++)
        {
            logSource[i] = LogSource(wl[i], teffK);
            maxLog = Math.Max(maxLog, logSource[i]);
        }
        var weight = new double[n];
        var ratio = new double[n];
        for (int i = 0; i < n; i++)
        {
            weight[i] = s[i] * wl[i] * Math.Exp(logSource[i] - maxLog); // scaled to avoid under- and overflow
            ratio[i] = law.AOverAV(wl[i], rv);
        }
        double norm = 0, ext = 0, lam = 0;
        for (int i = 1; i < n; i++)
        {
            double h = 0.5 * (wl[i] - wl[i - 1]);
            norm += h * (weight[i] + weight[i - 1]);
            ext += h * (weight[i] * ratio[i] + weight[i - 1] * ratio[i - 1]);
            lam += h * (weight[i] * wl[i] + weight[i - 1] * wl[i - 1]);
        }
        if (!(norm > 0))
            throw new Errors.InputException("the band's weighted throughput integrates to zero (transmission zero or source flux underflows)", file ?? curve.Name);
        double aOverAv = ext / norm;
        return new BandExtinctionResult(rv * aOverAv, aOverAv, lam / norm);
    }

    /// <summary>ln F_lambda of the source, up to a constant: 0, or ln of Planck's B_lambda ~ lambda^-5 / (exp(c2 / (lambda T)) - 1).</summary>
    internal static double LogSource(double wavelengthAngstrom, double? teffK)
    {
        if (teffK is not double t) return 0.0;
        double z = SecondRadiationConstantAngstromK / (wavelengthAngstrom * t);
        // ln(exp(z) - 1) = z + ln(1 - exp(-z)); for small z, ln(z (1 + z/2)) keeps precision.
        double lnDenominator = z < 1e-6 ? Math.Log(z * (1 + 0.5 * z)) : z + Math.Log(1.0 - Math.Exp(-z));
        return -5.0 * Math.Log(wavelengthAngstrom) - lnDenominator;
    }
}

/// <summary>
/// A band's extinction coefficients: A_band/E(B-V), A_band/A_V (the law's A_V convention), and the
/// photon-weighted effective wavelength (Angstrom) of the band for the chosen source spectrum.
/// </summary>
public sealed record BandExtinctionResult(double AOverEbv, double AOverAv, double LambdaEffAngstrom);
