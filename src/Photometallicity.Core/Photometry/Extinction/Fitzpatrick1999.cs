namespace Photometallicity.Photometry.Extinction;

/// <summary>
/// Fitzpatrick (1999, PASP 111, 63; "F99"), R_V-dependent. Works in k(lambda - V) = E(lambda - V)/E(B-V), so
/// that A(lambda)/E(B-V) = k + R_V.
/// <list type="bullet">
/// <item>Ultraviolet, lambda &lt;= 2700 Angstrom: the Fitzpatrick &amp; Massa (1990, ApJS 72, 163) form
/// k = c1 + c2 x + c3 D(x; x0, gamma) + c4 F(x), D = x^2 / ((x^2 - x0^2)^2 + x^2 gamma^2),
/// F = 0.5392 (x - 5.9)^2 + 0.05644 (x - 5.9)^3 for x &gt;= 5.9 per micron, else 0 (FM90), with the F99
/// R_V dependence c2 = -0.824 + 4.717/R_V, c1 = 2.030 - 3.007 c2, and x0 = 4.596, gamma = 0.99, c3 = 3.23,
/// c4 = 0.41 (F99's R_V-dependent UV curve; where in the paper each constant is printed is recalled from memory, the values are cross-checked against python3-extinction in the tests).</item>
/// <item>Optical and IR, lambda &gt; 2700 Angstrom: a natural cubic spline in x through A(lambda)/E(B-V) anchors:
/// 0 at x = 0; 0.265 R_V/3.1 and 0.829 R_V/3.1 at 26500 and 12200 Angstrom (F99 Table 3, scaled by R_V/3.1 as
/// F99 prescribes); -0.426 + 1.0044 R_V, -0.050 + 1.0016 R_V, 0.701 + 1.0016 R_V and
/// 1.208 + 1.0032 R_V - 0.00033 R_V^2 at 6000, 5470, 4670 and 4110 Angstrom (F99 Table 4; the printed sign of
/// the 1.208 term is taken positive, the only sign that gives a smooth curve); the UV formula at 2700 and
/// 2600 Angstrom.</item>
/// </list>
/// <para><b>Normalisation.</b> F99 defines E(B-V) and R_V = A(V)/E(B-V) through Johnson B and V band photometry,
/// not monochromatic values; the curve is published as A(lambda)/E(B-V). We keep that: A_V here is R_V E(B-V)
/// with E(B-V) as F99 defines it, and AOverAV = (k + R_V)/R_V. The monochromatic value at 5495 Angstrom is then
/// 0.979 for R_V = 3.1, not 1. This is the convention of the published anchors and of Barbary's python
/// package 'extinction' (function fitzpatrick99), so band coefficients A_band/E(B-V) = R_V * (band average of
/// AOverAV) are F99's own A/E(B-V). The IDL routine FM_UNRED (and 'extinction') use slightly updated optical
/// anchors from E. Fitzpatrick; they differ from Table 4 by &lt; 0.3% in A/E(B-V).</para>
/// </summary>
public sealed class Fitzpatrick1999 : IExtinctionLaw
{
    private static readonly double[] AnchorWavelengths = [26500.0, 12200.0, 6000.0, 5470.0, 4670.0, 4110.0, 2700.0, 2600.0];
    private const double UvCutAngstrom = 2700.0;

    private readonly object _gate = new();
    private double _cachedRv = double.NaN;
    private NaturalCubicSpline? _cachedSpline;

    public string Name => "fitzpatrick99";

    /// <summary>0.1 micron: the short end of the range the IDL routine FM_UNRED (W. Landsman, IDL Astronomy User's Library) documents for F99.</summary>
    public double MinWavelengthAngstrom => 1000.0;

    /// <summary>3.5 micron: the long end of the range FM_UNRED documents; the last IR anchor is at 2.65 micron and the spline then runs to A = 0 at x = 0.</summary>
    public double MaxWavelengthAngstrom => 35000.0;

    public double AOverAV(double wavelengthAngstrom, double rv)
    {
        if (!(wavelengthAngstrom >= MinWavelengthAngstrom * (1 - 1e-12) && wavelengthAngstrom <= MaxWavelengthAngstrom * (1 + 1e-12)))
            throw new ArgumentOutOfRangeException(nameof(wavelengthAngstrom), wavelengthAngstrom,
                $"{Name} is defined for {MinWavelengthAngstrom:F0}-{MaxWavelengthAngstrom:F0} Angstrom, not {wavelengthAngstrom} Angstrom.");
        return AOverEbv(wavelengthAngstrom, rv) / rv;
    }

    /// <summary>A(lambda)/E(B-V) as published (F99 Tables 3-4 and the FM90 UV form).</summary>
    public double AOverEbv(double wavelengthAngstrom, double rv)
    {
        double x = 1.0e4 / wavelengthAngstrom;
        if (wavelengthAngstrom <= UvCutAngstrom) return UltravioletK(x, rv) + rv;
        return SplineFor(rv).Evaluate(x);
    }

    /// <summary>k(lambda - V) from the FM90 form with the F99 constants.</summary>
    internal static double UltravioletK(double x, double rv)
    {
        const double x0 = 4.596, gamma = 0.99, c3 = 3.23, c4 = 0.41;
        double c2 = -0.824 + 4.717 / rv;
        double c1 = 2.030 - 3.007 * c2;
        double x2 = x * x;
        double drude = x2 / ((x2 - x0 * x0) * (x2 - x0 * x0) + x2 * gamma * gamma);
        double k = c1 + c2 * x + c3 * drude;
        if (x >= 5.9)
        {
            double y = x - 5.9;
            k += c4 * (0.5392 * y * y + 0.05644 * y * y * y);
        }
        return k;
    }

    /// <summary>The anchors' A/E(B-V) values (x increasing), first entry x = 0.</summary>
    internal static (double[] X, double[] Y) Anchors(double rv)
    {
        var x = new double[AnchorWavelengths.Length + 1];
        var y = new double[x.Length];
        for (int i = 0; i < AnchorWavelengths.Length; i++) x[i + 1] = 1.0e4 / AnchorWavelengths[i];
        y[0] = 0.0;
        y[1] = 0.265 * rv / 3.1;
        y[2] = 0.829 * rv / 3.1;
        y[3] = -0.426 + 1.0044 * rv;
        y[4] = -0.050 + 1.0016 * rv;
        y[5] = 0.701 + 1.0016 * rv;
        y[6] = 1.208 + 1.0032 * rv - 0.00033 * rv * rv;
        y[7] = UltravioletK(x[7], rv) + rv;
        y[8] = UltravioletK(x[8], rv) + rv;
        return (x, y);
    }

    private NaturalCubicSpline SplineFor(double rv)
    {
        lock (_gate)
        {
            if (_cachedSpline is null || _cachedRv != rv)
            {
                var (x, y) = Anchors(rv);
                _cachedSpline = new NaturalCubicSpline(x, y);
                _cachedRv = rv;
            }
            return _cachedSpline;
        }
    }
}
