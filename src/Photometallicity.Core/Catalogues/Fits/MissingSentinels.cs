namespace Photometallicity.Catalogues.Fits;

/// <summary>Marks numeric values equal to one of <see cref="ReadOptions.MissingSentinels"/> as missing.</summary>
internal static class MissingSentinels
{
    public static Column Apply(Column column, IReadOnlyList<double> sentinels)
    {
        if (sentinels.Count == 0 || column.Type is ColumnType.String or ColumnType.Boolean) return column;
        switch (column)
        {
            case Column<double> d:
                for (int i = 0; i < d.Length; i++) if (Matches(d.Values[i], sentinels)) d.Values[i] = double.NaN;
                return d;
            case Column<float> f:
                for (int i = 0; i < f.Length; i++) if (MatchesSingle(f.Values[i], sentinels)) f.Values[i] = float.NaN;
                return f;
            default:
                for (int i = 0; i < column.Length; i++)
                    if (!column.IsMissing(i) && Matches(column.GetDouble(i), sentinels)) Mask(column, i);
                return column;
        }
    }

    private static bool Matches(double v, IReadOnlyList<double> sentinels)
    {
        for (int k = 0; k < sentinels.Count; k++) if (v == sentinels[k]) return true;
        return false;
    }

    /// <summary>A Float column holds the sentinel rounded to single precision (99.999f is not 99.999).</summary>
    private static bool MatchesSingle(float v, IReadOnlyList<double> sentinels)
    {
        for (int k = 0; k < sentinels.Count; k++) if (v == (float)sentinels[k]) return true;
        return false;
    }

    private static void Mask(Column column, int row)
    {
        switch (column)
        {
            case Column<long> c: c.SetMissing(row); break;
            case Column<int> c: c.SetMissing(row); break;
            case Column<short> c: c.SetMissing(row); break;
            case Column<byte> c: c.SetMissing(row); break;
        }
    }
}
