using Photometallicity.Catalogues;
using Photometallicity.Errors;
using Photometallicity.Tests.Catalogues.Csv;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues;

public class PositionValidationTest
{
    public static TheoryData<string, string, string?, string> Corpus => new()
    {
        { "ra_too_large", "id,ra,dec\n1,10,0\n2,360.5,1\n", "id", "{0}, row 2, column 'ra': RA = 360.5 deg is outside [0, 360)" },
        { "ra_360", "id,ra,dec\n1,360,0\n", "id", "{0}, row 1, column 'ra': RA = 360 deg is outside [0, 360)" },
        { "ra_negative", "id,ra,dec\n1,-0.001,0\n", "id", "{0}, row 1, column 'ra': RA = -0.001 deg is outside [0, 360)" },
        { "dec_too_small", "id,ra,dec\n1,10,-91\n", "id", "{0}, row 1, column 'dec': Dec = -91 deg is outside [-90, 90]" },
        { "ra_nan", "id,ra,dec\n1,10,0\n2,NaN,0\n", "id", "{0}, row 2, column 'ra': RA is missing (empty or NaN); every row needs a position" },
        { "dec_empty", "id,ra,dec\n1,10,\n", null, "{0}, row 1, column 'dec': Dec is missing (empty or NaN); every row needs a position" },
        { "duplicate_id", "id,ra,dec\n1,10,0\n2,11,0\n1,12,0\n", "id", "{0}, row 3, column 'id': id '1' is repeated: rows 1 and 3 both have it" },
        { "duplicate_text_id", "id,ra,dec\nS-1,10,0\nS-2,11,0\nS-2,12,0\n", "id", "{0}, row 3, column 'id': id 'S-2' is repeated: rows 2 and 3 both have it" },
        { "missing_id", "id,ra,dec\nS-1,10,0\n,11,0\n", "id", "{0}, row 2, column 'id': the id is missing; every row needs one" },
        { "ra_not_numeric", "id,ra,dec\n1,10,0\n2,12h30m,0\n", "id", "{0}, row 2, column 'ra': '12h30m' is not a number" },
        { "ra_boolean", "id,ra,dec\n1,true,0\n", "id", "{0}, column 'ra': the column holds true/false values, not numbers" },
        { "no_dec_column", "id,ra,de\n1,10,0\n", "id", "{0}: no column named 'dec'; the columns found are: id, ra, de" },
    };

    [Theory]
    [MemberData(nameof(Corpus))]
    public void Validate_BadPositions_ThrowWithExactMessage(string name, string csv, string? idColumn, string expected)
    {
        using var dir = new TempDir();
        string path = CsvFiles.Write(dir, csv, name + ".csv");
        var table = CatalogueIO.Read(path);
        var e = Assert.Throws<InputException>(() => PositionValidation.Validate(table, "ra", "dec", idColumn));
        Assert.Equal(string.Format(expected, path), e.Message);
        Assert.Equal(2, e.ExitCode);
    }

    [Fact]
    public void Validate_EdgesOfTheRanges_Pass()
    {
        var t = new Table([
            new Column<long>("id", [1, 2, 3, 4]),
            new Column<double>("ra", [0.0, 359.99999999, 180.0, 12.5]),
            new Column<double>("dec", [-90.0, 90.0, 0.0, -0.0]),
        ], "edges.csv");
        PositionValidation.Validate(t, "ra", "dec", "id");
    }

    [Fact]
    public void Validate_DecimalTextColumns_AreAccepted()
    {
        var t = CsvFiles.Read("id,ra,dec\n007,10.5,-3\n008,11,4\n", new ReadOptions { TextColumns = new HashSet<string> { "id", "ra" } });
        PositionValidation.Validate(t, "ra", "dec", "id");
        Assert.Equal([10.5, 11.0], PositionValidation.RequireNumeric(t, "ra"));
    }

    [Fact]
    public void RequireNumeric_MissingColumn_NamesTheConfigKey()
    {
        var t = new Table([new Column<double>("gmag", [1.0])], "broad.csv");
        var e = Assert.Throws<InputException>(() => PositionValidation.RequireNumeric(t, "ra", "broadband.ra"));
        Assert.Equal("broad.csv: no column named 'ra' (asked for by config key 'broadband.ra'); the columns found are: gmag", e.Message);
    }
}
