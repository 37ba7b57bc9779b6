namespace Photometallicity.CrossMatch;

/// <summary>
/// A growable pair of arrays (right index, squared chord) that tree searches append to: one per chunk of
/// queries, cleared and re-used, so a search allocates nothing.
/// </summary>
internal sealed class PairBuffer
{
    public PairBuffer(int capacity)
    {
        Right = new int[Math.Max(4, capacity)];
        Chord2 = new double[Right.Length];
    }

    public int[] Right { get; private set; }
    public double[] Chord2 { get; private set; }
    public int Count { get; private set; }

    public void Clear() => Count = 0;

    public void Add(int right, double chord2)
    {
        if (Count == Right.Length) Grow();
        Right[Count] = right;
        Chord2[Count] = chord2;
        Count++;
    }

    private void Grow()
    {
        var r = Right;
        var c = Chord2;
        Array.Resize(ref r, 2 * r.Length);
        Array.Resize(ref c, 2 * c.Length);
        Right = r;
        Chord2 = c;
    }
}
