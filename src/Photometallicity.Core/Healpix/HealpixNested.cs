namespace Photometallicity.Healpix;

/// <summary>
/// HEALPix in the NESTED numbering scheme (Gorski et al. 2005, ApJ 622, 759), written from the paper's
/// equations: angle to pixel (sec. 4, eqs. 5-9 for the equatorial and polar zones), pixel to angle, and the
/// eight neighbours. Nside = 2^order, order 0..29. theta is the colatitude (0 at the north pole), phi the
/// longitude, both in radians; for the sky, theta = 90 deg - Dec, phi = RA.
/// The base-resolution face layout constants jrll/jpll (ring and longitude index of each face's southern
/// corner) follow from the paper's fig. 4; written out as in the HEALPix reference implementation's notation
/// (recalled from memory, checked against healpy in the tests).
/// </summary>
public sealed class HealpixNested
{
    private static readonly int[] Jrll = [2, 2, 2, 2, 3, 3, 3, 3, 4, 4, 4, 4];
    private static readonly int[] Jpll = [1, 3, 5, 7, 0, 2, 4, 6, 1, 3, 5, 7];
    private const double HalfPi = Math.PI / 2;

    public HealpixNested(int order)
    {
        if (order < 0 || order > 29) throw new ArgumentOutOfRangeException(nameof(order), order, "HEALPix order must lie in [0, 29].");
        Order = order;
        Nside = 1L << order;
        PixelCount = 12 * Nside * Nside;
    }

    public int Order { get; }
    public long Nside { get; }
    public long PixelCount { get; }

    /// <summary>Pixel solid angle in steradians (4 pi / Npix; Gorski et al. 2005, sec. 3).</summary>
    public double PixelArea => 4 * Math.PI / PixelCount;

    /// <summary>Pixel of (RA, Dec) in degrees; theta = pi/2 - Dec in radians, computed as healpy's lonlat option does.</summary>
    public long FromRaDec(double raDeg, double decDeg) => FromAngles(HalfPi - decDeg * (Math.PI / 180.0), raDeg * (Math.PI / 180.0));

    public (double RaDeg, double DecDeg) ToRaDec(long pixel)
    {
        var (theta, phi) = ToAngles(pixel);
        return (phi * 180.0 / Math.PI, 90.0 - theta * 180.0 / Math.PI);
    }

    /// <summary>Nested pixel index of (theta, phi).</summary>
    public long FromAngles(double theta, double phi)
    {
        double z = Math.Cos(theta), za = Math.Abs(z);
        double tt = phi * (2.0 / Math.PI) % 4.0;
        if (tt < 0) tt += 4.0;
        long ns = Nside;
        int face;
        long ix, iy;
        if (za <= 2.0 / 3.0)
        {
            // Equatorial zone: the pixel boundaries are lines of constant z +- 3/4 phi / (pi/2) (eq. 8-9).
            double t1 = ns * (0.5 + tt), t2 = ns * (z * 0.75);
            long jp = (long)(t1 - t2), jm = (long)(t1 + t2);
            long ifp = jp >> Order, ifm = jm >> Order;
            face = ifp == ifm ? (int)(ifp | 4) : ifp < ifm ? (int)ifp : (int)(ifm + 8);
            ix = jm & (ns - 1);
            iy = ns - (jp & (ns - 1)) - 1;
        }
        else
        {
            // Polar caps: sqrt(3 (1 - |z|)), written as sin(theta) / sqrt((1 + |z|) / 3) within 0.01 rad of a pole
            // where 1 - |z| loses precision (the same switch as the reference implementation, so that boundary
            // points round alike).
            int ntt = Math.Min(3, (int)tt);
            double tp = tt - ntt;
            bool nearPole = theta < 0.01 || theta > Math.PI - 0.01;
            double tmp = nearPole && za >= 0.99 ? ns * Math.Sin(theta) / Math.Sqrt((1.0 + za) / 3.0) : ns * Math.Sqrt(3.0 * (1.0 - za));
            long jp = Math.Min(ns - 1, (long)(tp * tmp));
            long jm = Math.Min(ns - 1, (long)((1.0 - tp) * tmp));
            if (z > 0) { face = ntt; ix = ns - jm - 1; iy = ns - jp - 1; }
            else { face = ntt + 8; ix = jp; iy = jm; }
        }
        return ((long)face << (2 * Order)) + Interleave(ix, iy);
    }

    /// <summary>(theta, phi) of the pixel centre.</summary>
    public (double Theta, double Phi) ToAngles(long pixel)
    {
        var (face, ix, iy) = Decompose(pixel);
        var (z, phi) = FaceToSphere(face, (ix + 0.5) / Nside, (iy + 0.5) / Nside);
        return (Math.Acos(Math.Clamp(z, -1, 1)), phi);
    }

