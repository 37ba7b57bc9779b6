using System.Globalization;
using System.Text;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// Formats 80-character header cards (FITS Standard 4.0, sect. 4.1 and 4.2): fixed-format values (logical, integer
/// and float right-justified to column 30; strings quoted from column 11, at least 8 characters, quotes doubled),
/// long strings split over CONTINUE cards (sect. 4.2.1.2), keywords longer than 8 characters or in lower case with
/// the HIERARCH convention (ESO; registered FITS convention), COMMENT and HISTORY text split over as many cards as needed.
/// </summary>
internal sealed class FitsCardWriter
{
    private const int CardLength = 80;
    private readonly List<string> _cards = new();

    public IReadOnlyList<string> Cards => _cards;

    public void Logical(string key, bool value, string? comment = null) => Fixed(key, value ? "T" : "F", comment);

    public void Integer(string key, long value, string? comment = null) => Fixed(key, value.ToString(CultureInfo.InvariantCulture), comment);

    /// <summary>A value already in FITS logical, integer or float syntax, written as it is.</summary>
    public void Fixed(string key, string value, string? comment = null)
    {
        string field = value.Length <= 20 ? value.PadLeft(20) : value;
        Add(Append(key.PadRight(8) + "= " + field, comment));
    }

    /// <summary>A string value; text that does not fit one card continues on CONTINUE cards.</summary>
    public void String(string key, string value, string? comment = null)
    {
        string prefix = key.PadRight(8) + "= ";
        value = Sanitize(value);
        string whole = Quote(value, pad: true);
        if (prefix.Length + whole.Length <= CardLength)
        {
            Add(Append(prefix + whole, comment));
            return;
        }
        int i = 0;
        while (true)
        {
            string rest = Escape(value[i..]);
            if (rest.Length <= CardLength - 12)
            {
                Add(Append(prefix + "'" + rest + "'", comment));
                return;
            }
            var piece = new StringBuilder();
            while (i < value.Length)
            {
                int cost = value[i] == '\'' ? 2 : 1;
                if (piece.Length + cost > CardLength - 13) break;
                piece.Append(value[i] == '\'' ? "''" : value[i].ToString());
                i++;
            }
            Add(prefix + "'" + piece + "&'");
            prefix = "CONTINUE  ";
        }
    }

    /// <summary>
    /// HIERARCH card "HIERARCH key = value / comment" on one card; a string value is cut to fit.
    /// Returns false (nothing written) when the key cannot be written this way or a number does not fit.
    /// </summary>
    public bool Hierarch(string key, string value, bool quoted, string? comment = null)
    {
        if (key.Length == 0 || !FitsKeywords.IsPrintableAscii(key) || key.Contains('=') || key.Trim() != key) return false;
        string prefix = "HIERARCH " + key + " = ";
        if (!quoted)
        {
            if (prefix.Length + value.Length > CardLength) return false;
            Add(Append(prefix + value, comment));
            return true;
        }
        value = Sanitize(value);
        int room = CardLength - prefix.Length - 2;
        if (room < 0) return false;
        var q = new StringBuilder();
        foreach (char c in value)
        {
            int cost = c == '\'' ? 2 : 1;
            if (q.Length + cost > room) break;
            q.Append(c == '\'' ? "''" : c.ToString());
        }
        Add(Append(prefix + "'" + q + "'", comment));
        return true;
    }

    /// <summary>COMMENT or HISTORY text, 72 characters per card.</summary>
    public void Commentary(string key, string text)
    {
        text = Sanitize(text);
        if (text.Length == 0) { Add(key); return; }
        for (int i = 0; i < text.Length; i += 72)
            Add(key.PadRight(8) + text.Substring(i, Math.Min(72, text.Length - i)));
    }

    public void End() => Add("END");

    /// <summary>The header as ASCII bytes, padded with spaces to whole 2880-byte blocks (sect. 4.4.1).</summary>
    public byte[] ToBlocks()
    {
        long bytes = FitsHdu.Padded((long)_cards.Count * CardLength);
        var result = new byte[bytes];
        result.AsSpan().Fill((byte)' ');
        for (int i = 0; i < _cards.Count; i++) Encoding.ASCII.GetBytes(_cards[i], result.AsSpan(i * CardLength));
        return result;
    }

    /// <summary>Characters a header cannot hold (outside 0x20-0x7E) become '?'.</summary>
    public static string Sanitize(string text)
    {
        if (FitsKeywords.IsPrintableAscii(text)) return text;
        var sb = new StringBuilder(text.Length);
        foreach (char c in text) sb.Append(c is < ' ' or > '~' ? '?' : c);
        return sb.ToString();
    }

    private static string Escape(string s) => s.Replace("'", "''");

    private static string Quote(string s, bool pad) => "'" + (pad ? Escape(s).PadRight(8) : Escape(s)) + "'";

    private static string Append(string card, string? comment)
    {
        if (string.IsNullOrEmpty(comment)) return card;
        string c = Sanitize(comment);
        if (card.Length < 30) card = card.PadRight(30);
        int room = CardLength - card.Length - 3;
        return room <= 0 ? card : card + " / " + (c.Length <= room ? c : c[..room]);
    }

    private void Add(string card)
    {
        if (card.Length > CardLength) throw new InvalidOperationException("header card longer than 80 characters: " + card);
        _cards.Add(card.PadRight(CardLength));
    }
}
