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
        RadixSort(keys, order);
        return order;
    }

    /// <summary>
    /// Stable least-significant-digit radix sort of the keys, carrying the indices along (Knuth 1998, The Art of
    /// Computer Programming 3, section 5.2.5). The indices start in increasing order and every pass is stable, so
    /// the result is ordered by (key, index): fully determined even where keys repeat. Digits of 11 bits; a pass
    /// whose digit is the same for every key is skipped (common on a small field, where the high bits agree).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void RadixSort(ulong[] keys, int[] order)
    {
        const int Bits = 11, Buckets = 1 << Bits;
        int n = keys.Length;
        if (n < 2) return;
        var k2 = new ulong[n];
        var o2 = new int[n];
        var count = new int[Buckets];
        ulong[] ka = keys, kb = k2;
        int[] oa = order, ob = o2;
        for (int shift = 0; shift < 64; shift += Bits)
        {
            Array.Clear(count);
            for (int i = 0; i < n; i++) count[(int)((ka[i] >> shift) & (Buckets - 1))]++;
            if (count[(int)((ka[0] >> shift) & (Buckets - 1))] == n) continue;
            int sum = 0;
            for (int b = 0; b < Buckets; b++)
            {
                int c = count[b];
                count[b] = sum;
                sum += c;
            }
            for (int i = 0; i < n; i++)
            {
                ulong key = ka[i];
                int at = count[(int)((key >> shift) & (Buckets - 1))]++;
                kb[at] = key;
                ob[at] = oa[i];
            }
            (ka, kb) = (kb, ka);
            (oa, ob) = (ob, oa);
        }
        if (!ReferenceEquals(oa, order)) Array.Copy(oa, order, n);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ulong Quantise(double v) => (ulong)Math.Clamp((int)((v + 1.0) * 0.5 * 2097151.0), 0, 2097151);

    /// <summary>Spreads the low 21 bits of x so that there are two zero bits between consecutive bits.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
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
