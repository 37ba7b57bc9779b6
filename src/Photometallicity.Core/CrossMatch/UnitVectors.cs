using System.Runtime.CompilerServices;
namespace Photometallicity.CrossMatch;

/// <summary>Columnar unit vectors (x, y, z) of sky positions, and the way back to (RA, Dec) in degrees.</summary>
public sealed class UnitVectors
{
    private const double DegToRad = Math.PI / 180.0;
    private const double RadToDeg = 180.0 / Math.PI;

    public UnitVectors(double[] x, double[] y, double[] z)
    {
        if (y.Length != x.Length || z.Length != x.Length) throw new ArgumentException("Unit-vector arrays differ in length.");
        X = x;
        Y = y;
        Z = z;
    }

    public double[] X { get; }
    public double[] Y { get; }
    public double[] Z { get; }
    public int Count => X.Length;

    private int[]? _order;

    /// <summary>A visiting order that keeps sky neighbours together (see <see cref="SpatialOrder"/>), computed once.</summary>
    public int[] Order => _order ??= SpatialOrder.Of(this);

    /// <summary>These vectors with the visiting order of <paramref name="like"/> (for slightly moved copies of the same points).</summary>
    public UnitVectors WithOrderOf(UnitVectors like) => WithOrder(like.Order);

    /// <summary>These vectors with a given visiting order (a permutation of 0 .. Count-1).</summary>
    public UnitVectors WithOrder(int[] order)
    {
        _order = order;
        return this;
    }

    /// <summary>Unit vectors of positions in degrees (computed in parallel over fixed chunks).</summary>
    public static UnitVectors FromDegrees(ReadOnlySpan<double> raDeg, ReadOnlySpan<double> decDeg) =>
        FromDegrees(raDeg.ToArray(), decDeg.ToArray());

    /// <summary>Unit vectors of positions in degrees (the arrays are only read).</summary>
    public static UnitVectors FromDegrees(double[] ra, double[] dec)
    {
        int n = ra.Length;
        if (dec.Length != n) throw new ArgumentException($"RA has {n} values but Dec has {dec.Length}.");
        var x = new double[n];
        var y = new double[n];
        var z = new double[n];
        Chunks.For(n, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (_, lo, hi) =>
        {
            for (int i = lo; i < hi; i++)
            {
                var (sd, cd) = Math.SinCos(dec[i] * DegToRad);
                var (sa, ca) = Math.SinCos(ra[i] * DegToRad);
                x[i] = cd * ca;
                y[i] = cd * sa;
                z[i] = sd;
            }
        });
        return new UnitVectors(x, y, z);
    }

    /// <summary>(RA in [0, 360), Dec) in degrees of a vector (need not be normalised).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static (double RaDeg, double DecDeg) ToDegrees(double x, double y, double z)
    {
        double ra = Math.Atan2(y, x) * RadToDeg;
        if (ra < 0) ra += 360.0;
        if (ra >= 360.0) ra -= 360.0;
        double dec = Math.Atan2(z, Math.Sqrt(x * x + y * y)) * RadToDeg;
        return (ra, dec);
    }
}
