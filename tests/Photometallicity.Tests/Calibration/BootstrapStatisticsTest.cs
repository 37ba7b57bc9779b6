using MathNet.Numerics.LinearAlgebra;
using Photometallicity.Calibration;
using Photometallicity.Numerics;

namespace Photometallicity.Tests.Calibration;

/// <summary>Statistical checks of the bootstrap against textbook results.</summary>
public class BootstrapStatisticsTest
{
    /// <summary>
    /// Homoscedastic Gaussian data, no errors in colour or [Fe/H], degree 1: the fit is ordinary least squares,
    /// so the pairs-bootstrap standard errors must agree with the analytic OLS standard errors
    /// s^2 (T^T T)^-1, s^2 = RSS / (N - p) (Efron &amp; Tibshirani 1993, An Introduction to the Bootstrap, ch. 9),
    /// computed here independently with Math.NET Numerics. Tolerance 10% (bootstrap Monte Carlo error with
    /// B = 1000 is about 1/sqrt(2B) = 2%).
    /// </summary>
    [Fact]
    public void BootstrapStandardErrors_MatchAnalyticOlsForHomoscedasticData()
    {
        var spec = new SyntheticStandards.Spec
        {
            Stars = 300, SigmaColour = 0, Correlation = 0, SigmaFeh = 0, SigmaIndex = 0, SigmaInt = 0.05,
            Model = (c, f) => 0.3 + 0.6 * c + 0.25 * f,
        };
        var st = SyntheticStandards.Make(spec, 21);
        var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 1000, degree: 1) with { Monotone = false, Outliers = false });
        var b = r.Model.Basis;
        int n = st.Count, p = b.Count;
        var t = Matrix<double>.Build.Dense(n, p);
        var row = new double[p];
        for (int i = 0; i < n; i++)
        {
            b.Terms(st.Colour0[i], st.Feh[i], row);
            for (int k = 0; k < p; k++) t[i, k] = row[k];
        }
        var y = Vector<double>.Build.DenseOfArray(st.Index0);
        var beta = t.QR().Solve(y);
        var resid = y - t * beta;
        double s2 = resid.DotProduct(resid) / (n - p);
        var cov = (t.TransposeThisAndMultiply(t)).Inverse() * s2;
        for (int k = 0; k < p; k++)
        {
            Assert.Equal(beta[k], r.Model.Coefficients[k], 1e-8);
            double se = Math.Sqrt(cov[k, k]);
            double boot = r.BootstrapStandardErrors[k];
            Assert.True(Math.Abs(boot / se - 1) < 0.10, $"coefficient {k}: bootstrap SE {boot:G4}, OLS SE {se:G4}");
            // The inverse Fisher matrix at the ML sigma_int is the OLS covariance up to (N - p) / N.
            Assert.Equal(se * Math.Sqrt((n - p) / (double)n), Math.Sqrt(r.Model.CoefficientCovariance[k * p + k]), 0.01 * se);
        }
        Assert.Equal(Math.Sqrt(s2 * (n - p) / n), r.Model.SigmaInt, 1e-3);
    }

    /// <summary>
    /// Coverage: over 200 synthetic repeats the 68% percentile bootstrap interval (16th to 84th percentile) of the
    /// [Fe/H] slope coefficient must contain the truth in 60-76% of repeats (binomial sd of the rate: 3.3%;
    /// percentile intervals, Efron &amp; Tibshirani 1993, ch. 13).
    /// </summary>
    [Fact]
    public void BootstrapIntervals_CoverTheTruthAtTheNominalRate()
    {
        const double slope = 0.25;
        var spec = new SyntheticStandards.Spec
        {
            Stars = 40, SigmaColour = 0, Correlation = 0, SigmaFeh = 0, SigmaIndex = 0.03, SigmaInt = 0.02,
            Model = (c, f) => 0.3 + 0.6 * c + slope * f,
        };
        int hits = 0, repeats = 200;
        // Repeats are independent: run them in parallel, each fit single-threaded.
        Parallel.For(0, repeats, rep =>
        {
            var st = SyntheticStandards.Make(spec, 1000 + (ulong)rep);
            var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 200, degree: 1, seed: (ulong)rep) with { MaxThreads = 1, Monotone = false });
            double truth = slope * ((PolynomialBasis2D)r.Model.Basis).FehScale; // coefficient of v = ([Fe/H] - centre) / scale
            var draws = r.Model.EnsembleCoefficients.Select(e => e[2]).Order().ToArray();
            double lo = Quantile(draws, 0.16), hi = Quantile(draws, 0.84);
            if (truth >= lo && truth <= hi) Interlocked.Increment(ref hits);
        });
        double rate = hits / (double)repeats;
        Assert.InRange(rate, 0.60, 0.76);
    }

    /// <summary>Block bootstrap: every cluster's members get the same multiplicity; individual stars are drawn singly.</summary>
    [Fact]
    public void ResampleUnits_KeepsClustersTogether()
    {
        var st = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 30, Clusters = 4, StarsPerCluster = 7 }, 22);
        var usable = Enumerable.Repeat(true, st.Count).ToArray();
        var units = ResampleUnits.Build(st.Group, usable);
        Assert.Equal(30 + 4, units.Count);
        var m = new double[st.Count];
        bool clusterDrawnTwice = false;
        for (int b = 0; b < 200; b++)
        {
            units.Draw(Seeds.For(1, "calibration-bootstrap", b), m);
            Assert.Equal(units.Count, m.Select((v, i) => (v, i)).Sum(t => st.Group[t.i] < 0 ? t.v : t.v / 7.0), 9);
            for (int g = 0; g < 4; g++)
            {
                var members = Enumerable.Range(0, st.Count).Where(i => st.Group[i] == g).Select(i => m[i]).Distinct().ToArray();
                Assert.Single(members);
                clusterDrawnTwice |= members[0] >= 2;
            }
        }
        Assert.True(clusterDrawnTwice);
        // Cross-validation folds: a cluster is never split.
        var fold = units.AssignFolds(5, st.Count, 3);
        for (int g = 0; g < 4; g++)
            Assert.Single(Enumerable.Range(0, st.Count).Where(i => st.Group[i] == g).Select(i => fold[i]).Distinct());
        Assert.Equal(5, fold.Distinct().Count());
    }

    [Fact]
    public void Run_WithClusters_FitsAndKeepsClusterMembersAccepted()
    {
        var st = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 60, Clusters = 5, StarsPerCluster = 12 }, 23);
        var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 50));
        Assert.True(r.PerStandard.Skip(60).Count(v => v.Accepted) >= 57);
        Assert.Equal(50, r.Model.EnsembleCoefficients.Length);
    }

    private static double Quantile(double[] sorted, double q)
    {
        double h = (sorted.Length - 1) * q;
        int i = (int)Math.Floor(h);
        return i + 1 < sorted.Length ? sorted[i] + (h - i) * (sorted[i + 1] - sorted[i]) : sorted[i];
    }
}
