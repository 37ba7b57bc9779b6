using Photometallicity.Catalogues;
using Photometallicity.Errors;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Fits;

/// <summary>Malformed files give an <see cref="InputException"/> (exit code 2) naming the file and what is wrong.</summary>
public class FitsHostileInputTest : IDisposable
{
    private readonly TempDir _dir = new();

    public void Dispose() => _dir.Dispose();

    private string Path => _dir.File("bad.fits");

    private static readonly string[] OneDouble = [FitsBytes.Card("TTYPE1", "'x'"), FitsBytes.Card("TFORM1", "'D'")];

    private InputException Fails(FitsBytes file, ReadOptions? options = null)
    {
        file.WriteTo(Path);
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(Path, options));
        Assert.Equal(2, e.ExitCode);
        Assert.Matches("^" + System.Text.RegularExpressions.Regex.Escape(Path) + "[:,] ", e.Message);
        return e;
    }

    private static FitsBytes Table(string[] tableHeader, byte[] data) =>
        new FitsBytes().Header(FitsBytes.EmptyPrimary()).Header(tableHeader).Data(data);

    [Fact]
    public void Read_NotFits()
    {
        File.WriteAllText(Path, "id,ra,dec\n1,2,3\n");
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(Path));
        Assert.Equal($"{Path}: not a FITS file: the first header card is not 'SIMPLE  =                    T' (FITS Standard 4.0, sect. 4.4.1.1)", e.Message);
    }

    [Fact]
    public void Read_SimpleFalse_IsNotFits()
    {
        var e = Fails(new FitsBytes().Header([FitsBytes.Card("SIMPLE", "F"), FitsBytes.Card("BITPIX", "8"), FitsBytes.Card("NAXIS", "0")]));
        Assert.Contains("not a FITS file", e.Message);
    }

    [Fact]
    public void Read_MissingEndCard()
    {
        var e = Fails(new FitsBytes().Header(FitsBytes.EmptyPrimary(), end: false));
        Assert.Equal($"{Path}: the header of HDU 0 has no END card before the end of the file (byte 2880)", e.Message);
    }

    [Fact]
    public void Read_MissingEndCardInExtension()
    {
        var e = Fails(new FitsBytes().Header(FitsBytes.EmptyPrimary()).Header(FitsBytes.TableHeader(8, 1, 1, OneDouble), end: false));
        Assert.Contains("the header of HDU 1 has no END card", e.Message);
    }

    [Fact]
    public void Read_TruncatedTable()
    {
        var e = Fails(Table(FitsBytes.TableHeader(8, 1000, 1, OneDouble), FitsBytes.BigEndian(1.0, 2.0)));
        Assert.Equal($"{Path}: the table is truncated: NAXIS2 = 1000 rows of NAXIS1 = 8 bytes need 8000 bytes of data from byte 5760, but only 2880 are present", e.Message);
    }

    [Fact]
    public void Read_Naxis1InconsistentWithTforms()
    {
        var e = Fails(Table(FitsBytes.TableHeader(12, 1, 2, [.. OneDouble, FitsBytes.Card("TTYPE2", "'n'"), FitsBytes.Card("TFORM2", "'I'")]), new byte[12]));
        Assert.Equal($"{Path}: NAXIS1 = 12 bytes per row, but the TFORMn formats add up to 10 bytes", e.Message);
    }

    [Theory]
    [InlineData("'Z'")]
    [InlineData("'12'")]
    [InlineData("''")]
    public void Read_BadTform(string tform)
    {
        var e = Fails(Table(FitsBytes.TableHeader(8, 1, 1, FitsBytes.Card("TTYPE1", "'x'"), FitsBytes.Card("TFORM1", tform)), new byte[8]));
        Assert.Contains("column 'x': TFORM1 = '", e.Message);
        Assert.Contains("is not a valid binary-table format", e.Message);
    }

    [Theory]
    [InlineData("16X", 2, "bit-array (X)")]
    [InlineData("C", 8, "complex (C)")]
    [InlineData("M", 16, "double complex (M)")]
    [InlineData("PJ(5)", 8, "variable-length array (P)")]
    [InlineData("QD(5)", 16, "variable-length array (Q)")]
    [InlineData("2000E", 8000, "numeric vector (more than 1000 elements)")]
    public void Read_UnsupportedTform_NamesColumnAndFormat(string tform, int width, string kind)
    {
        var e = Fails(Table(FitsBytes.TableHeader(width, 0, 1, FitsBytes.Card("TTYPE1", "'flux'"), FitsBytes.Card("TFORM1", $"'{tform}'")), []));
        Assert.Equal($"{Path}, column 'flux': TFORM1 = '{tform}': {kind} columns are not supported (supported: L, B, I, J, K, E, D, rA and numeric vectors rB..rD)", e.Message);
    }

    [Fact]
    public void Read_NoTableExtension()
    {
        var e = Fails(new FitsBytes().Header(FitsBytes.EmptyPrimary())
            .Header([FitsBytes.Card("XTENSION", "'IMAGE'"), FitsBytes.Card("BITPIX", "8"), FitsBytes.Card("NAXIS", "0"), FitsBytes.Card("EXTNAME", "'SCI'")]));
        Assert.Equal($"{Path}: no BINTABLE extension in the file; the HDUs found are: 0 primary, 1 IMAGE 'SCI'", e.Message);
    }

    [Fact]
    public void Read_PrimaryOnly_NoTable()
    {
        var e = Fails(new FitsBytes().Header(FitsBytes.EmptyPrimary()));
        Assert.Equal($"{Path}: no BINTABLE extension in the file; the HDUs found are: 0 primary", e.Message);
    }

    [Fact]
    public void Read_TrailingRecordsAfterLastHdu_EndTheWalk()
    {
        var e = Fails(new FitsBytes().Header(FitsBytes.EmptyPrimary()).Data(new byte[2880]));
        Assert.Equal($"{Path}: no BINTABLE extension in the file; the HDUs found are: 0 primary", e.Message);
    }

    [Fact]
    public void Read_UnknownExtension_ListsExtnames()
    {
        var file = new FitsBytes().Header(FitsBytes.EmptyPrimary())
            .Header(FitsBytes.TableHeader(8, 0, 1, [.. OneDouble, FitsBytes.Card("EXTNAME", "'STARS'")]))
            .Header(FitsBytes.TableHeader(8, 0, 1, [.. OneDouble, FitsBytes.Card("EXTNAME", "'STANDARDS'")]));
        var e = Fails(file, new ReadOptions { Extension = "GALAXIES" });
        Assert.Equal($"{Path}: no BINTABLE extension with EXTNAME 'GALAXIES'; the EXTNAMEs found are: 'STARS' (BINTABLE), 'STANDARDS' (BINTABLE)", e.Message);
    }

    [Fact]
    public void Read_DuplicateColumnNames()
    {
        var e = Fails(Table(FitsBytes.TableHeader(16, 1, 2, [.. OneDouble, FitsBytes.Card("TTYPE2", "'x'"), FitsBytes.Card("TFORM2", "'D'")]), new byte[16]));
        Assert.Equal($"{Path}, column 'x': column name 'x' occurs twice (TTYPE1 and TTYPE2)", e.Message);
    }

    [Fact]
    public void Read_VectorExpansionCollidingWithAColumn_IsDuplicate()
    {
        var e = Fails(Table(FitsBytes.TableHeader(24, 1, 2, [FitsBytes.Card("TTYPE1", "'x'"), FitsBytes.Card("TFORM1", "'2D'"),
            FitsBytes.Card("TTYPE2", "'x_1'"), FitsBytes.Card("TFORM2", "'D'")]), new byte[24]));
        Assert.Contains("column name 'x_1' occurs twice (TTYPE1 and TTYPE2)", e.Message);
    }

    [Theory]
    [InlineData("NAXIS2", "'many'", "keyword NAXIS2 has the value 'many', which is not an integer")]
    [InlineData("NAXIS2", "1.5", "keyword NAXIS2 has the value '1.5', which is not an integer")]
    [InlineData("TSCAL1", "'two'", "keyword TSCAL1 has the value 'two', which is not a number")]
    [InlineData("TNULL1", "abc", "keyword TNULL1 has the value 'abc', which is not an integer")]
    public void Read_UnreadableNumbersInCards(string key, string value, string expected)
    {
        var cards = FitsBytes.TableHeader(4, 1, 1, FitsBytes.Card("TTYPE1", "'n'"), FitsBytes.Card("TFORM1", "'J'"))
            .Select(c => c.StartsWith(key.PadRight(8)) ? FitsBytes.Card(key, value) : c).ToList();
        if (!cards.Any(c => c.StartsWith(key.PadRight(8)))) cards.Add(FitsBytes.Card(key, value));
        var e = Fails(Table([.. cards], new byte[4]));
        Assert.Equal($"{Path}: HDU 1: {expected}", e.Message);
    }

    [Fact]
    public void Read_MissingRequiredKeyword()
    {
        var cards = FitsBytes.TableHeader(8, 1, 1, OneDouble).Where(c => !c.StartsWith("TFIELDS")).ToArray();
        var e = Fails(Table(cards, new byte[8]));
        Assert.Equal($"{Path}: HDU 1: the required keyword TFIELDS is missing", e.Message);
    }

    [Fact]
    public void Read_UnclosedString()
    {
        var e = Fails(Table([.. FitsBytes.TableHeader(8, 1, 1, OneDouble), FitsBytes.Raw("OBJECT  = 'never closed")], new byte[8]));
        Assert.Equal($"{Path}: HDU 1: the string value of keyword OBJECT has no closing quote", e.Message);
    }

    [Fact]
    public void Read_HugeImageBeforeTable_IsTruncatedHdu()
    {
        var e = Fails(new FitsBytes()
            .Header([FitsBytes.Card("SIMPLE", "T"), FitsBytes.Card("BITPIX", "-64"), FitsBytes.Card("NAXIS", "2"), FitsBytes.Card("NAXIS1", "100000"), FitsBytes.Card("NAXIS2", "100000")]));
        Assert.Equal($"{Path}: the file ends inside the data of HDU 0: it needs 80000000000 bytes of data from byte 2880 but the file has 2880 bytes", e.Message);
    }

    [Fact]
    public void Read_BadLogicalByte_NamesRowAndColumn()
    {
        var e = Fails(Table(FitsBytes.TableHeader(1, 2, 1, FitsBytes.Card("TTYPE1", "'ok'"), FitsBytes.Card("TFORM1", "'L'")), [(byte)'T', (byte)'?']));
        Assert.Equal($"{Path}, row 2, column 'ok': logical value byte 0x3F at row 2 is not 'T', 'F' or 0", e.Message);
    }

    [Fact]
    public void Read_AsciiTableRequestedByName()
    {
        var e = Fails(new FitsBytes().Header(FitsBytes.EmptyPrimary()).Header([FitsBytes.Card("XTENSION", "'TABLE'"), FitsBytes.Card("BITPIX", "8"),
            FitsBytes.Card("NAXIS", "2"), FitsBytes.Card("NAXIS1", "0"), FitsBytes.Card("NAXIS2", "0"), FitsBytes.Card("PCOUNT", "0"), FitsBytes.Card("GCOUNT", "1"),
            FitsBytes.Card("TFIELDS", "0"), FitsBytes.Card("EXTNAME", "'OLD'")]), new ReadOptions { Extension = "old" });
        Assert.Equal($"{Path}: HDU 1 (EXTNAME 'OLD') is an ASCII TABLE extension, which is not supported; convert it to a BINTABLE", e.Message);
    }

    [Fact]
    public void Read_NegativeOrWrongStructuralValues()
    {
        var cards = FitsBytes.TableHeader(8, 1, 1, OneDouble).Select(c => c.StartsWith("NAXIS2") ? FitsBytes.Card("NAXIS2", "-3") : c).ToArray();
        Assert.Contains("keyword NAXIS2 = -3 is not allowed", Fails(Table(cards, new byte[8])).Message);
        cards = FitsBytes.TableHeader(8, 1, 1, OneDouble).Select(c => c.StartsWith("BITPIX") ? FitsBytes.Card("BITPIX", "16") : c).ToArray();
        Assert.Contains("keyword BITPIX = 16 is not allowed (a BINTABLE must have BITPIX = 8)", Fails(Table(cards, new byte[8])).Message);
    }

    [Fact]
    public void Read_EndlessHeader_IsRejectedWithoutReadingEverything()
    {
        var cards = Enumerable.Repeat(FitsBytes.Raw("HISTORY filler"), FitsHduReaderMaxCards + 100).Prepend(FitsBytes.Card("SIMPLE", "T"));
        var e = Fails(new FitsBytes().Header(cards, end: false));
        Assert.Equal($"{Path}: the header of HDU 0 has more than {FitsHduReaderMaxCards} cards and no END card; the file is damaged or not FITS", e.Message);
    }

    private const int FitsHduReaderMaxCards = Photometallicity.Catalogues.Fits.FitsHduReader.MaxCards;

    [Fact]
    public void Cli_Convert_HostileFitsExitsWith2()
    {
        File.WriteAllBytes(Path, new byte[5000]);
        var r = CliRun.Invoke("convert", Path, _dir.File("out.fits"));
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("not a FITS file", r.Error);
        Assert.False(File.Exists(_dir.File("out.fits")));
    }

    [Fact]
    public void Write_NonAsciiColumnName_IsInputError()
    {
        var t = new Table([new Column<double>("Δmag", [1.0])], "in.csv");
        var e = Assert.Throws<InputException>(() => CatalogueIO.Write(t, _dir.File("o.fits")));
        Assert.Equal("in.csv, column 'Δmag': column name 'Δmag' has characters outside printable ASCII, which a FITS header cannot hold", e.Message);
        Assert.Empty(_dir.Files());
    }
}
