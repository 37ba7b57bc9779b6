namespace Photometallicity.Catalogues;

/// <summary>
/// One typed column of a <see cref="Table"/>: a name, an element type, an optional unit and description,
/// and a value per row, any of which may be missing.
/// </summary>
public abstract class Column
{
    protected Column(string name, string? unit, string? description)
    {
        Name = name;
        Unit = unit;
        Description = description;
    }

    public string Name { get; }
    public string? Unit { get; set; }
    public string? Description { get; set; }

    public abstract ColumnType Type { get; }
    public abstract int Length { get; }

    /// <summary>True where the row has no value (masked, NaN for floating types, null for strings).</summary>
    public abstract bool IsMissing(int row);

    /// <summary>The value as a double; NaN where missing. Strings parse invariantly or give NaN.</summary>
    public abstract double GetDouble(int row);

    /// <summary>The value as invariant text; null where missing.</summary>
    public abstract string? GetString(int row);

    /// <summary>A copy of the column restricted to the given rows, in that order.</summary>
    public abstract Column Select(ReadOnlySpan<int> rows);

    /// <summary>A copy with another name (same values, unit and description).</summary>
    public abstract Column Rename(string newName);

    /// <summary>The whole column as doubles, NaN where missing.</summary>
    public virtual double[] ToDoubleArray()
    {
        var a = new double[Length];
        for (int i = 0; i < a.Length; i++) a[i] = GetDouble(i);
        return a;
    }

    public override string ToString() => $"{Name} ({Type}{(Unit is null ? "" : ", " + Unit)}, {Length} rows)";
}
