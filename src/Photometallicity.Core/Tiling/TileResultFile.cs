using System.Runtime.InteropServices;
using System.Text;
using Photometallicity.Catalogues;
using Photometallicity.Errors;
using Photometallicity.Metallicity;

namespace Photometallicity.Tiling;

/// <summary>
/// The binary file of a <see cref="TileResult"/> (result.bin in the tile's directory): a magic string and version,
/// then little-endian arrays, each preceded by its length. Values are stored bit for bit, so the merge sees exactly
/// what the tile computed. Written under a temporary name and renamed.
/// </summary>
public static class TileResultFile
{
    public const string FileName = "result.bin";
    private const string Magic = "PHOTOMETALLICITY-TILE";
    private const int Version = 2;

    public static void Write(TileResult r, string path)
    {
        AtomicFile.Write(path, stream =>
        {
            using var w = new BinaryWriter(stream, Encoding.UTF8, leaveOpen: true);
            w.Write(Magic);
            w.Write(Version);
            w.Write(r.TileIndex);
            w.Write(r.Count);
            w.Write(WindowTotal(r.Metallicity));
            w.Write(r.Dwarf is not null);
            w.Write(r.Dwarf is { } dw ? WindowTotal(dw) : 0L);
            Put(w, r.Rows);
            Put(w, r.RightIndex);
            Put(w, r.SeparationArcsec);
            Put(w, r.Blend);
            PutFeh(w, r.Metallicity);
            w.Write(r.Dwarf is not null);
            if (r.Dwarf is { } d) PutFeh(w, d);
        });
    }

    /// <summary>The head of a result file: tile, owned rows, and the stored likelihood values (main, dwarf), read without the arrays.</summary>
    public readonly record struct Header(int TileIndex, int Rows, long WindowValues, bool HasDwarf, long DwarfWindowValues);

    public static Header ReadHeader(string path)
    {
        using var stream = Open(path);
        using var rd = new BinaryReader(stream, Encoding.UTF8);
        return ReadHeader(rd, path);
    }

    private static FileStream Open(string path)
    {
        if (!File.Exists(path)) throw new InputException("the tile has no result: run the 'tile' verb for it first (or check its log)", file: path);
        return new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 20);
    }

    private static Header ReadHeader(BinaryReader rd, string path)
    {
        try
        {
            if (rd.ReadString() != Magic) throw new InputException("not a tile result file", file: path);
            int version = rd.ReadInt32();
            if (version != Version) throw new InputException($"tile result format version {version}; this program reads version {Version}", file: path);
            return new Header(rd.ReadInt32(), rd.ReadInt32(), rd.ReadInt64(), rd.ReadBoolean(), rd.ReadInt64());
        }
        catch (EndOfStreamException)
        {
            throw new InputException("tile result file is truncated", file: path);
        }
    }

    public static TileResult Read(string path)
    {
        using var stream = Open(path);
        using var rd = new BinaryReader(stream, Encoding.UTF8);
        var head = ReadHeader(rd, path);
        try
        {
            int index = head.TileIndex;
            var rows = Get<int>(rd);
            var right = Get<int>(rd);
            var sep = Get<double>(rd);
            var blend = Get<bool>(rd);
            var feh = GetFeh(rd);
            var dwarf = rd.ReadBoolean() ? GetFeh(rd) : null;
            if (rows.Length != head.Rows || feh.Likelihoods.Values.LongLength != head.WindowValues || right.Length != rows.Length || sep.Length != rows.Length || blend.Length != rows.Length || feh.Count != rows.Length || (dwarf is not null && dwarf.Count != rows.Length))
                throw new InputException("tile result arrays disagree in length", file: path);
            return new TileResult { TileIndex = index, Rows = rows, RightIndex = right, SeparationArcsec = sep, Blend = blend, Metallicity = feh, Dwarf = dwarf };
        }
        catch (EndOfStreamException)
        {
            throw new InputException("tile result file is truncated", file: path);
        }
    }

    private static long WindowTotal(MetallicityResult m)
    {
        long total = 0;
        for (int i = 0; i < m.Likelihoods.StarCount; i++) total += m.Likelihoods.Length[i];
        return total;
    }

    private static void PutFeh(BinaryWriter w, MetallicityResult m)
    {
        Put(w, m.Feh);
        Put(w, m.FehLo);
        Put(w, m.FehHi);
        Put(w, m.FehLimit);
        Put(w, m.LimitSide.Select(s => (byte)s).ToArray());
        Put(w, m.Status.Select(s => (byte)s).ToArray());
        w.Write(m.ColourNodeStep);
        w.Write(m.EnsembleMembers);
        var l = m.Likelihoods;
        w.Write(l.GridMin);
        w.Write(l.GridStep);
        w.Write(l.GridCount);
        Put(w, l.Start);
        Put(w, l.Length);
        w.Write(l.Stride is not null);
        if (l.Stride is { } stride) Put(w, stride);
        // Windows in star order, whatever order the assigner laid them out in.
        w.Write(WindowTotal(m));
        for (int i = 0; i < l.StarCount; i++) w.Write(MemoryMarshal.AsBytes(l.Window(i)));
    }

    private static MetallicityResult GetFeh(BinaryReader rd)
    {
        var feh = Get<double>(rd);
        var lo = Get<double>(rd);
        var hi = Get<double>(rd);
        var lim = Get<double>(rd);
        var side = Get<byte>(rd).Select(b => (FehLimitSide)b).ToArray();
        var status = Get<byte>(rd).Select(b => (MetallicityStatus)b).ToArray();
        double nodeStep = rd.ReadDouble();
        int members = rd.ReadInt32();
        double gridMin = rd.ReadDouble(), gridStep = rd.ReadDouble();
        int gridCount = rd.ReadInt32();
        var start = Get<int>(rd);
        var length = Get<int>(rd);
        var stride = rd.ReadBoolean() ? Get<byte>(rd) : null;
        long total = rd.ReadInt64();
        if (total > Array.MaxLength) throw new EndOfStreamException();
        var values = new Half[total];
        ReadExactly(rd, MemoryMarshal.AsBytes(values.AsSpan()));
        var offset = new int[length.Length];
        int at = 0;
        for (int i = 0; i < length.Length; i++) { offset[i] = length[i] > 0 ? at : 0; at += length[i]; }
        return new MetallicityResult
        {
            Feh = feh, FehLo = lo, FehHi = hi, FehLimit = lim, LimitSide = side, Status = status, Counts = MetallicityResult.CountsOf(status),
            ColourNodeStep = nodeStep, EnsembleMembers = members,
            Likelihoods = new FehLikelihoods { GridMin = gridMin, GridStep = gridStep, GridCount = gridCount, Offset = offset, Start = start, Length = length, Stride = stride, Values = values },
        };
    }

    private static void Put<T>(BinaryWriter w, T[] a) where T : unmanaged
    {
        w.Write(a.LongLength);
        w.Write(MemoryMarshal.AsBytes(a.AsSpan()));
    }

    private static T[] Get<T>(BinaryReader rd) where T : unmanaged
    {
        long n = rd.ReadInt64();
        if (n < 0 || n > Array.MaxLength) throw new EndOfStreamException();
        var a = new T[n];
        ReadExactly(rd, MemoryMarshal.AsBytes(a.AsSpan()));
        return a;
    }

    private static void ReadExactly(BinaryReader rd, Span<byte> into)
    {
        rd.BaseStream.ReadExactly(into);
    }
}
