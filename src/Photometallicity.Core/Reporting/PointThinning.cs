namespace Photometallicity.Reporting;

/// <summary>
/// Deterministic thinning of dense scatter for vector output: an evenly spaced subsample of the point
/// indices (index floor(k n / max) for k = 0..max-1), so the same data always gives the same picture and
/// every part of the input order is represented.
/// </summary>
internal static class PointThinning
{
    /// <summary>Indices 0..n-1 of the points to draw: all of them, or an even subsample of <paramref name="max"/>.</summary>
    public static int[] Select(int n, int? max)
    {
        if (max is not int m || n <= m) return Enumerable.Range(0, n).ToArray();
        var idx = new int[m];
        for (int k = 0; k < m; k++) idx[k] = (int)((long)k * n / m);
        return idx;
    }

    /// <summary>Indices of the rows where every given column is finite.</summary>
    public static int[] Finite(int n, params double[]?[] columns)
    {
        var keep = new List<int>(n);
        for (int i = 0; i < n; i++)
        {
            bool ok = true;
            foreach (var c in columns)
                if (c is not null && !double.IsFinite(c[i])) { ok = false; break; }
            if (ok) keep.Add(i);
        }
        return keep.ToArray();
    }

    /// <summary>Of the given row indices, an even subsample of at most <paramref name="max"/>.</summary>
    public static int[] Thin(int[] rows, int? max)
    {
        int[] pick = Select(rows.Length, max);
        if (pick.Length == rows.Length) return rows;
        var result = new int[pick.Length];
        for (int k = 0; k < pick.Length; k++) result[k] = rows[pick[k]];
        return result;
    }

    public static double[] Take(double[] values, int[] rows)
    {
        var r = new double[rows.Length];
        for (int k = 0; k < rows.Length; k++) r[k] = values[rows[k]];
        return r;
    }
}
