using System.Globalization;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// The integer and floating-point syntax of header values (FITS Standard 4.0, sect. 4.2.3 and 4.2.4):
/// an optional sign, digits, an optional decimal point and fraction, an optional exponent introduced by E or D.
/// </summary>
internal static class FitsNumberSyntax
{
    public static bool IsInteger(ReadOnlySpan<char> s)
    {
        int i = s.Length > 0 && (s[0] == '+' || s[0] == '-') ? 1 : 0;
        if (i == s.Length) return false;
        for (; i < s.Length; i++) if (!char.IsAsciiDigit(s[i])) return false;
        return true;
    }

    public static bool IsFloat(ReadOnlySpan<char> s)
    {
        int i = s.Length > 0 && (s[0] == '+' || s[0] == '-') ? 1 : 0;
        int digits = 0;
        while (i < s.Length && char.IsAsciiDigit(s[i])) { i++; digits++; }
        bool point = false;
        if (i < s.Length && s[i] == '.')
        {
            point = true;
            i++;
            while (i < s.Length && char.IsAsciiDigit(s[i])) { i++; digits++; }
        }
        if (digits == 0) return false;
        if (i == s.Length) return point;
        if (s[i] is not ('E' or 'e' or 'D' or 'd')) return false;
        i++;
        if (i < s.Length && (s[i] == '+' || s[i] == '-')) i++;
        int exp = 0;
        while (i < s.Length && char.IsAsciiDigit(s[i])) { i++; exp++; }
        return exp > 0 && i == s.Length;
    }

    /// <summary>Parses a header float (D exponents allowed); false when the text is not FITS number syntax.</summary>
    public static bool TryParseDouble(string s, out double value)
    {
        value = 0;
        if (!IsInteger(s) && !IsFloat(s)) return false;
        return double.TryParse(s.Replace('D', 'E').Replace('d', 'e'), NumberStyles.Float, CultureInfo.InvariantCulture, out value);
    }

    /// <summary>Parses a header number exactly (for the unsigned-integer TZERO values); false if not representable.</summary>
    public static bool TryParseDecimal(string s, out decimal value)
    {
        value = 0;
        if (!IsInteger(s) && !IsFloat(s)) return false;
        return decimal.TryParse(s.Replace('D', 'E').Replace('d', 'e'), NumberStyles.Float, CultureInfo.InvariantCulture, out value);
    }
}
