using Photometallicity.Catalogues;
using Photometallicity.Errors;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Csv;

/// <summary>
/// The bad-input corpus: each file gives an <see cref="InputException"/> with the exact text below, and the
/// convert verb exits with code 2, prints that text, and leaves no output (nor temporary) file behind.
/// </summary>
public class CsvBadInputTest
{
    public static TheoryData<string, string, string> Corpus => new()
    {
        { "ragged_long", "a,b\n1,2\n3,4,5\n", "{0}, row 2: the row has 3 fields but the header has 2 columns" },
        { "ragged_short", "a,b\n1,2\n3,4\n5\n", "{0}, row 3: the row has 1 field but the header has 2 columns" },
        { "empty", "", "{0}: file is empty" },
        { "duplicate_header", "a,b,a\n1,2,3\n", "{0}: header: column 3 repeats the name 'a' of column 1" },
        { "empty_header_name", "a,,c\n1,2,3\n", "{0}: header: column 2 has an empty name" },
        { "comments_only", "# nothing but a comment\n", "{0}: no header row: the first line that is not a '#' comment must name the columns" },
        { "unclosed_quote", "a,b\n1,2\n\"3,4\n5,6\n", "{0}, row 2: malformed CSV: a quoted field that is never closed" },
        { "text_after_quote", "a,b\n\"1\"x,2\n", "{0}, row 1: malformed CSV: text after the closing quote of a quoted field" },
    };

    [Theory]
    [MemberData(nameof(Corpus))]
    public void Read_BadFile_ThrowsWithExactMessage(string name, string text, string expected)
    {
        using var dir = new TempDir();
        string path = CsvFiles.Write(dir, text, name + ".csv");
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(path));
        Assert.Equal(string.Format(expected, path), e.Message);
        Assert.Equal(2, e.ExitCode);
    }

    [Theory]
    [MemberData(nameof(Corpus))]
    public void Convert_BadFile_ExitsWith2AndWritesNothing(string name, string text, string expected)
    {
        using var dir = new TempDir();
        string path = CsvFiles.Write(dir, text, name + ".csv");
        string output = dir.File("out.parquet");
        var result = CliRun.Invoke("convert", path, output);
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("error: " + string.Format(expected, path), result.Error);
        Assert.Equal([name + ".csv"], dir.Files()); // neither the output nor a temporary file
    }

    [Fact]
    public void Read_NonNumericInNumericColumn_NamesRowColumnAndValue()
    {
        using var dir = new TempDir();
        string path = CsvFiles.Write(dir, "id,gmag\n1,20.1\n2,bright\n");
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(path, new ReadOptions { NumericColumns = new HashSet<string> { "gmag" } }));
        Assert.Equal($"{path}, row 2, column 'gmag': 'bright' is not a number, and this column must be numeric", e.Message);
        Assert.Equal(2, e.Row);
        Assert.Equal("gmag", e.Column);
    }

    [Fact]
    public void Read_BooleanInNumericColumn_IsNotANumber()
    {
        using var dir = new TempDir();
        string path = CsvFiles.Write(dir, "x\ntrue\n");
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(path, new ReadOptions { NumericColumns = new HashSet<string> { "x" } }));
        Assert.Equal($"{path}, row 1, column 'x': 'true' is not a number, and this column must be numeric", e.Message);
    }

    [Fact]
    public void Convert_HeaderOnly_WritesAZeroRowTable()
    {
        using var dir = new TempDir();
        string path = CsvFiles.Write(dir, "id,ra,dec\n", "header_only.csv");
        string output = dir.File("out.csv");
        var result = CliRun.Invoke("convert", path, output);
        Assert.Equal(0, result.ExitCode);
        Assert.Equal("id,ra,dec\n", File.ReadAllText(output));
        var back = CatalogueIO.Read(output);
        Assert.Equal(0, back.RowCount);
        Assert.Equal(["id", "ra", "dec"], back.Columns.Select(c => c.Name));
    }
}
