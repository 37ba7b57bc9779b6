using System.Buffers.Binary;
using System.Text;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// Decodes one field from chunks of raw big-endian rows (FITS Standard 4.0, sect. 7.3.3) into a native array, one
/// tight loop per type. Scaling, nulls and the unsigned convention are applied afterwards by
/// <see cref="FitsColumnBuilder"/>.
/// </summary>
internal sealed class FitsColumnDecoder
{
    public FitsColumnDecoder(FitsFieldSpec spec, int rows)
    {
        Spec = spec;
        Raw = spec.Code switch
        {
            'L' or 'B' => new byte[rows],
            'I' => new short[rows],
            'J' => new int[rows],
            'K' => new long[rows],
            'E' => new float[rows],
            'D' => new double[rows],
            'A' => new string?[rows],
            _ => throw new InvalidOperationException("unsupported code " + spec.Code),
        };
    }

    public FitsFieldSpec Spec { get; }

    /// <summary>byte[] (L, B), short[], int[], long[], float[], double[] or string?[] (A).</summary>
    public Array Raw { get; }

    /// <summary>Decodes rows [firstRow, firstRow + count) held in <paramref name="chunk"/>, rows of <paramref name="rowBytes"/>.</summary>
    public void Decode(ReadOnlySpan<byte> chunk, int rowBytes, int firstRow, int count)
    {
        int off = Spec.Offset;
        switch (Raw)
        {
            case double[] d:
                {
                    var dst = d.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++, off += rowBytes) dst[r] = BinaryPrimitives.ReadDoubleBigEndian(chunk.Slice(off, 8));
                    break;
                }
            case float[] f:
                {
                    var dst = f.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++, off += rowBytes) dst[r] = BinaryPrimitives.ReadSingleBigEndian(chunk.Slice(off, 4));
                    break;
                }
            case long[] l:
                {
                    var dst = l.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++, off += rowBytes) dst[r] = BinaryPrimitives.ReadInt64BigEndian(chunk.Slice(off, 8));
                    break;
                }
            case int[] i:
                {
                    var dst = i.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++, off += rowBytes) dst[r] = BinaryPrimitives.ReadInt32BigEndian(chunk.Slice(off, 4));
                    break;
                }
            case short[] s:
                {
                    var dst = s.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++, off += rowBytes) dst[r] = BinaryPrimitives.ReadInt16BigEndian(chunk.Slice(off, 2));
                    break;
                }
            case byte[] b:
                {
                    var dst = b.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++, off += rowBytes) dst[r] = chunk[off];
                    break;
                }
            case string?[] a:
                for (int r = 0; r < count; r++, off += rowBytes) a[firstRow + r] = DecodeString(chunk.Slice(off, Spec.Width));
                break;
        }
    }

    /// <summary>
    /// Character field (sect. 7.3.3.1): the text ends at the first NUL; trailing spaces are not significant.
    /// A field of only NUL bytes is read as missing (this is how <see cref="FitsTableWriter"/> writes a missing
    /// string), so an empty string padded with NULs by another writer is read as missing too.
    /// </summary>
    private static string? DecodeString(ReadOnlySpan<byte> field)
    {
        int end = field.IndexOf((byte)0);
        if (end == 0) return field.IndexOfAnyExcept((byte)0) < 0 ? null : "";
        if (end < 0) end = field.Length;
        var text = field[..end].TrimEnd((byte)' ');
        return text.Length == 0 ? "" : Encoding.UTF8.GetString(text);
    }
}
