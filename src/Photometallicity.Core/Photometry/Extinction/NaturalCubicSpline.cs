namespace Photometallicity.Photometry.Extinction;

/// <summary>
/// Interpolating cubic spline with natural end conditions (second derivative zero at both ends), the form
/// Fitzpatrick (1999, PASP 111, 63, Sect. 3) specifies for his optical/IR curve. Second derivatives from the
/// tridiagonal system solved by the Thomas algorithm (standard textbook method, e.g. Press et al. 2007,
/// Numerical Recipes 3rd ed., Sect. 3.3). Outside the knots the end cubic pieces are extended.
/// </summary>
internal sealed class NaturalCubicSpline
{
    private readonly double[] _x, _y, _m;

    public NaturalCubicSpline(double[] x, double[] y)
    {
        int n = x.Length;
        if (n < 3 || y.Length != n) throw new ArgumentException("a natural cubic spline needs at least 3 knots and as many values");
        for (int i = 1; i < n; i++)
            if (!(x[i] > x[i - 1])) throw new ArgumentException("spline knots must increase");
        _x = (double[])x.Clone();
        _y = (double[])y.Clone();
        _m = new double[n];
        // Rows i = 1..n-2: h_{i-1} m_{i-1} + 2 (h_{i-1} + h_i) m_i + h_i m_{i+1} = 6 (slope_i - slope_{i-1}); m_0 = m_{n-1} = 0.
        var c = new double[n];
        var d = new double[n];
        for (int i = 1; i < n - 1; i++)
        {
            double h0 = x[i] - x[i - 1], h1 = x[i + 1] - x[i];
            double rhs = 6.0 * ((y[i + 1] - y[i]) / h1 - (y[i] - y[i - 1]) / h0);
            double diag = 2.0 * (h0 + h1) - h0 * c[i - 1];
            c[i] = h1 / diag;
            d[i] = (rhs - h0 * d[i - 1]) / diag;
        }
        for (int i = n - 2; i >= 1; i--) _m[i] = d[i] - c[i] * _m[i + 1];
    }

    public double Evaluate(double x)
    {
        int n = _x.Length;
        int j = Array.BinarySearch(_x, x);
        if (j < 0) j = ~j - 1;
        j = Math.Clamp(j, 0, n - 2);
        double h = _x[j + 1] - _x[j];
        double a = (_x[j + 1] - x) / h, b = (x - _x[j]) / h;
        return a * _y[j] + b * _y[j + 1] + ((a * a * a - a) * _m[j] + (b * b * b - b) * _m[j + 1]) * h * h / 6.0;
    }
}
