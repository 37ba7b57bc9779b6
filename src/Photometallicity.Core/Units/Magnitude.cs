namespace Photometallicity.Units;

/// <summary>A magnitude (mag) in some photometric system, with its 1-sigma error (mag).</summary>
public readonly record struct Magnitude(double Mag, double Error)
{
    public static Magnitude FromMag(double mag, double error = 0.0) => new(mag, error);
    public bool IsFinite => double.IsFinite(Mag) && double.IsFinite(Error);
    public override string ToString() => $"{Mag:F3} +/- {Error:F3} mag";
}
