namespace Photometallicity.Photometry.Extinction;

/// <summary>
/// O'Donnell (1994, ApJ 422, 158): the CCM89 form with revised optical/near-IR coefficients for
/// 1.1 &lt;= x &lt; 3.3 per micron (O'Donnell's 8th-order polynomial in y = x - 1.82 that replaces CCM89 eq. 3; coefficients as published, cross-checked against python3-extinction in the tests); the infrared, ultraviolet and far-UV parts are
/// CCM89's (Cardelli, Clayton &amp; Mathis 1989, ApJ 345, 245, eqs. 2, 4, 5). As in CCM89, A_V is monochromatic
/// at x = 1.82 per micron (5494.5 Angstrom), where a = 1 and b = 0.
/// </summary>
public sealed class ODonnell1994 : IExtinctionLaw
{
    public string Name => "odonnell94";

    public double MinWavelengthAngstrom => 1000.0;

    public double MaxWavelengthAngstrom => 1.0e4 / 0.3;

    public double AOverAV(double wavelengthAngstrom, double rv) => CcmForm.AOverAV(wavelengthAngstrom, rv, this, Optical);

    /// <summary>O'Donnell (1994): the revised CCM89 eq. 3, y = x - 1.82, 8th order (Horner form).</summary>
    internal static void Optical(double x, out double a, out double b)
    {
        double y = x - 1.82;
        a = 1.0 + y * (0.104 + y * (-0.609 + y * (0.701 + y * (1.137 + y * (-1.718 + y * (-0.827 + y * (1.647 + y * -0.505)))))));
        b = y * (1.952 + y * (2.908 + y * (-3.989 + y * (-7.985 + y * (11.102 + y * (5.491 + y * (-10.805 + y * 3.347)))))));
    }
}
