using Parquet;
using Parquet.Schema;
using Photometallicity.Catalogues;
using Photometallicity.Tests.Catalogues.Csv;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Parquet;

public class ParquetRoundTripTest
{
    [Fact]
    public void WriteRead_AllTypes_KeepTypesValuesMissingUnitsAndDescriptions()
    {
        using var dir = new TempDir();
        var original = CsvRoundTripTest.AllTypes();
        original["l"].Unit = "count";
        original["f"].Description = "a float column, invented";
        original.Metadata.Add(("FIELD", "invented test field", "not a real object"));
        original.Metadata.Add(("SEED", "7", null));
        string path = dir.File("all.parquet");
        CatalogueIO.Write(original, path);
        var back = CatalogueIO.Read(path);

        Assert.Equal(original.RowCount, back.RowCount);
        Assert.Equal(original.Columns.Select(c => (c.Name, c.Type, c.Unit, c.Description)),
            back.Columns.Select(c => (c.Name, c.Type, c.Unit, c.Description)));
        Assert.Equal("mag", back["d"].Unit);
        Assert.Equal("free text", back["s"].Description);
        Assert.Equal(original.Metadata, back.Metadata);
        foreach (var c in original.Columns)
        {
            var r = back[c.Name];
            for (int row = 0; row < c.Length; row++)
            {
                Assert.Equal(c.IsMissing(row), r.IsMissing(row));
                if (c.IsMissing(row)) continue;
                Assert.Equal(c.GetString(row), r.GetString(row));
                Assert.Equal(BitConverter.DoubleToInt64Bits(c.GetDouble(row)), BitConverter.DoubleToInt64Bits(r.GetDouble(row)));
            }
        }
        Assert.Equal("", back["s"].GetString(2)); // an empty string is not a missing one
        Assert.Null(back["s"].GetString(1));
    }

    [Fact]
    public async Task Write_FollowsTheParquetFormat_MagicSnappyAndOptionalFields()
    {
        using var dir = new TempDir();
        var t = new Table([new Column<double>("full", [1.0, 2.0, 3.0]), new Column<double>("gaps", [1.0, double.NaN, 3.0])]);
        string path = dir.File("t.parquet");
        CatalogueIO.Write(t, path);

        // Apache Parquet format specification: "PAR1" at both ends, the 4-byte little-endian footer length before the last one.
        var bytes = File.ReadAllBytes(path);
        Assert.Equal("PAR1"u8.ToArray(), bytes[..4]);
        Assert.Equal("PAR1"u8.ToArray(), bytes[^4..]);
        int footer = BitConverter.ToInt32(bytes, bytes.Length - 8);
        Assert.InRange(footer, 1, bytes.Length - 12);

        await using var reader = await ParquetReader.CreateAsync(path);
        Assert.All(reader.Metadata!.RowGroups.SelectMany(g => g.Columns), c => Assert.Equal(global::Parquet.Meta.CompressionCodec.SNAPPY, c.MetaData!.Codec));
        var fields = reader.Schema.DataFields;
        Assert.False(fields[0].IsNullable); // no missing value: a required field
        Assert.True(fields[1].IsNullable);  // missing values: an optional field with nulls
        Assert.Equal(3, reader.Metadata.NumRows);
    }

    [Fact]
    public void WriteRead_ZeroRows()
    {
        using var dir = new TempDir();
        var t = new Table([new Column<double>("ra", []), new Column<string>("id", [])]);
        string path = dir.File("empty.parquet");
        CatalogueIO.Write(t, path);
        var back = CatalogueIO.Read(path);
        Assert.Equal(0, back.RowCount);
        Assert.Equal([ColumnType.Double, ColumnType.String], back.Columns.Select(c => c.Type));
    }

    [Fact]
    public async Task Read_SeveralRowGroupsWrittenByTheLibrary_AreConcatenatedInOrder()
    {
        using var dir = new TempDir();
        string path = dir.File("groups.parquet");
        var x = new DataField("x", typeof(double), isNullable: true);
        var n = new DataField("n", typeof(int), isNullable: false);
        var s = new DataField("s", typeof(string), isNullable: true);
        using (var fs = File.Create(path))
        {
            await using var w = await ParquetWriter.CreateAsync(new ParquetSchema(x, n, s), fs);
            for (int g = 0; g < 3; g++)
            {
                using var rg = w.CreateRowGroup();
                await rg.WriteAsync<double>(x, new double?[] { g, null }.AsMemory());
                await rg.WriteAsync<int>(n, new[] { 10 * g, 10 * g + 1 }.AsMemory());
                await rg.WriteAsync(s, new[] { "g" + g, null! });
            }
        }
        var t = CatalogueIO.Read(path, new ReadOptions { MissingSentinels = [21] });
        Assert.Equal(6, t.RowCount);
        Assert.Equal([0.0, double.NaN, 1.0, double.NaN, 2.0, double.NaN], ((Column<double>)t["x"]).Values);
        var ints = (Column<int>)t["n"];
        Assert.Equal([0, 1, 10, 11, 20, 21], ints.Values);
        Assert.True(ints.IsMissing(5)); // the sentinel 21
        Assert.False(ints.IsMissing(4));
        Assert.Equal((IEnumerable<string?>)["g0", null, "g1", null, "g2", null], ((Column<string>)t["s"]).Values);
    }
}