    /// <summary>
    /// The eight neighbours in the order SW, W, NW, N, NE, E, SE, S (the healpy convention); -1 where a neighbour
    /// does not exist (at the 8 vertices where only three faces meet). Edge neighbours across a face boundary are
    /// found by stepping just beyond the middle of the shared edge on the sphere; a diagonal neighbour is the pixel,
    /// other than this one, that shares an edge with both edge neighbours beside it.
    /// </summary>
    public long[] Neighbours(long pixel)
    {
        var (face, ix, iy) = Decompose(pixel);
        long ns = Nside;
        int[] dx = [-1, -1, 0, 1, 1, 1, 0, -1];
        int[] dy = [0, 1, 1, 1, 0, -1, -1, -1];
        var result = new long[8];
        for (int k = 0; k < 8; k += 2) result[k] = EdgeNeighbour(pixel, face, ix, iy, dx[k], dy[k]);
        for (int k = 1; k < 8; k += 2)
        {
            long jx = ix + dx[k], jy = iy + dy[k];
            if (jx >= 0 && jx < ns && jy >= 0 && jy < ns)
            {
                result[k] = ((long)face << (2 * Order)) + Interleave(jx, jy);
                continue;
            }
            long a = result[k - 1], b = result[(k + 1) % 8];
            var na = EdgeNeighbours(a);
            var nb = EdgeNeighbours(b);
            result[k] = -1;
            foreach (long q in na)
                if (q != pixel && q != a && q != b && Array.IndexOf(nb, q) >= 0) { result[k] = q; break; }
        }
        return result;
    }

    private long[] EdgeNeighbours(long pixel)
    {
        var (face, ix, iy) = Decompose(pixel);
        return [EdgeNeighbour(pixel, face, ix, iy, -1, 0), EdgeNeighbour(pixel, face, ix, iy, 0, 1),
                EdgeNeighbour(pixel, face, ix, iy, 1, 0), EdgeNeighbour(pixel, face, ix, iy, 0, -1)];
    }

    private long EdgeNeighbour(long pixel, int face, long ix, long iy, int dx, int dy)
    {
        long ns = Nside;
        long jx = ix + dx, jy = iy + dy;
        if (jx >= 0 && jx < ns && jy >= 0 && jy < ns) return ((long)face << (2 * Order)) + Interleave(jx, jy);
        var c = Vector(FaceToSphere(face, (ix + 0.5) / ns, (iy + 0.5) / ns));
        var e = Vector(FaceToSphere(face, (ix + 0.5 + 0.5 * dx) / ns, (iy + 0.5 + 0.5 * dy) / ns));
        double vx = e.X + 0.2 * (e.X - c.X), vy = e.Y + 0.2 * (e.Y - c.Y), vz = e.Z + 0.2 * (e.Z - c.Z);
        double norm = Math.Sqrt(vx * vx + vy * vy + vz * vz);
        return FromAngles(Math.Acos(Math.Clamp(vz / norm, -1, 1)), Math.Atan2(vy, vx));
    }

    internal (int Face, long Ix, long Iy) Decompose(long pixel)
    {
        if (pixel < 0 || pixel >= PixelCount) throw new ArgumentOutOfRangeException(nameof(pixel), pixel, $"pixel must lie in [0, {PixelCount}).");
        int face = (int)(pixel >> (2 * Order));
        var (ix, iy) = Deinterleave(pixel & (Nside * Nside - 1));
        return (face, ix, iy);
    }

    /// <summary>Continuous face coordinates (x, y in [0, 1]) to (z, phi).</summary>
    private static (double Z, double Phi) FaceToSphere(int face, double x, double y)
    {
        double jr = Jrll[face] - x - y;
        double nr, z;
        if (jr < 1) { nr = jr; z = 1 - nr * nr / 3.0; }
        else if (jr > 3) { nr = 4 - jr; z = nr * nr / 3.0 - 1; }
        else { nr = 1; z = (2 - jr) * 2.0 / 3.0; }
        double tmp = Jpll[face] * nr + x - y;
        if (tmp < 0) tmp += 8;
        if (tmp >= 8) tmp -= 8;
        double phi = nr < 1e-15 ? 0 : 0.5 * HalfPi * tmp / nr;
        return (z, phi);
    }

    private static (double X, double Y, double Z) Vector((double Z, double Phi) p)
    {
        double s = Math.Sqrt(Math.Max(0, (1 - p.Z) * (1 + p.Z)));
        return (s * Math.Cos(p.Phi), s * Math.Sin(p.Phi), p.Z);
    }

    /// <summary>Bit interleave: x in the even bits, y in the odd bits.</summary>
    private static long Interleave(long x, long y) => (long)(Spread((ulong)x) | (Spread((ulong)y) << 1));

    private static (long X, long Y) Deinterleave(long p) => ((long)Compact((ulong)p), (long)Compact((ulong)p >> 1));

    private static ulong Spread(ulong v)
    {
        v &= 0xFFFFFFFFUL;
        v = (v | (v << 16)) & 0x0000FFFF0000FFFFUL;
        v = (v | (v << 8)) & 0x00FF00FF00FF00FFUL;
        v = (v | (v << 4)) & 0x0F0F0F0F0F0F0F0FUL;
        v = (v | (v << 2)) & 0x3333333333333333UL;
        v = (v | (v << 1)) & 0x5555555555555555UL;
        return v;
    }

    private static ulong Compact(ulong v)
    {
        v &= 0x5555555555555555UL;
        v = (v | (v >> 1)) & 0x3333333333333333UL;
        v = (v | (v >> 2)) & 0x0F0F0F0F0F0F0F0FUL;
        v = (v | (v >> 4)) & 0x00FF00FF00FF00FFUL;
        v = (v | (v >> 8)) & 0x0000FFFF0000FFFFUL;
        v = (v | (v >> 16)) & 0x00000000FFFFFFFFUL;
        return v;
    }
}
