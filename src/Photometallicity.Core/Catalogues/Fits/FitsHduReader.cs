using System.Globalization;
using System.Text;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues.Fits;

/// <summary>Where one HDU sits in the file: its header, and the offset and padded length of its data.</summary>
internal sealed record FitsHdu(FitsHeader Header, long DataStart, long DataBytes)
{
    public const int BlockSize = 2880;

    /// <summary>Offset of the next HDU: the data rounded up to whole 2880-byte blocks (sect. 3.3.2).</summary>
    public long NextHduStart => DataStart + Padded(DataBytes);

    public static long Padded(long bytes) => (bytes + BlockSize - 1) / BlockSize * BlockSize;
}

/// <summary>
/// Walks the HDUs of a FITS file: reads each header in 2880-byte blocks up to its END card and works out the
/// size of its data from BITPIX, NAXISn, PCOUNT and GCOUNT (FITS Standard 4.0, sect. 4.4.1; the data-size equations),
/// so that image extensions and random groups are skipped correctly.
/// </summary>
internal static class FitsHduReader
{
    /// <summary>A header longer than this (8 MB of cards) without an END card is taken as a damaged file.</summary>
    public const int MaxCards = 100_000;

    /// <summary>
    /// Reads the header starting at <paramref name="start"/>; null when the file ends there or what follows is not an
    /// extension (a block not starting with XTENSION).
    /// </summary>
    public static FitsHdu? ReadAt(Stream stream, long start, int hduIndex, string file)
    {
        long length = stream.Length;
        if (start >= length) return null;
        stream.Position = start;
        var block = new byte[FitsHdu.BlockSize];
        var text = new StringBuilder();
        int cards = 0;
        long position = start;
        while (true)
        {
            int n = ReadFully(stream, block);
            if (n < FitsHdu.BlockSize)
            {
                if (hduIndex == 0 && cards == 0) CheckSimple(block.AsSpan(0, n), file);
                throw new InputException(Format(FitsMessages.NoEndCard, hduIndex, length), file);
            }
            position += n;
            string chunk = Encoding.Latin1.GetString(block);
            if (hduIndex == 0 && cards == 0) CheckSimple(block, file);
            // After the last HDU a file may hold other records (sect. 3.5); anything not starting with XTENSION ends the walk.
            if (hduIndex > 0 && cards == 0 && !chunk.StartsWith("XTENSION", StringComparison.Ordinal)) return null;
            for (int c = 0; c < 36; c++)
            {
                if (string.CompareOrdinal(chunk, c * 80, "END     ", 0, 8) == 0 && chunk.AsSpan(c * 80 + 8, 72).Trim(' ').IsEmpty)
                {
                    text.Append(chunk, 0, c * 80);
                    cards += c;
                    var header = FitsHeader.Parse(text.ToString(), cards, hduIndex, file);
                    long dataBytes = DataBytes(header, hduIndex == 0);
                    return new FitsHdu(header, position, dataBytes);
                }
            }
            text.Append(chunk);
            cards += 36;
            if (cards > MaxCards) throw new InputException(Format(FitsMessages.HeaderTooLong, hduIndex, MaxCards), file);
        }
    }

    private static void CheckSimple(ReadOnlySpan<byte> firstBlock, string file)
    {
        if (firstBlock.Length < 80) throw new InputException(FitsMessages.NotFits, file);
        var card = FitsCard.Parse(Encoding.Latin1.GetString(firstBlock[..80]));
        if (card is null || card.Keyword != "SIMPLE" || card.Value != "T") throw new InputException(FitsMessages.NotFits, file);
    }

    /// <summary>|BITPIX|/8 x GCOUNT x (PCOUNT + NAXIS1 x ... x NAXISm); random groups leave NAXIS1 (= 0) out.</summary>
    private static long DataBytes(FitsHeader h, bool primary)
    {
        long bitpix = h.RequireLong("BITPIX");
        if (bitpix is not (8 or 16 or 32 or 64 or -32 or -64))
            throw h.Error(FitsMessages.BadKeywordValue, h.HduIndex, "BITPIX", bitpix, "allowed: 8, 16, 32, 64, -32, -64");
        long naxis = h.RequireLong("NAXIS");
        if (naxis is < 0 or > 999) throw h.Error(FitsMessages.BadKeywordValue, h.HduIndex, "NAXIS", naxis, "allowed: 0 to 999");
        if (naxis == 0) return 0;
        bool groups = primary && h.GetString("GROUPS") == "T" && h.GetLong("NAXIS1") == 0;
        long product = 1;
        try
        {
            for (int i = groups ? 2 : 1; i <= naxis; i++)
            {
                long len = h.RequireLong("NAXIS" + i.ToString(CultureInfo.InvariantCulture));
                if (len < 0) throw h.Error(FitsMessages.BadKeywordValue, h.HduIndex, "NAXIS" + i, len, "must not be negative");
                product = checked(product * len);
            }
            long pcount = primary && !groups ? 0 : h.GetLong("PCOUNT") ?? 0;
            long gcount = primary && !groups ? 1 : h.GetLong("GCOUNT") ?? 1;
            if (pcount < 0) throw h.Error(FitsMessages.BadKeywordValue, h.HduIndex, "PCOUNT", pcount, "must not be negative");
            if (gcount < 0) throw h.Error(FitsMessages.BadKeywordValue, h.HduIndex, "GCOUNT", gcount, "must not be negative");
            return checked(Math.Abs(bitpix) / 8 * gcount * (pcount + product));
        }
        catch (OverflowException)
        {
            throw h.Error(FitsMessages.BadKeywordValue, h.HduIndex, "NAXISn", "(product)", "the data size overflows 64 bits");
        }
    }

    public static int ReadFully(Stream stream, Span<byte> buffer)
    {
        int total = 0;
        while (total < buffer.Length)
        {
            int n = stream.Read(buffer[total..]);
            if (n == 0) break;
            total += n;
        }
        return total;
    }

    private static string Format(string format, params object?[] args) => string.Format(CultureInfo.InvariantCulture, format, args);
}
