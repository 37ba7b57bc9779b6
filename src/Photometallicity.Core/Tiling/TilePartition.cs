using Photometallicity.Errors;
using Photometallicity.Healpix;
using Photometallicity.Units;

namespace Photometallicity.Tiling;

/// <summary>The rows of one catalogue that a tile holds, ascending, each with its ring (see <see cref="TilePartition"/>).</summary>
public sealed record TileRows(int[] Rows, byte[] Ring);

/// <summary>
/// Partition of a field into nested HEALPix tiles (Gorski et al. 2005, ApJ 622, 759) at order K, each with a margin.
/// Positions are first put in "fine" pixels at an order F >= K whose pixels are wide enough to hold the margin;
/// a source belongs to the tile of its fine pixel with ring 0 (the tile owns it), to the tiles of the fine pixel's
/// eight neighbours with ring 1, and to the tiles of their neighbours with ring 2. A source of ring 0 or 1 therefore has
/// every source within one margin of it inside the tile; a source of ring 2 may not (see <see cref="TileMatchCheck"/>).
/// Within one base face the nested pixels form a square grid (face-local x, y from the bits of the pixel number), so a
/// fine pixel two or more cells inside its tile's block has all its rings in that tile and needs no neighbour search.
/// </summary>
public sealed class TilePartition
{
    // Pixel widths vary over the sphere; the narrowest is taken as 0.35 x sqrt(pixel area) (program's choice, with room:
    // the neighbour test in the unit tests finds every point within 0.5 x sqrt(area) in the pixel or its neighbours).
    public const double InnerWidthFraction = 0.35;

    public int Order { get; }
    public int FineOrder { get; }

    /// <summary>The non-empty tiles' pixels (order <see cref="Order"/>), ascending, with their rows.</summary>
    public IReadOnlyList<long> Pixels { get; }
    public IReadOnlyList<TileRows> Broadband { get; }
    public IReadOnlyList<TileRows> Narrowband { get; }

    private TilePartition(int order, int fine, List<long> pixels, List<TileRows> broad, List<TileRows> narrow)
    {
        Order = order;
        FineOrder = fine;
        Pixels = pixels;
        Broadband = broad;
        Narrowband = narrow;
    }

    /// <summary>The finest order whose pixels are at least <paramref name="margin"/> wide (never below <paramref name="order"/>: then an error).</summary>
    public static int FineOrderFor(int order, Angle margin)
    {
        if (!(margin.Radians > 0)) throw new InputException($"the tile margin must be positive (got {margin.Arcseconds} arcsec)");
        int fine = order;
        while (fine < 29 && WidthOf(fine + 1) >= margin.Radians) fine++;
        if (WidthOf(fine) < margin.Radians)
            throw new InputException($"tiles of HEALPix order {order} are narrower ({WidthOf(order) * 206264.806:0.#} arcsec) than the margin of {margin.Arcseconds:0.##} arcsec; use a lower order");
        return fine;
    }

    private static double WidthOf(int order) => InnerWidthFraction * Math.Sqrt(4 * Math.PI / (12.0 * Math.Pow(4, order)));

    public static TilePartition Build(int order, Angle margin, double[] broadRa, double[] broadDec, double[] narrowRa, double[] narrowDec)
    {
        if (order < 0 || order > 29) throw new InputException($"the tile order {order} is outside [0, 29]");
        int fine = FineOrderFor(order, margin);
        var hf = new HealpixNested(fine);
        var bEntries = Assign(hf, fine - order, broadRa, broadDec);
        var nEntries = Assign(hf, fine - order, narrowRa, narrowDec);
        var owned = new SortedSet<long>();
        foreach (var e in bEntries) if (e.Ring == 0) owned.Add(e.Tile);
        var pixels = owned.ToList();
        var index = new Dictionary<long, int>(pixels.Count);
        for (int t = 0; t < pixels.Count; t++) index[pixels[t]] = t;
        return new TilePartition(order, fine, pixels, Group(bEntries, index), Group(nEntries, index));
    }

    private readonly record struct Entry(long Tile, int Row, byte Ring);

    /// <summary>Every (tile, row, ring) of one catalogue, rows ascending.</summary>
    private static List<Entry> Assign(HealpixNested hf, int levels, double[] ra, double[] dec)
    {
        int n = ra.Length;
        var finePix = new long[n];
        Parallel.For(0, (n + 65535) / 65536, c =>
        {
            for (int i = c * 65536, end = Math.Min(n, i + 65536); i < end; i++) finePix[i] = hf.FromRaDec(ra[i], dec[i]);
        });
        long block = 1L << levels;
        var cache = new Dictionary<long, (long Tile, byte Ring)[]>();
        var entries = new List<Entry>(n + n / 8);
        for (int i = 0; i < n; i++)
        {
            long p = finePix[i];
            var (_, ix, iy) = hf.Decompose(p);
            long bx = ix % block, by = iy % block;
            if (bx >= 2 && bx < block - 2 && by >= 2 && by < block - 2)
            {
                entries.Add(new Entry(p >> (2 * levels), i, 0));
                continue;
            }
            if (!cache.TryGetValue(p, out var tiles)) cache[p] = tiles = Rings(hf, levels, p);
            foreach (var (tile, ring) in tiles) entries.Add(new Entry(tile, i, ring));
        }
        return entries;
    }

    /// <summary>The tiles within two rings of fine pixel p, each with the lowest ring that reaches it.</summary>
    private static (long Tile, byte Ring)[] Rings(HealpixNested hf, int levels, long p)
    {
        var best = new Dictionary<long, byte> { [p >> (2 * levels)] = 0 };
        void Note(long q, byte ring)
        {
            long t = q >> (2 * levels);
            if (!best.TryGetValue(t, out byte r) || ring < r) best[t] = ring;
        }
        var first = hf.Neighbours(p);
        foreach (long q in first)
        {
            if (q < 0) continue;
            Note(q, 1);
            foreach (long q2 in hf.Neighbours(q))
                if (q2 >= 0) Note(q2, 2);
        }
        return best.OrderBy(kv => kv.Key).Select(kv => (kv.Key, kv.Value)).ToArray();
    }

    private static List<TileRows> Group(List<Entry> entries, Dictionary<long, int> index)
    {
        var rows = new List<int>[index.Count];
        var rings = new List<byte>[index.Count];
        for (int t = 0; t < rows.Length; t++) { rows[t] = new List<int>(); rings[t] = new List<byte>(); }
        foreach (var e in entries)
        {
            if (!index.TryGetValue(e.Tile, out int t)) continue; // a margin-only tile owns no broadband row: nothing to do there
            rows[t].Add(e.Row);
            rings[t].Add(e.Ring);
        }
        return Enumerable.Range(0, rows.Length).Select(t => new TileRows(rows[t].ToArray(), rings[t].ToArray())).ToList();
    }
}
