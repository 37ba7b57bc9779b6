using Parquet;
using Parquet.Schema;
using Photometallicity.Catalogues;
using Photometallicity.Errors;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Parquet;

public class ParquetBadInputTest
{
    [Fact]
    public void Read_NotParquet_ThrowsAndConvertWritesNothing()
    {
        using var dir = new TempDir();
        string path = dir.File("fake.parquet");
        File.WriteAllText(path, "id,ra,dec\n1,2,3\n");
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(path));
        Assert.StartsWith($"{path}: not a readable Parquet file: ", e.Message);

        var result = CliRun.Invoke("convert", path, dir.File("out.csv"));
        Assert.Equal(2, result.ExitCode);
        Assert.Contains($"error: {path}: not a readable Parquet file: ", result.Error);
        Assert.Equal(["fake.parquet"], dir.Files());
    }

    [Theory]
    [InlineData(0.5)]
    [InlineData(0.98)]
    public void Read_TruncatedFile_IsAnInputError(double keep)
    {
        using var dir = new TempDir();
        string good = dir.File("good.parquet");
        CatalogueIO.Write(Csv.CsvRoundTripTest.AllTypes(), good);
        var bytes = File.ReadAllBytes(good);
        string path = dir.File("cut.parquet");
        File.WriteAllBytes(path, bytes[..(int)(bytes.Length * keep)]);
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(path));
        Assert.StartsWith($"{path}: not a readable Parquet file: ", e.Message);
    }

    [Fact]
    public void Read_CorruptDataPage_IsAnInputError()
    {
        using var dir = new TempDir();
        var t = new Table([new Column<double>("x", Enumerable.Range(0, 1000).Select(i => i * 0.5).ToArray())]);
        string path = dir.File("bad.parquet");
        CatalogueIO.Write(t, path);
        var bytes = File.ReadAllBytes(path);
        for (int i = 4; i < 200; i++) bytes[i] ^= 0x5A; // scramble the first page header and data, keep the footer
        File.WriteAllBytes(path, bytes);
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(path));
        Assert.StartsWith($"{path}, column 'x': cannot read the column: ", e.Message);
    }

    [Fact]
    public void Read_EmptyFile_IsEmpty()
    {
        using var dir = new TempDir();
        string path = dir.File("empty.parquet");
        File.WriteAllBytes(path, []);
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(path));
        Assert.Equal($"{path}: file is empty", e.Message);
    }

    [Fact]
    public async Task Read_UnsupportedColumnType_NamesTheColumn()
    {
        using var dir = new TempDir();
        string path = dir.File("dates.parquet");
        var when = new DataField("observed", typeof(DateTime), isNullable: false);
        using (var fs = File.Create(path))
        {
            await using var w = await ParquetWriter.CreateAsync(new ParquetSchema(when), fs);
            using var rg = w.CreateRowGroup();
            await rg.WriteAsync<DateTime>(when, new[] { new DateTime(2026, 1, 2, 0, 0, 0, DateTimeKind.Utc) }.AsMemory());
        }
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(path));
        Assert.Equal($"{path}, column 'observed': the Parquet column type DateTime is not supported (numbers, booleans and strings are)", e.Message);
    }

    [Fact]
    public async Task Read_NestedColumn_NamesTheColumn()
    {
        using var dir = new TempDir();
        string path = dir.File("nested.parquet");
        var schema = new ParquetSchema(new DataField("id", typeof(long)), new ListField("mags", typeof(double)));
        using (var fs = File.Create(path))
        await using (await ParquetWriter.CreateAsync(schema, fs)) { }
        var e = Assert.Throws<InputException>(() => CatalogueIO.Read(path));
        Assert.Equal($"{path}, column 'mags': nested or repeated Parquet columns are not supported; only flat columns can be read", e.Message);
    }
}
