namespace Photometallicity.Photometry;

/// <summary>
/// The measured photometry of every broadband row, columnar, in input order (mag). Narrow-band values are per
/// broadband row: those of the row's narrow-band partner, NaN where the row has none (<see cref="HasNarrowMatch"/>
/// false). E(B-V) per star or constant (mag); its 1-sigma error likewise, or null for none. Optional catalogue flags:
/// true (or a nonzero code, see <see cref="FlagsFromCodes"/>) marks a row the catalogue itself flagged.
/// </summary>
public sealed class PhotometryInputs
{
    public required double[] BlueMag { get; init; }
    public required double[] BlueErr { get; init; }
    public required double[] RedMag { get; init; }
    public required double[] RedErr { get; init; }
    public required double[] NarrowMag { get; init; }
    public required double[] NarrowErr { get; init; }
    public required bool[] HasNarrowMatch { get; init; }

    /// <summary>E(B-V) (mag), per star or constant.</summary>
    public required StarValues Ebv { get; init; }

    /// <summary>1-sigma error of E(B-V) (mag), per star or constant; null means no reddening uncertainty.</summary>
    public StarValues? EbvErr { get; init; }

    /// <summary>Catalogue quality flags, true = flagged; null when the catalogue has none.</summary>
    public bool[]? CatalogueFlagged { get; init; }

    public int Count => BlueMag.Length;

    /// <summary>Nonzero code = flagged (for integer flag columns).</summary>
    public static bool[] FlagsFromCodes(IReadOnlyList<long> codes)
    {
        var f = new bool[codes.Count];
        for (int i = 0; i < f.Length; i++) f[i] = codes[i] != 0;
        return f;
    }

    /// <summary>ArgumentException (a programming error: the arrays come from one table) unless all lengths agree.</summary>
    internal void CheckShape()
    {
        int n = Count;
        Check(BlueErr.Length, nameof(BlueErr));
        Check(RedMag.Length, nameof(RedMag));
        Check(RedErr.Length, nameof(RedErr));
        Check(NarrowMag.Length, nameof(NarrowMag));
        Check(NarrowErr.Length, nameof(NarrowErr));
        Check(HasNarrowMatch.Length, nameof(HasNarrowMatch));
        if (Ebv.Length is int a) Check(a, nameof(Ebv));
        if (EbvErr?.Length is int b) Check(b, nameof(EbvErr));
        if (CatalogueFlagged is not null) Check(CatalogueFlagged.Length, nameof(CatalogueFlagged));

        void Check(int len, string name)
        {
            if (len != n) throw new ArgumentException($"{name} has {len} entries but {nameof(BlueMag)} has {n}.");
        }
    }
}
