using CsvHelper;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues.Csv;

/// <summary>
/// Reads a CSV table into a <see cref="Table"/> with CsvHelper's low-level record API (fields as UTF-8 spans).
/// Rules: RFC 4180 quoting (embedded commas, quotes and line breaks), UTF-8 with or without BOM, LF or CRLF;
/// a header row naming every column (no empty or repeated names); lines starting with '#' before the header are
/// comments and skipped; blank lines are skipped; spaces around unquoted cells are trimmed; every data row has as
/// many fields as the header. Empty cells, nan and null (any case) and the numeric sentinels of the options are
/// missing. Column types come from the content (see <see cref="CsvColumnBuilder"/>); the options can force text or
/// require numbers. CSV carries no units or descriptions: a table written with units and read back has none.
/// <para>
/// CsvHelper 34 does the tokenising, quoting, BOM and line-end handling; the leading comment lines are skipped here
/// instead of with its CommentPrefix option, which skips comment lines anywhere in the file and would silently drop a
/// data row whose first unquoted field starts with '#' (an id such as #12). Its FieldCountMismatch handling is left at
/// Allow so that a ragged row gives our own message with the row and both counts.
/// </para>
/// </summary>
public static class CsvTableReader
{
    private static readonly CsvReaderOptions Options = new()
    {
        Separator = ',',
        HasHeader = true,
        Mode = CsvMode.Rfc4180,
        AllowLineBreaksInQuotes = true,
        SkipEmptyLines = true,
        TrimWhitespace = true,
        MalformedData = CsvMalformedDataHandling.Throw,
        FieldCountMismatch = CsvFieldCountHandling.Allow, // checked here, for a message with the row and counts
        DetectSeparatorHint = false,
        PoolStrings = true,
        BufferSize = 1 << 20,
    };

    public static Table Read(string path, ReadOptions options)
    {
        try
        {
            return ReadChecked(path, options);
        }
        catch (CsvFormatException e)
        {
            long? row = e.RecordNumber > 1 ? e.RecordNumber - 1 : null;
            throw new InputException(CsvMessages.Malformed(e.Message), path, row, inner: e);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException(CsvMessages.Unreadable(e.Message), path, inner: e);
        }
    }

    private static Table ReadChecked(string path, ReadOptions options)
    {
        var sentinels = new SentinelSet(options.MissingSentinels);
        CsvColumnBuilder[] builders;
        string[] names;
        int rows = 0;
        using (var reader = Open(path))
        {
            var all = CreateBuilders(reader.Headers, path, options, sentinels);
            names = all.Select(b => b.Name).ToArray();
            builders = all.Where(b => options.Keeps(b.Name)).ToArray();
            int n = all.Length;
            while (reader.Read())
            {
                rows++;
                long row = reader.RowNumber;
                if (reader.FieldCount != n)
                    throw new InputException(CsvMessages.RaggedRow(reader.FieldCount, n), path, row);
                foreach (var b in builders) b.Add(reader.GetSpan(b.Index), reader, path, row);
            }
        }
        Backfill(path, builders);
        // One column at a time, so that the scan's blocks and the final arrays of all columns are never held together.
        var columns = new List<Column>(builders.Length);
        for (int c = 0; c < builders.Length; c++)
        {
            columns.Add(builders[c].ToColumn());
            builders[c] = null!;
        }
        var table = columns.Count > 0 ? new Table(columns, path) : new Table(rows, path);
        if (builders.Length < names.Length) table.ColumnsInFile = names;
        return table;
    }

    private static CsvColumnBuilder[] CreateBuilders(IReadOnlyList<string> headers, string path, ReadOptions options, SentinelSet sentinels)
    {
        if (headers.Count == 0) throw new InputException(CsvMessages.NoHeader, path);
        var first = new Dictionary<string, int>(StringComparer.Ordinal);
        var builders = new CsvColumnBuilder[headers.Count];
        for (int c = 0; c < headers.Count; c++)
        {
            string name = headers[c].Trim();
            if (name.Length == 0) throw new InputException(CsvMessages.EmptyHeaderName(c + 1), path);
            if (!first.TryAdd(name, c + 1)) throw new InputException(CsvMessages.DuplicateHeaderName(c + 1, name, first[name]), path);
            builders[c] = new CsvColumnBuilder(name, c, options.TextColumns.Contains(name), options.NumericColumns.Contains(name), sentinels, options.CompactText);
        }
        return builders;
    }

    /// <summary>Reads again the leading rows of the columns that turned out to be text, to keep their original text.</summary>
    private static void Backfill(string path, CsvColumnBuilder[] builders)
    {
        var pending = builders.Where(b => b.BackfillRows > 0).ToArray();
        if (pending.Length == 0) return;
        int rows = pending.Max(b => b.BackfillRows);
        using var reader = Open(path);
        for (int r = 0; r < rows && reader.Read(); r++)
            foreach (var b in pending)
                if (r < b.BackfillRows) b.SetText(r, reader.GetSpan(b.Index), reader.GetRawSpan(b.Index));
    }

    /// <summary>A reader positioned after the BOM and the '#' comment lines that precede the header.</summary>
    private static CsvReader Open(string path)
    {
        var fs = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan);
        try
        {
            fs.Position = LeadingCommentBytes(fs);
            return CsvReader.Create(fs, Options, leaveOpen: false);
        }
        catch
        {
            fs.Dispose();
            throw;
        }
    }

    private static long LeadingCommentBytes(Stream s)
    {
        long pos = 0;
        if (s.ReadByte() == 0xEF && s.ReadByte() == 0xBB && s.ReadByte() == 0xBF) pos = 3;
        s.Position = pos;
        int b;
        while ((b = s.ReadByte()) == '#')
        {
            while ((b = s.ReadByte()) != -1 && b != '\n') { }
            pos = s.Position;
            if (b == -1) break;
        }
        return pos;
    }
}
