namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// Which header keywords describe the structure of an HDU (FITS Standard 4.0, sect. 4.4 and 7.3, Appendix C)
/// and are therefore produced by the writer itself rather than carried as table metadata.
/// CHECKSUM and DATASUM are dropped as well: they would be wrong for any file written again.
/// </summary>
internal static class FitsKeywords
{
    private static readonly HashSet<string> Fixed = new(StringComparer.Ordinal)
    {
        "SIMPLE", "XTENSION", "BITPIX", "NAXIS", "PCOUNT", "GCOUNT", "TFIELDS", "EXTEND", "END", "THEAP",
        "EXTNAME", "EXTVER", "EXTLEVEL", "GROUPS", "CONTINUE", "CHECKSUM", "DATASUM", "BLOCKED",
    };

    /// <summary>
    /// Column keywords: prefix followed by the field number (sect. 7.3.2), plus TCOMMn, which the standard does not
    /// define but some table tools use for column descriptions (this project reads and writes it).
    /// </summary>
    private static readonly string[] Indexed =
    [
        "NAXIS", "TTYPE", "TFORM", "TUNIT", "TSCAL", "TZERO", "TNULL", "TDISP", "TDIM", "TBCOL",
        "TDMIN", "TDMAX", "TLMIN", "TLMAX", "TCOMM",
    ];

    public static bool IsStructural(string keyword)
    {
        if (Fixed.Contains(keyword)) return true;
        foreach (var prefix in Indexed)
        {
            if (keyword.Length > prefix.Length && keyword.StartsWith(prefix, StringComparison.Ordinal)
                && keyword.AsSpan(prefix.Length).IndexOfAnyExceptInRange('0', '9') < 0)
                return true;
        }
        return false;
    }

    /// <summary>A standard keyword: 1 to 8 characters from A-Z, 0-9, '-' and '_' (sect. 4.1.2.1).</summary>
    public static bool IsStandardName(string key)
    {
        if (key.Length is 0 or > 8) return false;
        foreach (char c in key)
            if (!(c is >= 'A' and <= 'Z' or >= '0' and <= '9' or '-' or '_')) return false;
        return true;
    }

    /// <summary>Printable ASCII (0x20 to 0x7E), the only characters a header may hold (sect. 4.1.1).</summary>
    public static bool IsPrintableAscii(string text)
    {
        foreach (char c in text)
            if (c is < ' ' or > '~') return false;
        return true;
    }
}
