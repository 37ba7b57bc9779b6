using System.Globalization;

namespace Photometallicity.Catalogues;

/// <summary>
/// A column of element type <typeparamref name="T"/>. Missing values are kept in an optional mask;
/// for float and double a NaN is missing as well, for strings a null.
/// </summary>
public sealed class Column<T> : Column
{
    private static readonly ColumnType ElementType = TypeOf();

    public Column(string name, T[] values, bool[]? missing = null, string? unit = null, string? description = null)
        : base(name, unit, description)
    {
        if (missing is not null && missing.Length != values.Length)
            throw new ArgumentException($"Column '{name}': mask has {missing.Length} entries, values {values.Length}.");
        Values = values;
        Missing = missing;
    }

    /// <summary>The raw values (the value at a missing row is unspecified).</summary>
    public T[] Values { get; }

    /// <summary>True where a value is missing; null when no row is masked.</summary>
    public bool[]? Missing { get; private set; }

    public override ColumnType Type => ElementType;
    public override int Length => Values.Length;

    public T this[int row] => Values[row];

    public void SetMissing(int row)
    {
        Missing ??= new bool[Values.Length];
        Missing[row] = true;
    }

    public override bool IsMissing(int row)
    {
        if (Missing is not null && Missing[row]) return true;
        return Values[row] switch
        {
            double d => double.IsNaN(d),
            float f => float.IsNaN(f),
            null => true,
            _ => false,
        };
    }

    public override double GetDouble(int row)
    {
        if (Missing is not null && Missing[row]) return double.NaN;
        object? v = Values[row];
        return v switch
        {
            double d => d,
            float f => f,
            long l => l,
            int i => i,
            short s => s,
            byte b => b,
            bool t => t ? 1.0 : 0.0,
            string s => double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out var x) ? x : double.NaN,
            _ => double.NaN,
        };
    }

    public override string? GetString(int row)
    {
        if (IsMissing(row)) return null;
        object? v = Values[row];
        return v switch
        {
            double d => d.ToString("R", CultureInfo.InvariantCulture),
            float f => f.ToString("R", CultureInfo.InvariantCulture),
            bool t => t ? "true" : "false",
            IFormattable fm => fm.ToString(null, CultureInfo.InvariantCulture),
            _ => v?.ToString(),
        };
    }

    /// <summary>The same values as <see cref="GetDouble"/> row by row, without boxing each element.</summary>
    public override double[] ToDoubleArray()
    {
        var a = new double[Values.Length];
        switch (Values)
        {
            case double[] d: Array.Copy(d, a, d.Length); break;
            case float[] f: for (int i = 0; i < f.Length; i++) a[i] = f[i]; break;
            case long[] l: for (int i = 0; i < l.Length; i++) a[i] = l[i]; break;
            case int[] n: for (int i = 0; i < n.Length; i++) a[i] = n[i]; break;
            default: return base.ToDoubleArray();
        }
        if (Missing is { } m)
            for (int i = 0; i < a.Length; i++) if (m[i]) a[i] = double.NaN;
        return a;
    }

    public override Column Select(ReadOnlySpan<int> rows)
    {
        var v = new T[rows.Length];
        bool[]? m = Missing is null ? null : new bool[rows.Length];
        for (int i = 0; i < rows.Length; i++)
        {
            v[i] = Values[rows[i]];
            if (m is not null) m[i] = Missing![rows[i]];
        }
        return new Column<T>(Name, v, m, Unit, Description);
    }

    public override Column Rename(string newName) => new Column<T>(newName, Values, Missing, Unit, Description);

    private static ColumnType TypeOf()
    {
        var t = typeof(T);
        if (t == typeof(double)) return ColumnType.Double;
        if (t == typeof(float)) return ColumnType.Float;
        if (t == typeof(long)) return ColumnType.Int64;
        if (t == typeof(int)) return ColumnType.Int32;
        if (t == typeof(short)) return ColumnType.Int16;
        if (t == typeof(byte)) return ColumnType.Byte;
        if (t == typeof(bool)) return ColumnType.Boolean;
        if (t == typeof(string)) return ColumnType.String;
        throw new NotSupportedException($"Column element type {t.Name} is not supported.");
    }
}
