using Photometallicity.Calibration;

namespace Photometallicity.Tests.Calibration;

public class MonotoneModelTest
{
    private static readonly MonotoneRamps Ramps = new(-3.0, -0.5, [-2.2, -1.4]);

    [Fact]
    public void Ramps_RiseFromZeroToOne_MonotoneEverywhere_SlopeMatchesFiniteDifference()
    {
        int n = Ramps.Count;
        Assert.Equal(4, n);
        Span<double> v = stackalloc double[n], s = stackalloc double[n], vp = stackalloc double[n], vm = stackalloc double[n], tmp = stackalloc double[n];
        Ramps.Evaluate(-3.0, v, s);
        foreach (double x in v) Assert.Equal(0.0, x, 12);
        Ramps.Evaluate(-0.5, v, s);
        foreach (double x in v) Assert.Equal(1.0, x, 12);
        var prev = new double[n];
        Ramps.Evaluate(-6.0, prev, tmp);
        for (double f = -5.99; f <= 2.0; f += 0.01)
        {
            Ramps.Evaluate(f, v, s);
            for (int j = 0; j < n; j++)
            {
                Assert.True(v[j] >= prev[j] - 1e-12, $"I_{j} falls at {f}");
                Assert.True(s[j] >= 0);
                prev[j] = v[j];
            }
            const double h = 1e-6;
            Ramps.Evaluate(f + h, vp, tmp);
            Ramps.Evaluate(f - h, vm, tmp);
            for (int j = 0; j < n; j++) Assert.Equal((vp[j] - vm[j]) / (2 * h), s[j], 1e-5);
        }
    }

    /// <summary>
    /// Ramsay (1988, Statistical Science 3, 425): with a clamped knot vector the I-splines of one order plus the constant span the
    /// splines of that order, in particular every straight line, here with non-negative weights for a rising line.
    /// </summary>
    [Fact]
    public void Ramps_NonNegativeCombinationReproducesAStraightLine()
    {
        // x = lo + sum_j (xi_j - xi_(j-1)) I_j(x), xi the Greville abscissae (t_(j+1) + t_(j+2)) / 2 of the quadratic B-splines.
        double[] t = [-3, -3, -3, -2.2, -1.4, -0.5, -0.5, -0.5];
        var xi = Enumerable.Range(0, 5).Select(m => 0.5 * (t[m + 1] + t[m + 2])).ToArray();
        Span<double> v = stackalloc double[4], s = stackalloc double[4];
        for (double f = -3; f <= -0.5; f += 0.05)
        {
            Ramps.Evaluate(f, v, s);
            double y = -3;
            for (int j = 0; j < 4; j++) y += (xi[j + 1] - xi[j]) * v[j];
            Assert.Equal(f, y, 1e-12);
        }
    }

    [Fact]
    public void Basis_TermsAgreeWithEvaluationInsideTheColours_AndTheModelRisesWithFehEverywhere()
    {
        var b = new MonotoneBasis(2, 0.8, 1.4, Ramps);
        var rng = new Photometallicity.Numerics.Rng(3);
        var c = new double[b.Count];
        for (int k = 0; k < c.Length; k++) c[k] = b.NonNegative![k] ? rng.NextDouble() * 0.3 : rng.NextGaussian() * 0.5;
        c[b.ColourDegree + 1] = 0; // a ramp switched off at the blue end
        Span<double> t = stackalloc double[b.Count], dc = stackalloc double[b.Count], df = stackalloc double[b.Count];
        for (double col = 0.8; col <= 1.4; col += 0.05)
            for (double f = -3.5; f <= 0.5; f += 0.25)
            {
                b.Terms(col, f, t);
                double lin = 0;
                for (int k = 0; k < t.Length; k++) lin += c[k] * t[k];
                Assert.Equal(b.Value(c, col, f), lin, 12);
                b.TermDerivatives(col, f, dc, df);
                var (gc, gf) = b.Gradient(c, col, f);
                double sc = 0, sf = 0;
                for (int k = 0; k < t.Length; k++) { sc += c[k] * dc[k]; sf += c[k] * df[k]; }
                Assert.Equal(gc, sc, 10);
                Assert.Equal(gf, sf, 10);
            }
        // Monotone in [Fe/H] at any colour, far outside the standards' colours too.
        foreach (double col in new[] { -0.5, 0.3, 0.8, 1.1, 1.4, 2.5 })
        {
            var s = b.Slice(c, col);
            double prev = double.NegativeInfinity;
            for (double f = -6; f <= 2; f += 0.01)
            {
                double v = s.At(f).Value;
                Assert.True(v >= prev - 1e-12, $"falls at colour {col}, [Fe/H] {f}");
                prev = v;
            }
        }
    }

