namespace Photometallicity.Calibration;

/// <summary>
/// In-place Cholesky factorisation A = L L^T of a small symmetric positive-definite matrix (row-major, n x n),
/// with solve and inverse, allocation-free (Golub &amp; Van Loan 2013, Matrix Computations, 4th ed., Alg. 4.2.2).
/// Used for the calibration's normal equations (n &lt;= 15).
/// </summary>
internal static class SmallCholesky
{
    /// <summary>Overwrites the lower triangle of <paramref name="a"/> with L. False when A is not positive definite.</summary>
    public static bool Factor(Span<double> a, int n)
    {
        for (int j = 0; j < n; j++)
        {
            double d = a[j * n + j];
            for (int k = 0; k < j; k++) d -= a[j * n + k] * a[j * n + k];
            // Relative pivot test: a pivot that lost all but ~1e-12 of its size is numerical rank deficiency.
            if (!(d > 1e-12 * Math.Abs(a[j * n + j])) || !double.IsFinite(d)) return false;
            double l = Math.Sqrt(d);
            a[j * n + j] = l;
            for (int i = j + 1; i < n; i++)
            {
                double s = a[i * n + j];
                for (int k = 0; k < j; k++) s -= a[i * n + k] * a[j * n + k];
                a[i * n + j] = s / l;
            }
        }
        return true;
    }

    /// <summary>Solves L L^T x = b in place (b becomes x), with L from <see cref="Factor"/>.</summary>
    public static void Solve(ReadOnlySpan<double> l, int n, Span<double> b)
    {
        for (int i = 0; i < n; i++)
        {
            double s = b[i];
            for (int k = 0; k < i; k++) s -= l[i * n + k] * b[k];
            b[i] = s / l[i * n + i];
        }
        for (int i = n - 1; i >= 0; i--)
        {
            double s = b[i];
            for (int k = i + 1; k < n; k++) s -= l[k * n + i] * b[k];
            b[i] = s / l[i * n + i];
        }
    }

    /// <summary>Writes A^-1 (full, row-major) into <paramref name="inverse"/>, from the factor L.</summary>
    public static void Inverse(ReadOnlySpan<double> l, int n, Span<double> inverse)
    {
        Span<double> col = n <= 64 ? stackalloc double[n] : new double[n];
        for (int j = 0; j < n; j++)
        {
            col.Clear();
            col[j] = 1.0;
            Solve(l, n, col);
            for (int i = 0; i < n; i++) inverse[i * n + j] = col[i];
        }
        // Symmetrise against round-off.
        for (int i = 0; i < n; i++)
            for (int j = i + 1; j < n; j++)
            {
                double m = 0.5 * (inverse[i * n + j] + inverse[j * n + i]);
                inverse[i * n + j] = inverse[j * n + i] = m;
            }
    }
}
