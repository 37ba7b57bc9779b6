using System.Globalization;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// The parsed header of one HDU: its cards in order (long strings already joined from their CONTINUE cards,
/// FITS Standard 4.0 sect. 4.2.1.2), with typed look-ups that raise an <see cref="InputException"/> naming the file,
/// the HDU and the keyword when a required value is missing or unreadable.
/// </summary>
internal sealed class FitsHeader
{
    private readonly Dictionary<string, FitsCard> _first = new(StringComparer.Ordinal);

    public FitsHeader(IReadOnlyList<FitsCard> cards, int hduIndex, string file)
    {
        Cards = cards;
        HduIndex = hduIndex;
        File = file;
        foreach (var c in cards)
            if (c.Kind != FitsValueKind.Commentary) _first.TryAdd(c.Keyword, c);
    }

    public IReadOnlyList<FitsCard> Cards { get; }

    /// <summary>0 for the primary HDU, 1 for the first extension, ...</summary>
    public int HduIndex { get; }

    public string File { get; }

    public FitsCard? this[string keyword] => _first.GetValueOrDefault(keyword);

    public bool Has(string keyword) => _first.ContainsKey(keyword);

    public string? GetString(string keyword) => _first.TryGetValue(keyword, out var c) ? c.Value : null;

    public long RequireLong(string keyword) =>
        GetLong(keyword) ?? throw Error(FitsMessages.MissingKeyword, HduIndex, keyword);

    public long? GetLong(string keyword)
    {
        if (!_first.TryGetValue(keyword, out var c)) return null;
        if (c.Kind == FitsValueKind.Integer && long.TryParse(c.Value, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out long v))
            return v;
        throw Error(FitsMessages.BadNumber, HduIndex, keyword, c.Value, "an integer");
    }

    public double? GetDouble(string keyword)
    {
        if (!_first.TryGetValue(keyword, out var c)) return null;
        if (FitsNumberSyntax.TryParseDouble(c.Value, out double v)) return v;
        throw Error(FitsMessages.BadNumber, HduIndex, keyword, c.Value, "a number");
    }

    public InputException Error(string format, params object?[] args) =>
        new(string.Format(CultureInfo.InvariantCulture, format, args), File);

    /// <summary>Parses the cards of a header (everything before END), joining CONTINUE cards onto long strings.</summary>
    public static FitsHeader Parse(ReadOnlySpan<char> text, int cardCount, int hduIndex, string file)
    {
        var cards = new List<FitsCard>(cardCount);
        for (int i = 0; i < cardCount; i++)
        {
            var image = text.Slice(i * 80, 80);
            var card = FitsCard.Parse(image)
                       ?? throw new InputException(string.Format(CultureInfo.InvariantCulture, FitsMessages.UnclosedString, hduIndex, image[..8].TrimEnd().ToString()), file);
            if (card.Keyword == "CONTINUE" && card.Kind == FitsValueKind.String && cards.Count > 0
                && cards[^1] is { Kind: FitsValueKind.String } prev && prev.Value.EndsWith('&'))
            {
                cards[^1] = prev with { Value = prev.Value[..^1] + card.Value, Comment = card.Comment ?? prev.Comment };
                continue;
            }
            if (card.Keyword == "CONTINUE") continue; // an orphan CONTINUE card carries nothing usable
            cards.Add(card);
        }
        return new FitsHeader(cards, hduIndex, file);
    }
}