    /// <summary>
    /// Reference: scipy.optimize.nnls (scipy 1.10.1, Debian python3-scipy) on A, b drawn with numpy.random.default_rng(7),
    /// rounded to 6 decimals: x = nnls(A, b)[0]. Our solver works on the normal equations A^T A, A^T b.
    /// </summary>
    [Fact]
    public void BoundedLeastSquares_MatchesScipyNnls()
    {
        double[][] a =
        [
            [0.00123, 0.298746, -0.274138, -0.890592, -0.454671], [-0.991647, 0.060144, 1.340215, -0.492207, -0.620475],
            [0.489842, 0.356887, 0.105414, -0.930468, -0.029252], [0.695303, -1.344215, -0.457616, -1.901223, -1.289538],
            [-1.841735, -0.235091, -1.267446, 0.271264, 0.156751], [-0.186931, -2.51676, -0.538693, -0.048501, 0.113309],
            [-1.530136, -0.477753, -0.978519, -0.808837, 1.060899], [-0.807535, -0.032522, 0.88439, -0.5836, -0.111702],
            [0.110464, 0.063782, -1.225056, 0.07614, 1.358823], [-1.547145, 0.859383, 0.119354, -0.64147, 2.000417],
            [0.76226, -1.199289, 0.074516, 0.57669, -0.188782], [0.68291, -0.066517, 0.667248, 1.438523, -0.675662],
        ];
        double[] y = [0.203139, -0.463308, 0.127268, -1.187195, -0.579302, -0.196196, 0.898764, 1.145222, -1.323528, -0.794642, 0.646903, -1.99242];
        double[] expected = [0.0, 0.0, 0.18339844888923484, 0.0, 0.09167559117513542];
        int p = 5;
        var ata = new double[p * p];
        var atb = new double[p];
        for (int i = 0; i < a.Length; i++)
            for (int r = 0; r < p; r++)
            {
                atb[r] += a[i][r] * y[i];
                for (int c = 0; c < p; c++) ata[r * p + c] += a[i][r] * a[i][c];
            }
        var x = new double[p];
        Assert.True(BoundedLeastSquares.Solve(ata, atb, p, Enumerable.Repeat(true, p).ToArray(), x));
        for (int k = 0; k < p; k++) Assert.Equal(expected[k], x[k], 1e-9);
        // With the first two free, the solution is the least squares over them plus the constrained rest (checked by KKT).
        var nonNeg = new[] { false, false, true, true, true };
        Assert.True(BoundedLeastSquares.Solve(ata, atb, p, nonNeg, x));
        for (int k = 0; k < p; k++)
        {
            double g = -atb[k];
            for (int m = 0; m < p; m++) g += ata[k * p + m] * x[m];
            if (!nonNeg[k] || x[k] > 0) Assert.Equal(0.0, g, 1e-9); // stationary in the passive set
            else Assert.True(g >= -1e-9);                           // a bound variable would only make things worse
        }
        Assert.True(x[0] < 0 || x[1] < 0, "the free variables use their freedom here");
    }
}
