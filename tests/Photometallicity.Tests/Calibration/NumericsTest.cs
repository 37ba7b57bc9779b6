using MathNet.Numerics.LinearAlgebra;
using Photometallicity.Calibration;
using Photometallicity.Numerics;

namespace Photometallicity.Tests.Calibration;

public class NumericsTest
{
    /// <summary>Small Cholesky solve and inverse against Math.NET Numerics' dense solver (tolerance 1e-10 relative).</summary>
    [Fact]
    public void SmallCholesky_MatchesMathNet()
    {
        var rng = new Rng(61);
        int n = 10;
        var g = Matrix<double>.Build.Dense(n, n, (_, _) => rng.NextGaussian());
        var a = g.TransposeThisAndMultiply(g) + Matrix<double>.Build.DenseIdentity(n);
        var b = Vector<double>.Build.Dense(n, _ => rng.NextGaussian());
        var l = new double[n * n];
        for (int i = 0; i < n; i++) for (int j = 0; j < n; j++) l[i * n + j] = a[i, j];
        Assert.True(SmallCholesky.Factor(l, n));
        var x = b.ToArray();
        SmallCholesky.Solve(l, n, x);
        var expect = a.Solve(b);
        for (int i = 0; i < n; i++) Assert.Equal(expect[i], x[i], 1e-10 * (1 + Math.Abs(expect[i])));
        var inv = new double[n * n];
        SmallCholesky.Inverse(l, n, inv);
        var ai = a.Inverse();
        for (int i = 0; i < n; i++) for (int j = 0; j < n; j++) Assert.Equal(ai[i, j], inv[i * n + j], 1e-10);
        var singular = new double[] { 1, 2, 2, 4 };
        Assert.False(SmallCholesky.Factor(singular, 2));
    }

    /// <summary>Brent's method finds the minimum of (x - 1.3)^2 + 0.1 x^4 (stationary point from the cubic, solved by bisection here).</summary>
    [Fact]
    public void Brent_FindsMinimum()
    {
        double x = BrentMinimizer.Minimize(static (_, t) => (t - 1.3) * (t - 1.3) + 0.1 * t * t * t * t, 0, -5.0, 5.0, 1e-8);
        double lo = -5, hi = 5; // derivative 2 (t - 1.3) + 0.4 t^3 is increasing: bisect for its root
        for (int i = 0; i < 200; i++) { double m = 0.5 * (lo + hi); if (2 * (m - 1.3) + 0.4 * m * m * m > 0) hi = m; else lo = m; }
        Assert.Equal(0.5 * (lo + hi), x, 1e-6);
    }

    [Fact]
    public void TermDerivatives_MatchFiniteDifferencesAndGradient()
    {
        var b = new PolynomialBasis2D(3, 1.2, 0.4, -1.5, 0.9);
        var c = new double[] { 0.3, -0.2, 0.5, 0.1, -0.3, 0.2, 0.05, -0.04, 0.03, -0.02 };
        var dC = new double[10]; var dF = new double[10];
        b.TermDerivatives(1.05, -1.1, dC, dF);
        double gc = c.Zip(dC).Sum(t => t.First * t.Second), gf = c.Zip(dF).Sum(t => t.First * t.Second);
        var (ec, ef) = b.Gradient(c, 1.05, -1.1);
        Assert.Equal(ec, gc, 1e-12);
        Assert.Equal(ef, gf, 1e-12);
        double h = 1e-6;
        Assert.Equal((b.Value(c, 1.05 + h, -1.1) - b.Value(c, 1.05 - h, -1.1)) / (2 * h), gc, 1e-6);
        Assert.Equal(new[] { "1", "u", "v", "u^2", "u v", "v^2", "u^3", "u^2 v", "u v^2", "v^3" }, b.TermNames());
    }

}
