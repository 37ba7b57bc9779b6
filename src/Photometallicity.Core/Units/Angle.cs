namespace Photometallicity.Units;

/// <summary>An angle, stored in radians. Construct it through a factory that names the unit.</summary>
public readonly record struct Angle : IComparable<Angle>
{
    private const double ArcsecPerRadian = 180.0 * 3600.0 / Math.PI;

    private Angle(double radians) => Radians = radians;

    public double Radians { get; }
    public double Degrees => Radians * (180.0 / Math.PI);
    public double Arcminutes => Degrees * 60.0;
    public double Arcseconds => Radians * ArcsecPerRadian;

    public static Angle Zero => default;
    public static Angle FromRadians(double radians) => new(radians);
    public static Angle FromDegrees(double degrees) => new(degrees * (Math.PI / 180.0));
    public static Angle FromArcminutes(double arcmin) => FromDegrees(arcmin / 60.0);
    public static Angle FromArcseconds(double arcsec) => new(arcsec / ArcsecPerRadian);

    public static Angle operator +(Angle a, Angle b) => new(a.Radians + b.Radians);
    public static Angle operator -(Angle a, Angle b) => new(a.Radians - b.Radians);
    public static Angle operator -(Angle a) => new(-a.Radians);
    public static Angle operator *(Angle a, double k) => new(a.Radians * k);
    public static bool operator <(Angle a, Angle b) => a.Radians < b.Radians;
    public static bool operator >(Angle a, Angle b) => a.Radians > b.Radians;
    public static bool operator <=(Angle a, Angle b) => a.Radians <= b.Radians;
    public static bool operator >=(Angle a, Angle b) => a.Radians >= b.Radians;

    public int CompareTo(Angle other) => Radians.CompareTo(other.Radians);

    public override string ToString() => $"{Arcseconds:G6} arcsec";
}
