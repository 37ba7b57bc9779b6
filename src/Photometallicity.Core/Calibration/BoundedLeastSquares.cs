namespace Photometallicity.Calibration;

/// <summary>
/// Minimises 1/2 c^T A c - b^T c for a small symmetric positive-definite A (the normal equations of a weighted least-squares
/// fit), with c_k &gt;= 0 for the flagged coefficients and the others free: the active-set algorithm NNLS of Lawson &amp; Hanson
/// (1974, Solving Least Squares Problems, Prentice-Hall, ch. 23), written on the normal equations and with free variables
/// always in the passive set. Returns false when a passive subsystem is singular.
/// </summary>
internal static class BoundedLeastSquares
{
    private const int MaxOuter = 200;

    public static bool Solve(ReadOnlySpan<double> a, ReadOnlySpan<double> b, int p, bool[]? nonNegative, Span<double> c)
    {
        if (nonNegative is null) return SolveSubset(a, b, p, null, c);
        var passive = new bool[p];
        for (int k = 0; k < p; k++) passive[k] = !nonNegative[k];
        c.Clear();
        var z = new double[p];
        if (!SolveSubset(a, b, p, passive, z)) return false;
        z.CopyTo(c);
        // With only the free variables, c is their unconstrained optimum; now add constrained ones as long as one helps.
        double scale = 0;
        for (int k = 0; k < p; k++) scale = Math.Max(scale, Math.Abs(b[k]));
        double tol = 1e-12 * Math.Max(scale, 1e-300);
        for (int outer = 0; outer < MaxOuter; outer++)
        {
            // Negative gradient w = b - A c; the constrained active variable with the largest w would lower the objective.
            int best = -1;
            double wBest = tol;
            for (int k = 0; k < p; k++)
            {
                if (passive[k]) continue;
                double w = b[k];
                for (int m = 0; m < p; m++) w -= a[k * p + m] * c[m];
                if (w > wBest) { wBest = w; best = k; }
            }
            if (best < 0) return true;
            passive[best] = true;
            for (int inner = 0; inner < MaxOuter; inner++)
            {
                if (!SolveSubset(a, b, p, passive, z)) return false;
                bool feasible = true;
                for (int k = 0; k < p; k++) if (passive[k] && nonNegative[k] && z[k] <= 0) { feasible = false; break; }
                if (feasible) { z.CopyTo(c); break; }
                // Step from c towards z as far as feasibility allows; variables that reach zero leave the passive set.
                double alpha = 1;
                for (int k = 0; k < p; k++)
                    if (passive[k] && nonNegative[k] && z[k] <= 0) alpha = Math.Min(alpha, c[k] / (c[k] - z[k]));
                for (int k = 0; k < p; k++)
                {
                    if (!passive[k]) continue;
                    c[k] += alpha * (z[k] - c[k]);
                    if (nonNegative[k] && c[k] <= 1e-15 * (1 + Math.Abs(z[k]))) { c[k] = 0; passive[k] = false; }
                }
            }
        }
        return true;
    }

    /// <summary>Solves the passive subsystem (all of it when <paramref name="passive"/> is null), other coefficients zero.</summary>
    private static bool SolveSubset(ReadOnlySpan<double> a, ReadOnlySpan<double> b, int p, bool[]? passive, Span<double> z)
    {
        Span<int> idx = stackalloc int[p];
        int q = 0;
        for (int k = 0; k < p; k++) if (passive is null || passive[k]) idx[q++] = k;
        z.Clear();
        if (q == 0) return true;
        var sub = new double[q * q];
        var rhs = new double[q];
        for (int r = 0; r < q; r++)
        {
            rhs[r] = b[idx[r]];
            for (int s = 0; s < q; s++) sub[r * q + s] = a[idx[r] * p + idx[s]];
        }
        if (!SmallCholesky.Factor(sub, q)) return false;
        SmallCholesky.Solve(sub, q, rhs);
        for (int r = 0; r < q; r++) z[idx[r]] = rhs[r];
        return true;
    }
}
