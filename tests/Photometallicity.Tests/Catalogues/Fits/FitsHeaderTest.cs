using Photometallicity.Catalogues;
using Photometallicity.Catalogues.Fits;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Fits;

/// <summary>Card parsing and formatting against the rules of FITS Standard 4.0, sect. 4.1 and 4.2.</summary>
public class FitsHeaderTest
{
    [Theory]
    [InlineData("NAXIS1  =                  123 / bytes per row", "NAXIS1", "Integer", "123", "bytes per row")]
    [InlineData("EXPTIME = 1.5D+02", "EXPTIME", "Float", "1.5D+02", null)]
    [InlineData("SIMPLE  =                    T", "SIMPLE", "Logical", "T", null)]
    [InlineData("OBJECT  = 'It''s a / test  ' / comment with ' quote", "OBJECT", "String", "It's a / test", "comment with ' quote")]
    [InlineData("EMPTY   = ''", "EMPTY", "String", "", null)]
    [InlineData("LEAD    = '  x'", "LEAD", "String", "  x", null)]
    [InlineData("UNDEF   =                      / no value", "UNDEF", "Undefined", "", "no value")]
    [InlineData("CPLX    = (1.0, 2.0)", "CPLX", "Other", "(1.0, 2.0)", null)]
    [InlineData("COMMENT   = not a value", "COMMENT", "Commentary", "  = not a value", null)]
    [InlineData("HISTORY made by hand", "HISTORY", "Commentary", "made by hand", null)]
    [InlineData("NOVALUE   no indicator", "NOVALUE", "Commentary", "  no indicator", null)]
    [InlineData("HIERARCH ESO DET CHIP = 'CCD 1' / chip", "ESO DET CHIP", "String", "CCD 1", "chip")]
    public void Parse_CardImages(string image, string keyword, string kind, string value, string? comment)
    {
        var card = FitsCard.Parse(image.PadRight(80))!;
        Assert.Equal((keyword, kind, value, comment), (card.Keyword, card.Kind.ToString(), card.Value, card.Comment));
    }

    [Fact]
    public void Parse_UnclosedString_IsNull() => Assert.Null(FitsCard.Parse("OBJECT  = 'no end".PadRight(80)));

    [Theory]
    [InlineData("12", true, false)]
    [InlineData("-3", true, false)]
    [InlineData("1.", false, true)]
    [InlineData(".5", false, true)]
    [InlineData("1E5", false, true)]
    [InlineData("-1.25d-3", false, true)]
    [InlineData("1E", false, false)]
    [InlineData("abc", false, false)]
    [InlineData("NaN", false, false)]
    public void NumberSyntax_IntegerAndFloat(string text, bool integer, bool isFloat)
    {
        Assert.Equal(integer, FitsNumberSyntax.IsInteger(text));
        Assert.Equal(isFloat, FitsNumberSyntax.IsFloat(text));
    }

    [Fact]
    public void Header_ContinueCardsJoinLongStrings()
    {
        string cards = FitsBytes.Raw("LONG    = 'first part &'") + FitsBytes.Raw("CONTINUE  'second&' / note") + FitsBytes.Raw("CONTINUE  ' third'");
        var h = FitsHeader.Parse(cards, 3, 1, "f.fits");
        Assert.Single(h.Cards);
        Assert.Equal("first part second third", h.GetString("LONG"));
        Assert.Equal("note", h["LONG"]!.Comment);
    }

    [Fact]
    public void CardWriter_FixedFormatColumns()
    {
        var w = new FitsCardWriter();
        w.Integer("NAXIS1", 24, "bytes");
        w.Logical("SIMPLE", true);
        w.String("TFORM1", "D");
        var cards = w.Cards;
        Assert.All(cards, c => Assert.Equal(80, c.Length));
        // Fixed format: integer and logical right-justified to column 30; strings open their quote in column 11
        // and close it no earlier than column 20 (FITS Standard 4.0, sect. 4.2.1.1, 4.2.2, 4.2.3).
        Assert.Equal("NAXIS1  =                   24 / bytes", cards[0].TrimEnd());
        Assert.Equal("SIMPLE  =                    T", cards[1].TrimEnd());
        Assert.Equal("TFORM1  = 'D       '", cards[2].TrimEnd());
    }

    [Fact]
    public void CardWriter_LongStringUsesContinueAndReadsBack()
    {
        var w = new FitsCardWriter();
        string value = string.Concat(Enumerable.Repeat("ab'cd ", 40));
        w.String("LONG", value.TrimEnd());
        Assert.True(w.Cards.Count > 3);
        Assert.All(w.Cards, c => Assert.Equal(80, c.Length));
        Assert.All(w.Cards.Skip(1), c => Assert.StartsWith("CONTINUE  '", c));
        var h = FitsHeader.Parse(string.Concat(w.Cards), w.Cards.Count, 1, "f.fits");
        Assert.Equal(value.TrimEnd(), h.GetString("LONG"));
    }

    [Fact]
    public void Read_DescriptionFromTtypeCommentWhenNoTcomm()
    {
        using var dir = new TempDir();
        string path = new FitsBytes().Header(FitsBytes.EmptyPrimary())
            .Header(FitsBytes.TableHeader(8, 1, 1, FitsBytes.Raw("TTYPE1  = 'ra'                 / right ascension"), FitsBytes.Card("TFORM1", "'D'"),
                FitsBytes.Card("TUNIT1", "'deg'"), FitsBytes.Raw("HISTORY invented"), FitsBytes.Card("CHECKSUM", "'abc'")))
            .Data(FitsBytes.BigEndian(150.25)).WriteTo(dir.File("t.fits"));
        var t = CatalogueIO.Read(path);
        Assert.Equal("right ascension", t["ra"].Description);
        Assert.Equal("deg", t["ra"].Unit);
        Assert.Equal(150.25, t["ra"].GetDouble(0));
        Assert.Equal([("HISTORY", "invented", (string?)null)], t.Metadata);
    }

    [Fact]
    public void Read_SkipsPrimaryImageAndImageExtensionToFirstTable()
    {
        using var dir = new TempDir();
        // Primary image 3 x 2 of 16-bit integers (12 bytes), then an IMAGE extension with PCOUNT/GCOUNT, then the table.
        string path = new FitsBytes()
            .Header([FitsBytes.Card("SIMPLE", "T"), FitsBytes.Card("BITPIX", "16"), FitsBytes.Card("NAXIS", "2"), FitsBytes.Card("NAXIS1", "3"), FitsBytes.Card("NAXIS2", "2")])
            .Data(new byte[12])
            .Header([FitsBytes.Card("XTENSION", "'IMAGE'"), FitsBytes.Card("BITPIX", "-64"), FitsBytes.Card("NAXIS", "1"), FitsBytes.Card("NAXIS1", "400"),
                FitsBytes.Card("PCOUNT", "0"), FitsBytes.Card("GCOUNT", "1"), FitsBytes.Card("EXTNAME", "'SCI'")])
            .Data(new byte[3200])
            .Header(FitsBytes.TableHeader(4, 2, 1, FitsBytes.Card("TTYPE1", "'n'"), FitsBytes.Card("TFORM1", "'J'"), FitsBytes.Card("EXTNAME", "'STARS'")))
            .Data(FitsBytes.BigEndian(7, -8), pad: false) // final padding missing: tolerated
            .WriteTo(dir.File("t.fits"));
        var t = CatalogueIO.Read(path);
        Assert.Equal([7.0, -8.0], t["n"].ToDoubleArray());
        Assert.Equal(ColumnType.Int32, t["n"].Type);
    }
}
