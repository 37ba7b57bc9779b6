using Photometallicity.Errors;

namespace Photometallicity.Catalogues;

/// <summary>
/// A columnar in-memory catalogue: ordered, uniquely named columns of equal length, plus free-form
/// header metadata (FITS keywords, provenance) carried from reader to writer.
/// </summary>
public sealed class Table
{
    private readonly List<Column> _columns = new();
    private readonly Dictionary<string, Column> _byName = new(StringComparer.Ordinal);

    public Table(int rowCount, string? source = null)
    {
        RowCount = rowCount;
        Source = source;
    }

    public Table(IEnumerable<Column> columns, string? source = null)
    {
        Source = source;
        RowCount = -1;
        foreach (var c in columns) Add(c);
        if (RowCount < 0) RowCount = 0;
    }

    public int RowCount { get; private set; }

    /// <summary>The file this table was read from, for messages; null when built in memory.</summary>
    public string? Source { get; }

    public IReadOnlyList<Column> Columns => _columns;

    /// <summary>Every column name of the file, when a reader kept only some of them (<see cref="ReadOptions.Columns"/>); else null.</summary>
    public IReadOnlyList<string>? ColumnsInFile { get; set; }

    /// <summary>Header keywords (name, value, comment) that writers carry where the format allows.</summary>
    public List<(string Key, string Value, string? Comment)> Metadata { get; } = new();

    public Column this[string name] => _byName[name];

    public bool Contains(string name) => _byName.ContainsKey(name);

    public bool TryGet(string name, out Column column) => _byName.TryGetValue(name, out column!);

    public Table Add(Column column)
    {
        if (RowCount < 0) RowCount = column.Length;
        if (column.Length != RowCount)
            throw new ArgumentException($"Column '{column.Name}' has {column.Length} rows, the table {RowCount}.");
        if (!_byName.TryAdd(column.Name, column))
            throw new ArgumentException($"Column '{column.Name}' already exists.");
        _columns.Add(column);
        return this;
    }

    /// <summary>
    /// The named column, or an <see cref="InputException"/> naming the file, the missing column and the columns
    /// that do exist. <paramref name="configKey"/> names the config key that asked for it, when there is one.
    /// </summary>
    public Column Require(string name, string? configKey = null)
    {
        if (_byName.TryGetValue(name, out var c)) return c;
        string asked = configKey is null ? "" : $" (asked for by config key '{configKey}')";
        string found = string.Join(", ", ColumnsInFile ?? _columns.Select(x => x.Name).ToList());
        throw new InputException($"no column named '{name}'{asked}; the columns found are: {found}", Source);
    }

    /// <summary>The named column as doubles (NaN where missing), with the same error as <see cref="Require"/>.</summary>
    public double[] RequireDoubles(string name, string? configKey = null) => Require(name, configKey).ToDoubleArray();

    /// <summary>
    /// Like <see cref="RequireDoubles"/>, but a double column without a mask is returned as its own array instead of a copy
    /// (8 bytes a row saved): for callers that only read it.
    /// </summary>
    public double[] ReadOnlyDoubles(string name, string? configKey = null) =>
        Require(name, configKey) is Column<double> { Missing: null } c ? c.Values : Require(name, configKey).ToDoubleArray();

    /// <summary>A new table holding the given rows, in that order.</summary>
    public Table Select(ReadOnlySpan<int> rows)
    {
        var t = new Table(rows.Length, Source);
        foreach (var c in _columns) t.Add(c.Select(rows));
        t.Metadata.AddRange(Metadata);
        return t;
    }
}
