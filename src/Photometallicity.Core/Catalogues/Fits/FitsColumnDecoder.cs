using System.Buffers.Binary;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
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
            // Every element is overwritten by Decode, so the arrays need not be zeroed first.
            'L' or 'B' => GC.AllocateUninitializedArray<byte>(rows),
            'I' => GC.AllocateUninitializedArray<short>(rows),
            'J' => GC.AllocateUninitializedArray<int>(rows),
            'K' => GC.AllocateUninitializedArray<long>(rows),
            'E' => GC.AllocateUninitializedArray<float>(rows),
            'D' => GC.AllocateUninitializedArray<double>(rows),
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
        if (Spec.Offset + Spec.Width > rowBytes || (long)count * rowBytes > chunk.Length)
            throw new ArgumentOutOfRangeException(nameof(chunk), "field outside the rows of the chunk");
        // The bounds were checked once above; the loops read unaligned big-endian values without per-row checks.
        ref byte row0 = ref Unsafe.Add(ref MemoryMarshal.GetReference(chunk), Spec.Offset);
        nint stride = rowBytes;
        switch (Raw)
        {
            case double[] d:
                {
                    var dst = d.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++)
                        dst[r] = BitConverter.UInt64BitsToDouble(BinaryPrimitives.ReverseEndianness(Unsafe.ReadUnaligned<ulong>(ref Unsafe.Add(ref row0, r * stride))));
                    break;
                }
            case float[] f:
                {
                    var dst = f.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++)
                        dst[r] = BitConverter.UInt32BitsToSingle(BinaryPrimitives.ReverseEndianness(Unsafe.ReadUnaligned<uint>(ref Unsafe.Add(ref row0, r * stride))));
                    break;
                }
            case long[] l:
                {
                    var dst = l.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++)
                        dst[r] = BinaryPrimitives.ReverseEndianness(Unsafe.ReadUnaligned<long>(ref Unsafe.Add(ref row0, r * stride)));
                    break;
                }
            case int[] i:
                {
                    var dst = i.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++)
                        dst[r] = BinaryPrimitives.ReverseEndianness(Unsafe.ReadUnaligned<int>(ref Unsafe.Add(ref row0, r * stride)));
                    break;
                }
            case short[] s:
                {
                    var dst = s.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++)
                        dst[r] = BinaryPrimitives.ReverseEndianness(Unsafe.ReadUnaligned<short>(ref Unsafe.Add(ref row0, r * stride)));
                    break;
                }
            case byte[] b:
                {
                    var dst = b.AsSpan(firstRow, count);
                    for (int r = 0; r < dst.Length; r++) dst[r] = Unsafe.Add(ref row0, r * stride);
                    break;
                }
            case string?[] a:
                for (int r = 0, off = Spec.Offset; r < count; r++, off += rowBytes) a[firstRow + r] = DecodeString(chunk.Slice(off, Spec.Width));
                break;
        }
    }

    /// <summary>
    /// Character field (FITS Standard 4.0, sect. 7.3.3.1): the text ends at the first NUL, and a field whose first byte is
    /// NUL is a null string, read as missing (the writer writes a missing string as all NUL bytes). An empty string
    /// padded with NULs by another writer is therefore missing too. Trailing spaces are not significant.
    /// </summary>
    private static string? DecodeString(ReadOnlySpan<byte> field)
    {
        int end = field.IndexOf((byte)0);
        if (end == 0) return null;
        if (end < 0) end = field.Length;
        var text = field[..end].TrimEnd((byte)' ');
        return text.Length == 0 ? "" : Encoding.UTF8.GetString(text);
    }
}
