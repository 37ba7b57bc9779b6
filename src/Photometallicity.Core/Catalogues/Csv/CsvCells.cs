using System.Globalization;
using System.Text;

namespace Photometallicity.Catalogues.Csv;

/// <summary>
/// Classification of one CSV cell from its UTF-8 bytes, without making a string: missing markers,
/// integers, floating-point numbers and booleans, all in the invariant culture.
/// </summary>
internal static class CsvCells
{
    /// <summary>
    /// Empty cells and the words nan and null (any case) mean "no value". A quoted empty cell ("") is
    /// also missing for numeric columns; text columns tell it apart (see <see cref="IsQuotedEmpty"/>).
    /// </summary>
    public static bool IsMissingToken(ReadOnlySpan<byte> cell)
    {
        if (cell.IsEmpty) return true;
        if (cell.Length == 3) return EqualsAsciiIgnoreCase(cell, "nan"u8);
        if (cell.Length == 4) return EqualsAsciiIgnoreCase(cell, "null"u8);
        return false;
    }

    /// <summary>True for a field written as "" (an empty string, not a missing value).</summary>
    public static bool IsQuotedEmpty(ReadOnlySpan<byte> raw)
    {
        raw = raw.Trim(" \t"u8);
        return raw.Length == 2 && raw[0] == (byte)'"' && raw[1] == (byte)'"';
    }

    public static bool TryParseInt64(ReadOnlySpan<byte> cell, out long value) =>
        long.TryParse(cell, NumberStyles.AllowLeadingSign | NumberStyles.AllowLeadingWhite | NumberStyles.AllowTrailingWhite,
            CultureInfo.InvariantCulture, out value);

    public static bool TryParseDouble(ReadOnlySpan<byte> cell, out double value) =>
        double.TryParse(cell, NumberStyles.Float, CultureInfo.InvariantCulture, out value);

    /// <summary>true and false in any case; nothing else (0/1 stay integers, yes/no stay text).</summary>
    public static bool TryParseBoolean(ReadOnlySpan<byte> cell, out bool value)
    {
        if (cell.Length == 4 && EqualsAsciiIgnoreCase(cell, "true"u8)) { value = true; return true; }
        if (cell.Length == 5 && EqualsAsciiIgnoreCase(cell, "false"u8)) { value = false; return true; }
        value = false;
        return false;
    }

    public static string ToText(ReadOnlySpan<byte> cell) => Encoding.UTF8.GetString(cell);

    private static bool EqualsAsciiIgnoreCase(ReadOnlySpan<byte> a, ReadOnlySpan<byte> lowerCase)
    {
        for (int i = 0; i < a.Length; i++)
            if ((a[i] | 0x20) != lowerCase[i]) return false;
        return true;
    }
}
