using System.Globalization;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// Writes a <see cref="Table"/> as a FITS file (FITS Standard 4.0, IAU FITS Working Group 2018): an empty primary HDU
/// and one BINTABLE extension named <see cref="WriteOptions.ExtensionName"/>. Column types map one to one onto
/// TFORM codes (see <see cref="FitsColumnEncoder"/>); units go to TUNITn, descriptions to TCOMMn, table metadata to
/// header cards (rules in <see cref="FitsHeaderBuilder"/>). Rows are encoded in chunks of about 4 MB.
/// </summary>
public static class FitsTableWriter
{
    private const int ChunkBytes = 1 << 22;

    public static void Write(Table table, Stream stream, WriteOptions options)
    {
        string extname = options.ExtensionName;
        if (extname.Trim().Length == 0 || !FitsKeywords.IsPrintableAscii(extname))
            throw new InputException(string.Format(CultureInfo.InvariantCulture, FitsMessages.ExtNameInvalid, extname), table.Source);

        var encoders = table.Columns.Select(FitsColumnEncoder.Create).ToArray();
        var offsets = new int[encoders.Length];
        long rowBytes = 0;
        for (int i = 0; i < encoders.Length; i++)
        {
            offsets[i] = (int)Math.Min(rowBytes, int.MaxValue);
            rowBytes += encoders[i].Width;
        }
        if (rowBytes > int.MaxValue / 4)
            throw new InputException($"a row would be {rowBytes} bytes wide, more than this writer supports ({int.MaxValue / 4})", table.Source);

        stream.Write(FitsHeaderBuilder.Primary());
        stream.Write(FitsHeaderBuilder.Extension(table, encoders, (int)rowBytes, extname));

        int rb = (int)rowBytes;
        long dataBytes = rowBytes * table.RowCount;
        if (rb > 0 && table.RowCount > 0)
        {
            int rowsPerChunk = Math.Max(1, ChunkBytes / rb);
            var buffer = new byte[(long)Math.Min(rowsPerChunk, table.RowCount) * rb];
            for (int first = 0; first < table.RowCount; first += rowsPerChunk)
            {
                int count = Math.Min(rowsPerChunk, table.RowCount - first);
                var chunk = buffer.AsSpan(0, count * rb);
                for (int i = 0; i < encoders.Length; i++) encoders[i].Encode(chunk, rb, offsets[i], first, count);
                stream.Write(chunk);
            }
        }
        long padding = FitsHdu.Padded(dataBytes) - dataBytes;
        if (padding > 0) stream.Write(new byte[padding]);
    }
}
