using System.Text.Json;

namespace Photometallicity.Catalogues.Parquet;

/// <summary>
/// How units, descriptions and table metadata are kept in a Parquet file's key-value metadata (the footer's
/// key_value_metadata, which other Parquet tools show and keep). Our own naming, all under one prefix:
/// <list type="bullet">
/// <item><c>photometallicity.unit.&lt;column&gt;</c>: the unit of that column (for example <c>mag</c>, <c>deg</c>).</item>
/// <item><c>photometallicity.description.&lt;column&gt;</c>: its description.</item>
/// <item><c>photometallicity.table-metadata</c>: the table's <see cref="Table.Metadata"/> as a JSON array of
/// objects with <c>key</c>, <c>value</c> and (optionally) <c>comment</c>.</item>
/// </list>
/// Other keys in a file (written by other programs) are ignored on reading.
/// </summary>
internal static class ParquetMetadataKeys
{
    public const string Prefix = "photometallicity.";
    public const string UnitPrefix = Prefix + "unit.";
    public const string DescriptionPrefix = Prefix + "description.";
    public const string TableMetadata = Prefix + "table-metadata";

    private sealed record Entry(string Key, string Value, string? Comment);

    private static readonly JsonSerializerOptions Json = new() { PropertyNamingPolicy = JsonNamingPolicy.CamelCase };

    public static Dictionary<string, string> Build(Table table)
    {
        var kv = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var c in table.Columns)
        {
            if (c.Unit is not null) kv[UnitPrefix + c.Name] = c.Unit;
            if (c.Description is not null) kv[DescriptionPrefix + c.Name] = c.Description;
        }
        if (table.Metadata.Count > 0)
            kv[TableMetadata] = JsonSerializer.Serialize(table.Metadata.Select(m => new Entry(m.Key, m.Value, m.Comment)).ToArray(), Json);
        return kv;
    }

    /// <summary>Puts units and descriptions on the columns and the table metadata on the table.</summary>
    public static void Apply(IReadOnlyDictionary<string, string> kv, Table table, string path)
    {
        foreach (var c in table.Columns)
        {
            if (kv.TryGetValue(UnitPrefix + c.Name, out var unit)) c.Unit = unit;
            if (kv.TryGetValue(DescriptionPrefix + c.Name, out var description)) c.Description = description;
        }
        if (!kv.TryGetValue(TableMetadata, out var json)) return;
        Entry[]? entries;
        try
        {
            entries = JsonSerializer.Deserialize<Entry[]>(json, Json);
        }
        catch (JsonException e)
        {
            throw new Errors.InputException($"key-value metadata '{TableMetadata}' is not valid JSON: {e.Message}", path, inner: e);
        }
        foreach (var e in entries ?? []) table.Metadata.Add((e.Key, e.Value, e.Comment));
    }
}
