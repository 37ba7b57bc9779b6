using System.Globalization;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// Reads a FITS binary table (BINTABLE extension; FITS Standard 4.0, IAU FITS Working Group 2018, sect. 7.3) into a
/// <see cref="Table"/>. Without <see cref="ReadOptions.Extension"/> the first BINTABLE is read, skipping the primary
/// HDU and any image or other extensions; with it, the BINTABLE whose EXTNAME matches (case-insensitive).
/// Non-structural keywords of the table's header go to <see cref="Table.Metadata"/> (COMMENT and HISTORY included,
/// keywords of the primary HDU not). Malformed or truncated files raise an <see cref="InputException"/>.
/// </summary>
public static class FitsTableReader
{
    /// <summary>
    /// Rows are read in chunks of about this many bytes and decoded column by column; small enough for the chunk to
    /// stay in the CPU cache while each column makes its strided pass over it.
    /// </summary>
    private const int ChunkBytes = 1 << 18;

    public static Table Read(string path, ReadOptions options)
    {
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan);
        var hdu = FindTable(stream, path, options.Extension);
        var layout = FitsTableLayout.FromHeader(hdu.Header);
        long tableBytes = (long)layout.RowBytes * layout.RowCount;
        long present = Math.Max(0, stream.Length - hdu.DataStart);
        if (present < tableBytes)
            throw new InputException(Format(FitsMessages.DataTruncated, layout.RowCount, layout.RowBytes, tableBytes, hdu.DataStart, present), path);

        var decoders = layout.Fields.Where(f => options.Keeps(f.Name)).Select(f => new FitsColumnDecoder(f, layout.RowCount)).ToArray();
        ReadRows(stream, hdu.DataStart, layout, decoders);

        var notes = new List<string>();
        var table = new Table(layout.RowCount, path);
        foreach (var d in decoders)
            table.Add(MissingSentinels.Apply(FitsColumnBuilder.Build(d, path, notes), options.MissingSentinels));
        if (decoders.Length < layout.Fields.Count) table.ColumnsInFile = layout.Fields.Select(f => f.Name).ToArray();
        foreach (var card in hdu.Header.Cards)
        {
            if (card.Kind == FitsValueKind.Commentary && card.Keyword is not ("COMMENT" or "HISTORY")) continue;
            if (FitsKeywords.IsStructural(card.Keyword)) continue;
            table.Metadata.Add((card.Keyword, card.Value, card.Comment));
        }
        foreach (var note in notes) table.Metadata.Add(("COMMENT", note, null));
        return table;
    }

    private static void ReadRows(Stream stream, long dataStart, FitsTableLayout layout, FitsColumnDecoder[] decoders)
    {
        if (layout.RowCount == 0 || layout.RowBytes == 0) return;
        int rowsPerChunk = Math.Max(1, ChunkBytes / layout.RowBytes);
        var buffer = new byte[(long)Math.Min(rowsPerChunk, layout.RowCount) * layout.RowBytes];
        stream.Position = dataStart;
        for (int first = 0; first < layout.RowCount; first += rowsPerChunk)
        {
            int count = Math.Min(rowsPerChunk, layout.RowCount - first);
            var chunk = buffer.AsSpan(0, count * layout.RowBytes);
            if (FitsHduReader.ReadFully(stream, chunk) < chunk.Length)
                throw new IOException("the file became shorter while it was read");
            foreach (var d in decoders) d.Decode(chunk, layout.RowBytes, first, count);
        }
    }

    /// <summary>Walks the HDUs up to the requested BINTABLE; the error lists the HDUs or EXTNAMEs found.</summary>
    private static FitsHdu FindTable(Stream stream, string path, string? extension)
    {
        var primary = FitsHduReader.ReadAt(stream, 0, 0, path) ?? throw new InputException(FitsMessages.NotFits, path);
        var found = new List<string> { "0 primary" };
        var names = new List<string>();
        long next = primary.NextHduStart;
        CheckData(stream, primary, path);
        for (int index = 1; ; index++)
        {
            var hdu = FitsHduReader.ReadAt(stream, next, index, path);
            if (hdu is null) break;
            string kind = (hdu.Header.GetString("XTENSION") ?? "?").Trim();
            string? extname = hdu.Header.GetString("EXTNAME")?.Trim();
            found.Add($"{index} {kind}" + (extname is null ? "" : $" '{extname}'"));
            if (extname is not null) names.Add($"'{extname}' ({kind})");
            bool wanted = extension is null || string.Equals(extname, extension.Trim(), StringComparison.OrdinalIgnoreCase);
            if (wanted && kind == "BINTABLE") return hdu;
            if (wanted && extension is not null && kind == "TABLE")
                throw new InputException(Format(FitsMessages.AsciiTable, index, extname), path);
            CheckData(stream, hdu, path);
            next = hdu.NextHduStart;
        }
        if (extension is not null)
            throw new InputException(Format(FitsMessages.NoSuchExtension, extension, names.Count == 0 ? "none" : string.Join(", ", names)), path);
        throw new InputException(Format(FitsMessages.NoTable, string.Join(", ", found)), path);
    }

    /// <summary>An HDU that is skipped must still have all its data in the file (its final padding may be short).</summary>
    private static void CheckData(Stream stream, FitsHdu hdu, string path)
    {
        if (hdu.DataStart + hdu.DataBytes > stream.Length)
            throw new InputException(Format(FitsMessages.HduTruncated, hdu.Header.HduIndex, hdu.DataBytes, hdu.DataStart, stream.Length), path);
    }

    private static string Format(string format, params object?[] args) => string.Format(CultureInfo.InvariantCulture, format, args);
}
