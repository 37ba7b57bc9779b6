using System.Buffers.Binary;
using System.Text;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// Encodes one <see cref="Column"/> as a binary-table field in big-endian byte order (FITS Standard 4.0, sect. 7.3.3):
/// Double -> D, Float -> E, Int64 -> K, Int32 -> J, Int16 -> I, Byte -> B, Boolean -> L, String -> rA.
/// Missing values: NaN for E and D; the TNULLn value (<see cref="FitsNullValue"/>) for integers, declared only when the
/// column has missing rows; byte 0 for L; all NUL bytes for A. Strings are written as UTF-8 (plain ASCII for ASCII
/// text, which is all the standard defines) and padded with spaces, so an empty string reads back as empty, not missing.
/// </summary>
/// <remarks>Strings are encoded chunk by chunk straight from the column (a first pass measures the widest), so writing a
/// table never holds a byte copy of every string.</remarks>
internal sealed class FitsColumnEncoder
{
    private FitsColumnEncoder(Column column, char code, int width, long? nullValue)
    {
        Column = column;
        Code = code;
        Width = width;
        Null = nullValue;
    }

    public Column Column { get; }

    /// <summary>The TFORM type code written.</summary>
    public char Code { get; }

    /// <summary>Bytes per row.</summary>
    public int Width { get; }

    /// <summary>TNULLn value, or null when the column has no missing values or is not an integer column.</summary>
    public long? Null { get; }

    public string Tform => Code == 'A' ? Width + "A" : Code.ToString();

    public static FitsColumnEncoder Create(Column column)
    {
        switch (column)
        {
            case Column<double> c: return new(c, 'D', 8, null);
            case Column<float> c: return new(c, 'E', 4, null);
            case Column<bool> c: return new(c, 'L', 1, null);
            case Column<string> c:
                {
                    int width = 1;
                    for (int i = 0; i < c.Length; i++)
                        if (!c.IsMissing(i)) width = Math.Max(width, Encoding.UTF8.GetByteCount(c.Values[i]));
                    return new(c, 'A', width, null);
                }
            case Utf8Column u:
                {
                    int width = 1;
                    for (int i = 0; i < u.Length; i++)
                        if (!u.IsMissing(i)) width = Math.Max(width, u.Utf8(i).Length);
                    return new(u, 'A', width, null);
                }
            default:
                {
                    var (code, width, tnull) = FitsNullValue.Choose(column);
                    return new(column, code, width, tnull);
                }
        }
    }

    /// <summary>Writes rows [firstRow, firstRow + count) into <paramref name="chunk"/> at <paramref name="offset"/> within each row.</summary>
    public void Encode(Span<byte> chunk, int rowBytes, int offset, int firstRow, int count)
    {
        int off = offset;
        switch (Column)
        {
            case Column<double> c:
                {
                    var v = c.Values.AsSpan(firstRow, count);
                    var m = c.Missing;
                    for (int r = 0; r < v.Length; r++, off += rowBytes)
                        BinaryPrimitives.WriteDoubleBigEndian(chunk.Slice(off, 8), m is not null && m[firstRow + r] ? double.NaN : v[r]);
                    break;
                }
            case Column<float> c:
                {
                    var v = c.Values.AsSpan(firstRow, count);
                    var m = c.Missing;
                    for (int r = 0; r < v.Length; r++, off += rowBytes)
                        BinaryPrimitives.WriteSingleBigEndian(chunk.Slice(off, 4), m is not null && m[firstRow + r] ? float.NaN : v[r]);
                    break;
                }
            case Column<bool> c:
                for (int r = 0; r < count; r++, off += rowBytes)
                    chunk[off] = c.IsMissing(firstRow + r) ? (byte)0 : c.Values[firstRow + r] ? (byte)'T' : (byte)'F';
                break;
            case Column<string> c:
                for (int r = 0; r < count; r++, off += rowBytes)
                {
                    var field = chunk.Slice(off, Width);
                    if (c.IsMissing(firstRow + r)) { field.Clear(); continue; }
                    int n = Encoding.UTF8.GetBytes(c.Values[firstRow + r], field);
                    field[n..].Fill((byte)' ');
                }
                break;
            case Utf8Column u:
                for (int r = 0; r < count; r++, off += rowBytes)
                {
                    var field = chunk.Slice(off, Width);
                    if (u.IsMissing(firstRow + r)) { field.Clear(); continue; }
                    var bytes = u.Utf8(firstRow + r);
                    bytes.CopyTo(field);
                    field[bytes.Length..].Fill((byte)' ');
                }
                break;
            default:
                EncodeInteger(chunk, rowBytes, off, firstRow, count);
                break;
        }
    }

    private void EncodeInteger(Span<byte> chunk, int rowBytes, int off, int firstRow, int count)
    {
        long nul = Null ?? 0;
        for (int r = 0; r < count; r++, off += rowBytes)
        {
            int row = firstRow + r;
            long v = Column.IsMissing(row) ? nul : FitsNullValue.RawAt(Column, row);
            switch (Code)
            {
                case 'K': BinaryPrimitives.WriteInt64BigEndian(chunk.Slice(off, 8), v); break;
                case 'J': BinaryPrimitives.WriteInt32BigEndian(chunk.Slice(off, 4), (int)v); break;
                case 'I': BinaryPrimitives.WriteInt16BigEndian(chunk.Slice(off, 2), (short)v); break;
                default: chunk[off] = (byte)v; break;
            }
        }
    }
}
