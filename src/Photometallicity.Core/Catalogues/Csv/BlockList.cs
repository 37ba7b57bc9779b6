namespace Photometallicity.Catalogues.Csv;

/// <summary>
/// A growable array kept as fixed blocks of 65536 elements while a file is scanned, so that growing never copies
/// (a doubling array holds up to 3x the column while it resizes and 2x once grown) and the final exact-length array
/// is the only copy: converting one column at a time, a table of n rows peaks at about its final size plus one column.
/// Elements never written read as default(T).
/// </summary>
internal sealed class BlockList<T>
{
    private const int Shift = 16, Size = 1 << Shift, Mask = Size - 1;
    private readonly List<T[]> _blocks = new();

    public T this[int index]
    {
        get
        {
            int b = index >> Shift;
            return b < _blocks.Count ? _blocks[b][index & Mask] : default!;
        }
        set
        {
            int b = index >> Shift;
            while (b >= _blocks.Count) _blocks.Add(new T[Size]);
            _blocks[b][index & Mask] = value;
        }
    }

    /// <summary>The first <paramref name="count"/> elements as one array; the blocks are released.</summary>
    public T[] ToArray(int count)
    {
        var a = new T[count];
        for (int b = 0; b < _blocks.Count && (long)b * Size < count; b++)
        {
            int start = b * Size;
            Array.Copy(_blocks[b], 0, a, start, Math.Min(Size, count - start));
            _blocks[b] = null!;
        }
        _blocks.Clear();
        return a;
    }
}
