using Parquet;
using Parquet.Schema;

namespace Photometallicity.Catalogues.Parquet;

/// <summary>
/// Writes a <see cref="Table"/> as Parquet with Parquet.Net, Snappy-compressed at the fastest level (the library's
/// default level is SmallestSize, far slower for little gain on photometry). Every column type keeps its type
/// (double, float, int64, int32, int16, uint8, boolean, UTF-8 string); a column with missing values is an optional
/// field whose missing rows are nulls (definition level 0), NaN included for floating-point columns. Units,
/// descriptions and table metadata go into the key-value metadata (see <see cref="ParquetMetadataKeys"/>).
/// </summary>
public static class ParquetTableWriter
{
    /// <summary>Rows per row group: large groups read fastest; 2^20 rows of ten doubles is about 80 MB raw.</summary>
    internal const int RowGroupRows = 1 << 20;

    internal static ParquetOptions Options => new()
    {
        CompressionMethod = CompressionMethod.Snappy,
        CompressionLevel = System.IO.Compression.CompressionLevel.Fastest,
    };

    public static void Write(Table table, Stream stream) => WriteAsync(table, stream).GetAwaiter().GetResult();

    private static async Task WriteAsync(Table table, Stream stream)
    {
        if (table.Columns.Count == 0) throw new ArgumentException("A Parquet file needs at least one column.", nameof(table));
        var fields = table.Columns.Select(c => new DataField(c.Name, ClrType(c.Type), isNullable: HasMissing(c))).ToArray();
        await using var writer = await ParquetWriter.CreateAsync(new ParquetSchema(fields), stream, Options, append: false); // the writer leaves the stream open
        writer.CustomMetadata = ParquetMetadataKeys.Build(table);
        for (int start = 0; start < table.RowCount; start += RowGroupRows)
        {
            int n = Math.Min(RowGroupRows, table.RowCount - start);
            using var group = writer.CreateRowGroup();
            for (int c = 0; c < fields.Length; c++) await WriteColumn(group, fields[c], table.Columns[c], start, n);
            group.CompleteValidate();
        }
    }

    private static Task WriteColumn(ParquetRowGroupWriter g, DataField f, Column c, int start, int n) => c switch
    {
        Column<double> x => WriteStruct(g, f, x, start, n),
        Column<float> x => WriteStruct(g, f, x, start, n),
        Column<long> x => WriteStruct(g, f, x, start, n),
        Column<int> x => WriteStruct(g, f, x, start, n),
        Column<short> x => WriteStruct(g, f, x, start, n),
        Column<byte> x => WriteStruct(g, f, x, start, n),
        Column<bool> x => WriteStruct(g, f, x, start, n),
        Column<string> x => WriteStrings(g, f, x, start, n),
        Utf8Column x => WriteStrings(g, f, x, start, n),
        _ => throw new NotSupportedException($"Column type {c.Type} has no Parquet mapping."),
    };

    private static Task WriteStruct<T>(ParquetRowGroupWriter g, DataField f, Column<T> c, int start, int n) where T : struct
    {
        if (!f.IsNullable) return g.WriteAsync<T>(f, c.Values.AsMemory(start, n));
        var v = new T?[n];
        for (int i = 0; i < n; i++) v[i] = c.IsMissing(start + i) ? null : c.Values[start + i];
        return g.WriteAsync<T>(f, (ReadOnlyMemory<T?>)v);
    }

    private static Task WriteStrings(ParquetRowGroupWriter g, DataField f, Column c, int start, int n)
    {
        var v = new string?[n];
        for (int i = 0; i < n; i++) v[i] = c.GetString(start + i);
        return g.WriteAsync(f, v!);
    }

    private static bool HasMissing(Column c)
    {
        for (int i = 0; i < c.Length; i++) if (c.IsMissing(i)) return true;
        return false;
    }

    private static Type ClrType(ColumnType t) => t switch
    {
        ColumnType.Double => typeof(double),
        ColumnType.Float => typeof(float),
        ColumnType.Int64 => typeof(long),
        ColumnType.Int32 => typeof(int),
        ColumnType.Int16 => typeof(short),
        ColumnType.Byte => typeof(byte),
        ColumnType.Boolean => typeof(bool),
        ColumnType.String => typeof(string),
        _ => throw new NotSupportedException($"Column type {t} has no Parquet mapping."),
    };
}
