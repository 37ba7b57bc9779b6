using System.Runtime.CompilerServices;
namespace Photometallicity.CrossMatch;

/// <summary>
/// A visiting order of points that keeps neighbours on the sky close together: the Morton (Z-order) code
/// of the unit vector quantised to 21 bits per axis (Morton 1966, IBM technical report; common practice).
/// Queries run in this order hit the same tree nodes one after another, which keeps them in cache; the
/// results are still written by the point's own index, so the order changes only speed.
/// </summary>
internal static class SpatialOrder
{
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static int[] Of(UnitVectors p)
    {
        int n = p.Count;
        var keys = new ulong[n];
        var order = new int[n];
        Chunks.For(n, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (_, lo, hi) =>
        {
            for (int i = lo; i < hi; i++)
            {
                keys[i] = Spread(Quantise(p.X[i])) | (Spread(Quantise(p.Y[i])) << 1) | (Spread(Quantise(p.Z[i])) << 2);
                order[i] = i;
            }
        });
        // Keys may repeat; ties keep index order because the sort is on (key, index) pairs made unique below.
        Array.Sort(keys, order);
        // Array.Sort is not stable: restore index order within runs of equal keys so the order is fully determined.
        int s = 0;
        for (int i = 1; i <= n; i++)
        {
            if (i == n || keys[i] != keys[s])
            {
                if (i - s > 1) Array.Sort(order, s, i - s);
                s = i;
            }
        }
        return order;
    }

    private static ulong Quantise(double v) => (ulong)Math.Clamp((int)((v + 1.0) * 0.5 * 2097151.0), 0, 2097151);

    /// <summary>Spreads the low 21 bits of x so that there are two zero bits between consecutive bits.</summary>
    private static ulong Spread(ulong x)
    {
        x &= 0x1FFFFF;
        x = (x | (x << 32)) & 0x1F00000000FFFFUL;
        x = (x | (x << 16)) & 0x1F0000FF0000FFUL;
        x = (x | (x << 8)) & 0x100F00F00F00F00FUL;
        x = (x | (x << 4)) & 0x10C30C30C30C30C3UL;
        x = (x | (x << 2)) & 0x1249249249249249UL;
        return x;
    }
}
