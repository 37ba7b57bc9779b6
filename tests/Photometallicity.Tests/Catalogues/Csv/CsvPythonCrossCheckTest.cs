using System.Diagnostics;
using System.Globalization;
using System.Text.Json;
using Photometallicity.Catalogues;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Csv;

/// <summary>
/// Checks against an independent RFC 4180 implementation: the csv module of Python's standard library
/// (Debian's /usr/bin/python3), reading what our writer writes and writing what our reader reads.
/// </summary>
public class CsvPythonCrossCheckTest
{
    [Fact]
    public void Writer_Output_ParsesIdenticallyInPythonCsv()
    {
        using var dir = new TempDir();
        var t = CsvRoundTripTest.AllTypes();
        string path = dir.File("ours.csv");
        CatalogueIO.Write(t, path);
        string json = Python("import csv,json,sys\nwith open(sys.argv[1], newline='', encoding='utf-8') as f: print(json.dumps(list(csv.reader(f))))", path);
        var rows = JsonSerializer.Deserialize<string[][]>(json)!;
        Assert.Equal(t.RowCount + 1, rows.Length);
        Assert.Equal(t.Columns.Select(c => c.Name), rows[0]);
        for (int r = 0; r < t.RowCount; r++)
            for (int c = 0; c < t.Columns.Count; c++)
            {
                var col = t.Columns[c];
                string cell = rows[r + 1][c];
                if (col.IsMissing(r)) Assert.Equal("", cell);
                else if (col.Type is ColumnType.Double or ColumnType.Float) // same number, bit for bit
                    Assert.Equal(BitConverter.DoubleToInt64Bits(col.GetDouble(r)),
                        BitConverter.DoubleToInt64Bits(col is Column<float> ? float.Parse(cell, CultureInfo.InvariantCulture) : double.Parse(cell, CultureInfo.InvariantCulture)));
                else Assert.Equal(col.GetString(r), cell);
            }
    }

    [Fact]
    public void Reader_ReadsPythonCsvOutput()
    {
        using var dir = new TempDir();
        string path = dir.File("python.csv");
        // Python's default 'excel' dialect: CRLF line ends, minimal quoting, doubled quotes.
        Python("import csv,sys\nrows=[['id','note','mag'],['1','a, b','20.5'],['2','he said \"no\"','-1e-3'],['3','multi\\nline',''],['4','',' 7']]\n" +
               "with open(sys.argv[1],'w',newline='',encoding='utf-8') as f: csv.writer(f).writerows(rows)", path);
        var t = CatalogueIO.Read(path);
        Assert.Equal([1L, 2L, 3L, 4L], ((Column<long>)t["id"]).Values);
        Assert.Equal((IEnumerable<string?>)["a, b", "he said \"no\"", "multi\nline", null], ((Column<string>)t["note"]).Values);
        var mag = (Column<double>)t["mag"];
        Assert.Equal(20.5, mag.Values[0]);
        Assert.Equal(-1e-3, mag.Values[1]);
        Assert.True(mag.IsMissing(2));
        Assert.Equal(7.0, mag.Values[3]);
    }

    private static string Python(string script, params string[] args)
    {
        var psi = new ProcessStartInfo("/usr/bin/python3") { RedirectStandardOutput = true, RedirectStandardError = true };
        psi.ArgumentList.Add("-c");
        psi.ArgumentList.Add(script);
        foreach (var a in args) psi.ArgumentList.Add(a);
        using var p = Process.Start(psi)!;
        string stdout = p.StandardOutput.ReadToEnd();
        string stderr = p.StandardError.ReadToEnd();
        p.WaitForExit();
        Assert.True(p.ExitCode == 0, "python3 failed: " + stderr);
        return stdout;
    }
}
