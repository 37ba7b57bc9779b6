namespace Photometallicity.Catalogues.Fits;

/// <summary>What kind of value a header card holds (FITS Standard 4.0, sect. 4.2).</summary>
internal enum FitsValueKind
{
    /// <summary>COMMENT, HISTORY, blank keyword, or any card without the "= " value indicator.</summary>
    Commentary,
    /// <summary>The value field is empty (undefined value, sect. 4.2.7).</summary>
    Undefined,
    Logical,
    Integer,
    Float,
    String,
    /// <summary>Complex, or text that follows no value syntax; kept as written.</summary>
    Other,
}

/// <summary>
/// One parsed 80-character header card: keyword, value and comment. <see cref="Value"/> is the unquoted text for
/// strings (quotes undone, trailing spaces removed), "T"/"F" for logicals, the number as written otherwise, and the
/// free text for commentary cards. Long strings spread over CONTINUE cards are joined by <see cref="FitsHeader"/>.
/// </summary>
internal sealed record FitsCard(string Keyword, FitsValueKind Kind, string Value, string? Comment, bool IsHierarch = false)
{
    /// <summary>
    /// Parses one card image. Fixed and free format are both accepted (sect. 4.1.2.3, 4.2); the HIERARCH
    /// convention (ESO, registered FITS convention) is read as a keyword of any length. Returns null when a string
    /// value has no closing quote.
    /// </summary>
    public static FitsCard? Parse(ReadOnlySpan<char> card)
    {
        string keyword = card[..8].TrimEnd().ToString();
        ReadOnlySpan<char> valueField;
        bool hierarch = false;
        if (keyword == "HIERARCH")
        {
            var rest = card[8..];
            int eq = rest.IndexOf('=');
            if (eq < 0) return new FitsCard(keyword, FitsValueKind.Commentary, rest.TrimEnd().ToString(), null);
            keyword = rest[..eq].Trim().ToString();
            valueField = rest[(eq + 1)..];
            hierarch = true;
        }
        else if (keyword == "CONTINUE")
        {
            valueField = card[8..];
        }
        else if (card[8] == '=' && card[9] == ' ' && keyword is not ("COMMENT" or "HISTORY" or ""))
        {
            valueField = card[10..];
        }
        else
        {
            return new FitsCard(keyword, FitsValueKind.Commentary, card[8..].TrimEnd().ToString(), null);
        }

        var v = valueField.TrimStart(' ');
        if (v.Length > 0 && v[0] == '\'')
        {
            var text = new System.Text.StringBuilder();
            int i = 1;
            while (true)
            {
                if (i >= v.Length) return null;
                if (v[i] == '\'')
                {
                    if (i + 1 < v.Length && v[i + 1] == '\'') { text.Append('\''); i += 2; continue; }
                    i++;
                    break;
                }
                text.Append(v[i++]);
            }
            return new FitsCard(keyword, FitsValueKind.String, text.ToString().TrimEnd(' '), CommentAfter(v[i..]), hierarch);
        }

        int slash = v.IndexOf('/');
        var token = (slash < 0 ? v : v[..slash]).Trim();
        string? comment = slash < 0 ? null : v[(slash + 1)..].Trim().ToString();
        if (comment is { Length: 0 }) comment = null;
        return new FitsCard(keyword, Classify(token), token.ToString(), comment, hierarch);
    }

    private static string? CommentAfter(ReadOnlySpan<char> rest)
    {
        int slash = rest.IndexOf('/');
        if (slash < 0) return null;
        var c = rest[(slash + 1)..].Trim();
        return c.Length == 0 ? null : c.ToString();
    }

    private static FitsValueKind Classify(ReadOnlySpan<char> token)
    {
        if (token.Length == 0) return FitsValueKind.Undefined;
        if (token is "T" or "F") return FitsValueKind.Logical;
        if (FitsNumberSyntax.IsInteger(token)) return FitsValueKind.Integer;
        if (FitsNumberSyntax.IsFloat(token)) return FitsValueKind.Float;
        return FitsValueKind.Other;
    }
}
