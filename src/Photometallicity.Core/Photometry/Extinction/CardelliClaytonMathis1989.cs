namespace Photometallicity.Photometry.Extinction;

/// <summary>
/// Cardelli, Clayton &amp; Mathis (1989, ApJ 345, 245; "CCM89"): &lt;A(lambda)/A_V&gt; = a(x) + b(x)/R_V with
/// x = 1/lambda in inverse microns. Infrared 0.3 &lt;= x &lt; 1.1 (eq. 2), optical/near-IR 1.1 &lt;= x &lt; 3.3
/// (eq. 3), ultraviolet 3.3 &lt;= x &lt; 8 (eq. 4), far-UV 8 &lt;= x &lt;= 10 (eq. 5). A_V is monochromatic at
/// x = 1.82 per micron (5494.5 Angstrom), where eq. 3 gives a = 1, b = 0 exactly.
/// </summary>
public sealed class CardelliClaytonMathis1989 : IExtinctionLaw
{
    public string Name => "ccm89";

    /// <summary>x = 10 per micron (CCM89, eq. 5 upper limit).</summary>
    public double MinWavelengthAngstrom => 1000.0;

    /// <summary>x = 0.3 per micron (CCM89, eq. 2 lower limit).</summary>
    public double MaxWavelengthAngstrom => 1.0e4 / 0.3;

    public double AOverAV(double wavelengthAngstrom, double rv) => CcmForm.AOverAV(wavelengthAngstrom, rv, this, Optical);

    /// <summary>CCM89 eq. 3a/3b, y = x - 1.82 (Horner form).</summary>
    internal static void Optical(double x, out double a, out double b)
    {
        double y = x - 1.82;
        a = 1.0 + y * (0.17699 + y * (-0.50447 + y * (-0.02427 + y * (0.72085 + y * (0.01979 + y * (-0.77530 + y * 0.32999))))));
        b = y * (1.41338 + y * (2.28305 + y * (1.07233 + y * (-5.38434 + y * (-0.62251 + y * (5.30260 + y * -2.09002))))));
    }
}

/// <summary>The parts of the CCM89 form shared with O'Donnell (1994), which revised only the optical range.</summary>
internal static class CcmForm
{
    /// <summary>a(x) and b(x) of one wavelength range.</summary>
    public delegate void Part(double x, out double a, out double b);

    /// <summary>a(x) + b(x)/R_V with the law's own optical/near-IR part and CCM89's infrared and ultraviolet parts.</summary>
    public static double AOverAV(double wavelengthAngstrom, double rv, IExtinctionLaw law, Part optical)
    {
        double x = InverseMicron(wavelengthAngstrom, law);
        double a, b;
        if (x < 1.1) Infrared(x, out a, out b);
        else if (x < 3.3) optical(x, out a, out b);
        else if (x < 8.0) Ultraviolet(x, out a, out b);
        else FarUltraviolet(x, out a, out b);
        return a + b / rv;
    }

    public static double InverseMicron(double wavelengthAngstrom, IExtinctionLaw law)
    {
        if (!(wavelengthAngstrom >= law.MinWavelengthAngstrom * (1 - 1e-12) && wavelengthAngstrom <= law.MaxWavelengthAngstrom * (1 + 1e-12)))
            throw new ArgumentOutOfRangeException(nameof(wavelengthAngstrom), wavelengthAngstrom,
                $"{law.Name} is defined for {law.MinWavelengthAngstrom:F0}-{law.MaxWavelengthAngstrom:F0} Angstrom, not {wavelengthAngstrom} Angstrom.");
        return 1.0e4 / wavelengthAngstrom;
    }

    /// <summary>CCM89 eq. 2a/2b: a = 0.574 x^1.61, b = -0.527 x^1.61.</summary>
    public static void Infrared(double x, out double a, out double b)
    {
        double p = Math.Pow(x, 1.61);
        a = 0.574 * p;
        b = -0.527 * p;
    }

    /// <summary>CCM89 eq. 4a/4b with the far-UV curvature terms F_a, F_b (eq. 4c/4d) for x &gt;= 5.9.</summary>
    public static void Ultraviolet(double x, out double a, out double b)
    {
        double fa = 0.0, fb = 0.0;
        if (x >= 5.9)
        {
            double y = x - 5.9;
            fa = -0.04473 * y * y - 0.009779 * y * y * y;
            fb = 0.2130 * y * y + 0.1207 * y * y * y;
        }
        a = 1.752 - 0.316 * x - 0.104 / ((x - 4.67) * (x - 4.67) + 0.341) + fa;
        b = -3.090 + 1.825 * x + 1.206 / ((x - 4.62) * (x - 4.62) + 0.263) + fb;
    }

    /// <summary>CCM89 eq. 5a/5b, 8 &lt;= x &lt;= 10.</summary>
    public static void FarUltraviolet(double x, out double a, out double b)
    {
        double y = x - 8.0;
        a = -1.073 - 0.628 * y + 0.137 * y * y - 0.070 * y * y * y;
        b = 13.670 + 4.257 * y - 0.420 * y * y + 0.374 * y * y * y;
    }
}
