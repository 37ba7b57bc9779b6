using System.Globalization;
using System.Text.Json;
using Photometallicity.Catalogues;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Fits;

/// <summary>
/// Reads the fixtures written by Debian's astropy (tests/reference/make_fits_fixtures.py; version in the sidecar and
/// in each header's ASTROPYV) and compares every value with what astropy itself reads back (tests/fixtures/fits/expected.json).
/// Tolerance: exact for every stored value; 1e-12 relative for TSCAL/TZERO-scaled values (the scaling equation of FITS Standard 4.0, sect. 7.3.2,
/// evaluated in double precision, where the order of operations may differ by one rounding).
/// </summary>
public class FitsAstropyFixtureTest
{
    public static IEnumerable<object[]> Cases()
    {
        using var doc = JsonDocument.Parse(File.ReadAllText(RepoPaths.Fixture("fits", "expected.json")));
        int i = 0;
        foreach (var c in doc.RootElement.GetProperty("cases").EnumerateArray())
            yield return [i++, c.GetProperty("file").GetString()!, c.GetProperty("extension").GetString() ?? "(first)"];
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Read_AstropyFixture_MatchesAstropyValues(int index, string file, string extension)
    {
        using var doc = JsonDocument.Parse(File.ReadAllText(RepoPaths.Fixture("fits", "expected.json")));
        var c = doc.RootElement.GetProperty("cases")[index];
        var table = CatalogueIO.Read(RepoPaths.Fixture("fits", file),
            new ReadOptions { Extension = extension == "(first)" ? null : extension });
        Assert.Equal(c.GetProperty("rows").GetInt32(), table.RowCount);

        var columns = c.GetProperty("columns").EnumerateArray().ToArray();
        Assert.Equal(columns.Select(x => x.GetProperty("name").GetString()), table.Columns.Select(x => x.Name));
        foreach (var col in columns)
        {
            var ours = table[col.GetProperty("name").GetString()!];
            Assert.Equal(col.GetProperty("expected_type").GetString(), ours.Type.ToString());
            Assert.Equal(col.GetProperty("unit").GetString(), ours.Unit);
            bool scaled = col.GetProperty("astropy_dtype").GetString() == "float64" && ours.Type == ColumnType.Double;
            int row = 0;
            foreach (var v in col.GetProperty("values").EnumerateArray())
            {
                string where = $"{file} {ours.Name} row {row}";
                if (v.ValueKind == JsonValueKind.Null) Assert.True(ours.IsMissing(row), where);
                else if (ours.Type is ColumnType.Double or ColumnType.Float)
                {
                    double expected = v.GetDouble();
                    if (scaled) Assert.True(Math.Abs(ours.GetDouble(row) - expected) <= 1e-12 * Math.Abs(expected), where);
                    else Assert.Equal(expected, ours.GetDouble(row));
                }
                else if (v.ValueKind is JsonValueKind.True or JsonValueKind.False) Assert.Equal(v.GetBoolean() ? "true" : "false", ours.GetString(row));
                else if (v.ValueKind == JsonValueKind.Number && ours.Type == ColumnType.Int16 && v.GetRawText().Contains('.'))
                    Assert.Equal(v.GetDouble(), ours.GetDouble(row)); // the signed byte, which astropy reads as float64
                else if (v.ValueKind == JsonValueKind.Number) Assert.Equal(v.GetRawText(), ours.GetString(row));
                else Assert.Equal(v.GetString(), ours.GetString(row));
                row++;
            }
        }

        foreach (var kw in c.GetProperty("keywords").EnumerateObject())
        {
            var (_, value, _) = Assert.Single(table.Metadata, m => m.Key == kw.Name);
            string expected = kw.Value.ValueKind switch
            {
                JsonValueKind.True => "T",
                JsonValueKind.False => "F",
                JsonValueKind.String => kw.Value.GetString()!,
                _ => kw.Value.GetRawText(),
            };
            if (kw.Value.ValueKind == JsonValueKind.Number) Assert.Equal(double.Parse(expected, CultureInfo.InvariantCulture), double.Parse(value, CultureInfo.InvariantCulture));
            else Assert.Equal(expected, value);
        }
        Assert.Contains(table.Metadata, m => m.Key == "ASTROPYV" && m.Value == doc.RootElement.GetProperty("astropy_version").GetString());
    }
}
