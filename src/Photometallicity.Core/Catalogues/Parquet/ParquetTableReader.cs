using System.Numerics;
using Parquet;
using Parquet.Schema;
using Photometallicity.Catalogues.Csv;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues.Parquet;

/// <summary>
/// Reads a flat Parquet file into a <see cref="Table"/> with Parquet.Net, every row group in order. Column types
/// map one to one (double, float, int64, int32, int16, uint8, boolean, string); int8, uint16 and uint32 widen to
/// Int16, Int32 and Int64; uint64 and decimal become Double. Nulls are missing values (NaN in floating columns, the
/// mask elsewhere), and so are the numeric sentinels of the options. Units and descriptions come from the key-value
/// metadata (<see cref="ParquetMetadataKeys"/>). Nested, repeated and other column types are an input error that
/// names the column.
/// </summary>
public static class ParquetTableReader
{
    public static Table Read(string path, ReadOptions options) => ReadAsync(path, options).GetAwaiter().GetResult();

    private static async Task<Table> ReadAsync(string path, ReadOptions options)
    {
        ParquetReader reader;
        try
        {
            reader = await ParquetReader.CreateAsync(path, ParquetTableWriter.Options);
        }
        catch (Exception e) when (IsDecodingFailure(e))
        {
            throw new InputException($"not a readable Parquet file: {e.Message}", path, inner: e);
        }
        await using (reader)
        {
            foreach (var f in reader.Schema.Fields)
                if (f.SchemaType != SchemaType.Data || ((DataField)f).IsArray)
                    throw new InputException("nested or repeated Parquet columns are not supported; only flat columns can be read", path, column: f.Name);
            long rows = reader.RowGroups.Sum(g => g.RowCount);
            if (rows > Array.MaxLength) throw new InputException($"{rows} rows is more than one table can hold", path);
            var sentinels = new SentinelSet(options.MissingSentinels);
            var columns = new List<Column>();
            foreach (var f in reader.Schema.DataFields)
            {
                if (!options.Keeps(f.Name)) continue;
                try
                {
                    columns.Add(await ReadColumn(reader, f, (int)rows, sentinels, path));
                }
                catch (Exception e) when (IsDecodingFailure(e))
                {
                    throw new InputException($"cannot read the column: {e.Message}", path, column: f.Name, inner: e);
                }
            }
            var table = new Table(columns, path);
            if (columns.Count < reader.Schema.DataFields.Length) table.ColumnsInFile = reader.Schema.DataFields.Select(f => f.Name).ToArray();
            ParquetMetadataKeys.Apply(reader.CustomMetadata, table, path);
            return table;
        }
    }

    /// <summary>
    /// A failure of the library on this file's bytes (Parquet.Net reports corrupt or truncated files with its own
    /// exception types, Thrift errors, I/O errors or index errors): bad input, not a failure of this program.
    /// </summary>
    private static bool IsDecodingFailure(Exception e) =>
        e is not (InputException or OutOfMemoryException or OperationCanceledException or NotImplementedException);

    private static async Task<Column> ReadColumn(ParquetReader r, DataField f, int rows, SentinelSet s, string path)
    {
        var t = f.ClrType;
        if (t == typeof(double)) return Floating(f.Name, await ReadStruct<double>(r, f, rows), s);
        if (t == typeof(float)) return Floating(f.Name, await ReadStruct<float>(r, f, rows), s);
        if (t == typeof(long)) return Integer(f.Name, await ReadStruct<long>(r, f, rows), s, x => x);
        if (t == typeof(int)) return Integer(f.Name, await ReadStruct<int>(r, f, rows), s, x => x);
        if (t == typeof(short)) return Integer(f.Name, await ReadStruct<short>(r, f, rows), s, x => x);
        if (t == typeof(byte)) return Integer(f.Name, await ReadStruct<byte>(r, f, rows), s, x => x);
        if (t == typeof(bool)) { var (v, m) = await ReadStruct<bool>(r, f, rows); return new Column<bool>(f.Name, v, m); }
        if (t == typeof(string) || t == typeof(ReadOnlyMemory<char>)) return new Column<string>(f.Name, (await ReadStrings(r, f, rows))!);
        if (t == typeof(sbyte)) return Integer(f.Name, Convert(await ReadStruct<sbyte>(r, f, rows), x => (short)x), s, x => x);
        if (t == typeof(ushort)) return Integer(f.Name, Convert(await ReadStruct<ushort>(r, f, rows), x => (int)x), s, x => x);
        if (t == typeof(uint)) return Integer(f.Name, Convert(await ReadStruct<uint>(r, f, rows), x => (long)x), s, x => x);
        if (t == typeof(ulong)) return Floating(f.Name, Convert(await ReadStruct<ulong>(r, f, rows), x => (double)x), s);
        if (t == typeof(decimal)) return Floating(f.Name, Convert(await ReadStruct<decimal>(r, f, rows), x => (double)x), s);
        throw new InputException($"the Parquet column type {t.Name} is not supported (numbers, booleans and strings are)", path, column: f.Name);
    }

    /// <summary>All row groups of one column into one array; a mask where the field is optional and has nulls.</summary>
    private static async Task<(T[] Values, bool[]? Missing)> ReadStruct<T>(ParquetReader r, DataField f, int rows) where T : struct
    {
        var values = new T[rows];
        bool[]? missing = null;
        int offset = 0;
        foreach (var g in r.RowGroups)
        {
            int n = checked((int)g.RowCount);
            if (f.IsNullable)
            {
                var buffer = new T?[n];
                await g.ReadAsync<T>(f, buffer.AsMemory());
                for (int i = 0; i < n; i++)
                {
                    if (buffer[i] is T v) values[offset + i] = v;
                    else (missing ??= new bool[rows])[offset + i] = true;
                }
            }
            else
            {
                await g.ReadAsync<T>(f, values.AsMemory(offset, n));
            }
            offset += n;
        }
        return (values, missing);
    }

    private static async Task<string?[]> ReadStrings(ParquetReader r, DataField f, int rows)
    {
        var values = new string?[rows];
        int offset = 0;
        foreach (var g in r.RowGroups)
        {
            int n = checked((int)g.RowCount);
            await g.ReadAsync(f, values.AsMemory(offset, n));
            offset += n;
        }
        return values;
    }

    private static (TOut[] Values, bool[]? Missing) Convert<TIn, TOut>((TIn[] Values, bool[]? Missing) c, Func<TIn, TOut> f) =>
        (Array.ConvertAll(c.Values, x => f(x)), c.Missing);

    private static Column Floating<T>(string name, (T[] Values, bool[]? Missing) c, SentinelSet s) where T : struct, IFloatingPointIeee754<T>
    {
        var v = c.Values;
        for (int i = 0; i < v.Length; i++)
            if ((c.Missing is not null && c.Missing[i]) || (!s.IsEmpty && s.Matches(double.CreateTruncating(v[i])))) v[i] = T.NaN;
        return new Column<T>(name, v);
    }

    private static Column Integer<T>(string name, (T[] Values, bool[]? Missing) c, SentinelSet s, Func<T, double> toDouble)
    {
        var m = c.Missing;
        if (!s.IsEmpty)
            for (int i = 0; i < c.Values.Length; i++)
                if (s.Matches(toDouble(c.Values[i]))) (m ??= new bool[c.Values.Length])[i] = true;
        return new Column<T>(name, c.Values, m);
    }
}
