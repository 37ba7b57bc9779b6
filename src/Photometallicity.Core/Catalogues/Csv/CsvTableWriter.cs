using System.Globalization;
using CsvHelper;

namespace Photometallicity.Catalogues.Csv;

/// <summary>
/// Writes a <see cref="Table"/> as CSV with CsvHelper: UTF-8 without BOM, LF line ends, a header row, invariant
/// culture. Doubles and floats are written as their shortest round-trip text (what double.ToString("R") gives,
/// plus ".0" where that looks like an integer, so the column type survives),
/// booleans as true/false, missing values as an empty cell, an empty (not missing) string as "". Fields with a
/// comma, quote, line break or surrounding whitespace are quoted. Units, descriptions and table metadata are not
/// written (CSV has no place for them; <see cref="CsvTableReader"/> reads the values back, not the units), and
/// Float/Int32/Int16/Byte columns read back as Double or Int64.
/// </summary>
public static class CsvTableWriter
{
    private static readonly CsvWriterOptions Options = new()
    {
        Separator = ',',
        Mode = CsvMode.Rfc4180,
        Quoting = CsvQuoting.WhenNeededOrWhitespace,
        NewLine = "\n",
        WriteByteOrderMark = false,
        Injection = CsvInjection.None,
        ValidateFieldCount = true,
        BufferSize = 1 << 20,
    };

    public static void Write(Table table, Stream stream)
    {
        using var writer = CsvWriter.Create(stream, Options, leaveOpen: true);
        var columns = table.Columns;
        if (columns.Count == 0) return;
        // A first name starting with '#' is quoted, or the reader would take the header for a comment line.
        for (int c = 0; c < columns.Count; c++)
            writer.WriteField(columns[c].Name, c == 0 && columns[c].Name.StartsWith('#') ? CsvQuoting.Always : CsvQuoting.WhenNeeded);
        writer.EndRecord();
        var cells = columns.Select(CellWriter).ToArray();
        for (int row = 0; row < table.RowCount; row++)
        {
            for (int c = 0; c < cells.Length; c++) cells[c](writer, row);
            writer.EndRecord();
        }
        writer.Flush();
    }

    /// <summary>One delegate per column, chosen once, so the row loop does not switch on the type per cell.</summary>
    private static Action<CsvWriter, int> CellWriter(Column column) => column switch
    {
        Column<double> d => (w, r) =>
        {
            double v = d.Values[r];
            if (double.IsNaN(v) || Masked(d.Missing, r)) w.WriteField(ReadOnlySpan<char>.Empty);
            else WriteReal(w, v);
        },
        Column<float> f => (w, r) =>
        {
            float v = f.Values[r];
            if (float.IsNaN(v) || Masked(f.Missing, r)) w.WriteField(ReadOnlySpan<char>.Empty);
            else WriteReal(w, v);
        },
        Column<long> l => Integer(l),
        Column<int> i => Integer(i),
        Column<short> s => Integer(s),
        Column<byte> b => Integer(b),
        Column<bool> t => (w, r) => w.WriteField(Masked(t.Missing, r) ? ReadOnlySpan<char>.Empty : t.Values[r] ? "true" : "false"),
        Column<string> s => (w, r) => WriteText(w, Masked(s.Missing, r) ? null : s.Values[r]),
        Utf8Column u => (w, r) => WriteText(w, u.GetString(r)),
        _ => (w, r) => w.WriteField(column.GetString(r) ?? ""),
    };

    private static Action<CsvWriter, int> Integer<T>(Column<T> c) where T : struct, IUtf8SpanFormattable =>
        (w, r) =>
        {
            if (Masked(c.Missing, r)) w.WriteField(ReadOnlySpan<char>.Empty);
            else w.WriteField(c.Values[r], ReadOnlySpan<char>.Empty);
        };

    /// <summary>
    /// The shortest round-trip text ("R"), with ".0" added when that text reads as an integer (3, -0, 1E+16 stays),
    /// so that a Double column whose values happen to be whole numbers reads back as Double, not Int64.
    /// </summary>
    private static void WriteReal<T>(CsvWriter w, T v) where T : IUtf8SpanFormattable
    {
        Span<byte> buf = stackalloc byte[40];
        v.TryFormat(buf, out int n, "R", CultureInfo.InvariantCulture);
        if (buf[..n].IndexOfAny(".EeIN"u8) < 0)
        {
            ".0"u8.CopyTo(buf[n..]);
            n += 2;
        }
        w.WriteField((ReadOnlySpan<byte>)buf[..n]);
    }

    private static bool Masked(bool[]? mask, int row) => mask is not null && mask[row];

    /// <summary>A missing text (null) as an empty cell, an empty string as "".</summary>
    private static void WriteText(CsvWriter w, string? v)
    {
        if (v is null) w.WriteField(ReadOnlySpan<char>.Empty);
        else if (v.Length == 0) w.WriteField(v, CsvQuoting.Always);
        else w.WriteField(v);
    }
}
