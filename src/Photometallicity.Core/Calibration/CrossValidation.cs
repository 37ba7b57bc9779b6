namespace Photometallicity.Calibration;

/// <summary>
/// k-fold cross-validation of the forward model at one degree, with whole clusters in one fold. Each fold is
/// refitted from the other folds with the full procedure (including clipping); the held-out standards'
/// residuals are predicted from that fit. The score is the mean squared held-out index residual (mag^2) of the
/// held-out standards within the clipping limit (so that gross outliers, which the fit would reject, do not
/// decide the degree); its standard error is the spread of the per-fold scores / sqrt(folds)
/// (Hastie, Tibshirani &amp; Friedman 2009, The Elements of Statistical Learning, 2nd ed., section 7.10).
/// </summary>
internal static class CrossValidation
{
    internal sealed record Outcome(int Degree, double Score, double StandardError, double[] Residual, double[] ResidualDex, string? Failure);

    public static Outcome Run(FitData d, int[] fold, int folds, PolynomialBasis2D basis, double clip)
    {
        int n = d.N, p = basis.Count;
        var resid = Enumerable.Repeat(double.NaN, n).ToArray();
        var dex = Enumerable.Repeat(double.NaN, n).ToArray();
        var fit = new EffectiveVarianceFit(d, basis, clip);
        var w = new double[n];
        var foldScores = new List<double>();
        double ssr = 0;
        int count = 0;
        Span<double> dC = stackalloc double[p];
        Span<double> dF = stackalloc double[p];
        for (int f = 0; f < folds; f++)
        {
            int train = 0, held = 0;
            for (int i = 0; i < n; i++)
            {
                bool inTrain = d.Usable[i] && fold[i] >= 0 && fold[i] != f;
                w[i] = inTrain ? 1.0 : 0.0;
                if (inTrain) train++;
                else if (d.Usable[i] && fold[i] == f) held++;
            }
            if (held == 0) continue;
            if (train < p + 2)
                return Fail(basis.Degree, $"fold {f + 1} leaves {train} standards to fit {p} coefficients (at least {p + 2} needed)");
            string? err = fit.Fit(w);
            if (err is not null) return Fail(basis.Degree, $"fold {f + 1}: {err}");
            var c = fit.Coefficients;
            double s2 = fit.SigmaInt * fit.SigmaInt, foldSsr = 0;
            int foldCount = 0;
            for (int i = 0; i < n; i++)
            {
                if (!d.Usable[i] || fold[i] != f) continue;
                double model = basis.Value(c, d.C[i], d.F[i]);
                basis.TermDerivatives(d.C[i], d.F[i], dC, dF);
                double gc = 0, gf = 0;
                for (int k = 0; k < p; k++) { gc += c[k] * dC[k]; gf += c[k] * dF[k]; }
                double v = d.VarX[i] + gc * gc * d.VarC[i] - 2 * gc * d.Cov[i] + gf * gf * d.VarF[i] + s2;
                double r = d.X[i] - model;
                resid[i] = r;
                dex[i] = r / gf;
                if (Math.Abs(r) / Math.Sqrt(v) <= clip) { foldSsr += r * r; foldCount++; }
            }
            if (foldCount == 0) continue;
            foldScores.Add(foldSsr / foldCount);
            ssr += foldSsr;
            count += foldCount;
        }
        if (count == 0) return Fail(basis.Degree, "no held-out standard could be scored");
        double mean = foldScores.Average();
        double sd = foldScores.Count > 1 ? Math.Sqrt(foldScores.Sum(s => (s - mean) * (s - mean)) / (foldScores.Count - 1)) : double.NaN;
        return new Outcome(basis.Degree, ssr / count, sd / Math.Sqrt(foldScores.Count), resid, dex, null);

        Outcome Fail(int degree, string why) => new(degree, double.NaN, double.NaN, resid, dex, why);
    }

    /// <summary>
    /// The degree with the best (lowest) cross-validated score. The one-standard-error rule (Hastie, Tibshirani &amp;
    /// Friedman 2009, section 7.10.1) would prefer a lower degree, but a model too simple for the standards biases
    /// every star's [Fe/H] in a way the bootstrap cannot show, while the extra variance of a richer model is carried
    /// by the bootstrap ensemble; degrees that turn over inside the data are already excluded (DegreeSelection).
    /// Ties go to the lower degree.
    /// </summary>
    public static (int Degree, string Reason) Choose(IReadOnlyList<Outcome> outcomes)
    {
        var ok = outcomes.Where(o => o.Failure is null && double.IsFinite(o.Score)).ToList();
        var best = ok.OrderBy(o => o.Score).ThenBy(o => o.Degree).First();
        return (best.Degree, $"degree {best.Degree} has the best cross-validated score ({Math.Sqrt(best.Score):G4} mag rms)");
    }
}
