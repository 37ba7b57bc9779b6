using System.Globalization;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// A binary-table field format TFORMn = rTa (FITS Standard 4.0, sect. 7.3.1 and its table of TFORMn data types): repeat count r,
/// data type code T and an optional trailing text a. Widths in bytes per element follow that table.
/// </summary>
internal readonly record struct FitsColumnFormat(long Repeat, char Code)
{
    /// <summary>Bytes one element occupies (X is counted in whole bytes per field, P and Q descriptors 8 and 16).</summary>
    public static int ElementBytes(char code) => code switch
    {
        'L' or 'B' or 'A' => 1,
        'I' => 2,
        'J' or 'E' => 4,
        'K' or 'D' or 'C' or 'P' => 8,
        'M' or 'Q' => 16,
        _ => 0,
    };

    /// <summary>Bytes the whole field occupies in a row.</summary>
    public long FieldBytes => Code == 'X' ? (Repeat + 7) / 8 : Code is 'P' or 'Q' ? (Repeat > 0 ? ElementBytes(Code) : 0) : Repeat * ElementBytes(Code);

    /// <summary>Parses TFORMn; null when the text is not rT[a] with a known type code.</summary>
    public static FitsColumnFormat? Parse(string tform)
    {
        var s = tform.AsSpan().Trim(' ');
        int i = 0;
        while (i < s.Length && char.IsAsciiDigit(s[i])) i++;
        if (i == s.Length) return null;
        long repeat = 1;
        if (i > 0 && !long.TryParse(s[..i], NumberStyles.None, CultureInfo.InvariantCulture, out repeat)) return null;
        if (repeat > int.MaxValue) return null;
        char code = s[i];
        if (ElementBytes(code) == 0 && code != 'X') return null;
        return new FitsColumnFormat(repeat, code);
    }

    /// <summary>The TFORM text for a column written by this project.</summary>
    public override string ToString() => Repeat.ToString(CultureInfo.InvariantCulture) + Code;
}
