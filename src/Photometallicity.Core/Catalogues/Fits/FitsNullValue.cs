namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// Chooses the TNULLn value of an integer column that has missing rows (FITS Standard 4.0, sect. 7.3.2): the most
/// negative value of the type (255 for the unsigned byte B) unless a real value uses it, then the smallest unused
/// value. When every value of the type is in use (only possible for B and I), the column is written one size wider.
/// This rule is this project's choice; the standard leaves the value free.
/// </summary>
internal static class FitsNullValue
{
    public static (char Code, int Width, long? Null) Choose(Column column)
    {
        var (code, width) = column.Type switch
        {
            ColumnType.Int64 => ('K', 8),
            ColumnType.Int32 => ('J', 4),
            ColumnType.Int16 => ('I', 2),
            ColumnType.Byte => ('B', 1),
            _ => throw new InvalidOperationException("not an integer column: " + column.Type),
        };
        bool anyMissing = false;
        for (int i = 0; i < column.Length && !anyMissing; i++) anyMissing = column.IsMissing(i);
        if (!anyMissing) return (code, width, null);

        while (true)
        {
            var (lo, hi, preferred) = code switch
            {
                'B' => (0L, 255L, 255L),
                'I' => (short.MinValue, short.MaxValue, (long)short.MinValue),
                'J' => (int.MinValue, int.MaxValue, (long)int.MinValue),
                _ => (long.MinValue, long.MaxValue, long.MinValue),
            };
            // Usually no row holds the preferred value: check that with one scan before building the set of used values.
            bool preferredUsed = false;
            for (int i = 0; i < column.Length && !preferredUsed; i++)
                preferredUsed = !column.IsMissing(i) && RawAt(column, i) == preferred;
            if (!preferredUsed) return (code, width, preferred);
            var used = new HashSet<long>();
            for (int i = 0; i < column.Length; i++) if (!column.IsMissing(i)) used.Add(RawAt(column, i));
            if (!used.Contains(preferred)) return (code, width, preferred);
            for (long v = lo; v <= hi && v - lo <= used.Count; v++)
                if (!used.Contains(v)) return (code, width, v);
            (code, width) = code == 'B' ? ('I', 2) : code == 'I' ? ('J', 4) : ('K', 8);
        }
    }

    public static long RawAt(Column column, int row) => column switch
    {
        Column<long> c => c.Values[row],
        Column<int> c => c.Values[row],
        Column<short> c => c.Values[row],
        Column<byte> c => c.Values[row],
        _ => throw new InvalidOperationException(),
    };
}
