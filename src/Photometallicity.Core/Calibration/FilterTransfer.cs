using Photometallicity.Errors;
using Photometallicity.Numerics;

namespace Photometallicity.Calibration;

/// <summary>
/// Moving a calibration to a new filter set without refitting the standards.
/// <para>Fit: from stars observed in both sets, C_old = a0 + a1 C_new and X_old = b0 + b1 X_new + b2 C_new by
/// weighted least squares with effective variances (errors in both variables, Orear 1982, Am. J. Phys. 50, 912):
/// var_C = s^2(C_old) + a1^2 s^2(C_new); var_X = s^2(X_old) + b1^2 s^2(X_new) + b2^2 s^2(C_new) + 2 b1 b2 Cov(X_new, C_new),
/// iterated to convergence; parameter covariance from the inverse normal matrix scaled by the reduced chi^2 when
/// it exceeds 1 (common practice); uncertainty ensemble from a pairs bootstrap of the common stars (Efron &amp;
/// Tibshirani 1993, ch. 9).</para>
/// <para>Apply: since f_old(C_old, F) = X_old, the new forward model is
/// f_new(C_new, F) = (f_old(a0 + a1 C_new, F) - b0 - b2 C_new) / b1, a polynomial of the same degree. It is refitted
/// by least squares on a dense (C_new, F) grid over the transformed domain (exact up to round-off), for the best fit
/// and for each ensemble member with its own drawn transformation, so the transformation's uncertainty enters the
/// ensemble. The index transformation's scatter beyond the measurement errors adds to the intrinsic scatter:
/// sigma_int,new = sqrt(sigma_int,old^2 + s_t^2) / |b1|.</para>
/// </summary>
public static class FilterTransfer
{
    private const int Iterations = 10;

    public static FilterTransform Fit(TransferStars stars, int bootstrap = 500, ulong seed = 0)
    {
        int n = stars.Count;
        foreach (var (a, name) in new[] { (stars.OldIndex0, "old index0"), (stars.NewColour0, "new colour0"), (stars.NewIndex0, "new index0"),
                     (stars.VarOldColour, "old colour variance"), (stars.VarOldIndex, "old index variance"), (stars.VarNewColour, "new colour variance"),
                     (stars.VarNewIndex, "new index variance") })
            if (a.Length != n) throw new InputException($"filter transfer: {name} has {a.Length} values but there are {n} common stars.", column: name);
        var ok = Enumerable.Range(0, n).Where(i => double.IsFinite(stars.OldColour0[i]) && double.IsFinite(stars.OldIndex0[i])
            && double.IsFinite(stars.NewColour0[i]) && double.IsFinite(stars.NewIndex0[i])).ToArray();
        if (ok.Length < 5)
            throw new MethodException($"The filter transformation needs at least 5 stars measured in both filter sets; {ok.Length} usable of {n} given.");
        double cmin = ok.Min(i => stars.NewColour0[i]), cmax = ok.Max(i => stars.NewColour0[i]);
        if (cmax - cmin < CalibrationFitter.MinColourSpread)
            throw new MethodException($"The {ok.Length} common stars span only {cmax - cmin:F3} mag in colour (at least {CalibrationFitter.MinColourSpread} mag needed to fit colour terms).");

        var w = new double[n];
        foreach (int i in ok) w[i] = 1;
        var best = FitOnce(stars, w, out var covA, out var covB, out double rmsC, out double rmsX, out double scatterX)
            ?? throw new MethodException("The filter transformation is degenerate: the common stars' colours and indices are collinear.");
        var ens = new List<double[]>(bootstrap);
        var draw = new double[n];
        for (int b = 0; b < bootstrap; b++)
        {
            var rng = Seeds.For(seed, "filter-transfer-bootstrap", b);
            for (int attempt = 0; attempt < 16; attempt++)
            {
                Array.Clear(draw);
                for (int k = 0; k < ok.Length; k++) draw[ok[rng.NextInt(ok.Length)]] += 1;
                var q = FitOnce(stars, draw, out _, out _, out _, out _, out _);
                if (q is not null) { ens.Add(q); break; }
            }
        }
        return new FilterTransform(best[0], best[1], best[2], best[3], best[4], covA, covB, rmsC, rmsX, scatterX, ok.Length, ens.ToArray());
    }

    private static double[]? FitOnce(TransferStars s, double[] mult, out double[] covA, out double[] covB, out double rmsC, out double rmsX, out double scatterX)
    {
        int n = s.Count;
        covA = new double[4];
        covB = new double[9];
        rmsC = rmsX = scatterX = double.NaN;
        Span<double> a = stackalloc double[2];
        Span<double> bq = stackalloc double[3];
        a[0] = 0; a[1] = 1; bq[0] = 0; bq[1] = 1; bq[2] = 0;
        Span<double> row = stackalloc double[3];
        for (int it = 0; it < Iterations; it++)
        {
            double a1 = a[1];
            if (!Solve(2, i => s.OldColour0[i], (i, r) => { r[0] = 1; r[1] = s.NewColour0[i]; },
                    i => s.VarOldColour[i] + a1 * a1 * s.VarNewColour[i], mult, n, a, covA, out rmsC, out _)) return null;
            double b1 = bq[1], b2 = bq[2];
            if (!Solve(3, i => s.OldIndex0[i], (i, r) => { r[0] = 1; r[1] = s.NewIndex0[i]; r[2] = s.NewColour0[i]; },
                    i => s.VarOldIndex[i] + b1 * b1 * s.VarNewIndex[i] + b2 * b2 * s.VarNewColour[i] + 2 * b1 * b2 * (s.CovNewIndexColour?[i] ?? 0),
                    mult, n, bq, covB, out rmsX, out scatterX)) return null;
        }
        return [a[0], a[1], bq[0], bq[1], bq[2]];
    }

    private delegate void RowFn(int i, Span<double> row);

    /// <summary>Weighted least squares of y on the design rows, weights mult_i / var_i; covariance scaled by max(1, chi^2_nu).</summary>
    private static bool Solve(int p, Func<int, double> y, RowFn design, Func<int, double> variance, double[] mult, int n,
        Span<double> x, double[] cov, out double rms, out double scatter)
    {
        Span<double> A = stackalloc double[p * p];
        Span<double> rhs = stackalloc double[p];
        Span<double> r = stackalloc double[p];
        A.Clear(); rhs.Clear();
        double wsum = 0;
        for (int i = 0; i < n; i++)
        {
            if (mult[i] <= 0) continue;
            double v = variance(i);
            double w = mult[i] / (v > 0 ? v : 1e-12);
            design(i, r);
            for (int j = 0; j < p; j++)
            {
                rhs[j] += w * r[j] * y(i);
                for (int k = 0; k <= j; k++) A[j * p + k] += w * r[j] * r[k];
            }
            wsum += mult[i];
        }
        rms = scatter = double.NaN;
        if (!SmallCholesky.Factor(A, p)) return false;
        rhs.CopyTo(x);
        SmallCholesky.Solve(A, p, x);
        double chi2 = 0, ss = 0, excess = 0;
        for (int i = 0; i < n; i++)
        {
            if (mult[i] <= 0) continue;
            design(i, r);
            double f = 0;
            for (int j = 0; j < p; j++) f += x[j] * r[j];
            double d = y(i) - f, v = variance(i);
            chi2 += mult[i] * d * d / (v > 0 ? v : 1e-12);
            ss += mult[i] * d * d;
            excess += mult[i] * (d * d - v);
        }
        rms = Math.Sqrt(ss / wsum);
        // Scatter beyond the measurement errors by moments: sqrt(max(0, mean(r^2 - var))) (common practice).
        scatter = Math.Sqrt(Math.Max(0, excess / wsum));
        SmallCholesky.Inverse(A, p, cov);
        double scale = wsum > p ? Math.Max(1.0, chi2 / (wsum - p)) : 1.0;
        for (int k = 0; k < cov.Length; k++) cov[k] *= scale;
        return true;
    }

    /// <summary>The calibration in the new filter set (see the class summary). Ensemble members draw their transformation with Seeds.Derive(seed, "filter-transfer-apply", m).</summary>
    public static CalibrationModel Apply(CalibrationModel old, FilterTransform t, FilterSet newFilters, ulong seed)
    {
        if (!(Math.Abs(t.A1) > 1e-6) || !(Math.Abs(t.B1) > 1e-6))
            throw new MethodException($"The filter transformation is degenerate (a1 = {t.A1}, b1 = {t.B1}); it cannot be inverted.");
        var ob = old.Basis;
        IIndexBasis nb = ob switch
        {
            PolynomialBasis2D pb => new PolynomialBasis2D(pb.Degree, t.NewColour(pb.ColourCentre), pb.ColourScale / Math.Abs(t.A1), pb.FehCentre, pb.FehScale),
            MonotoneBasis mb => new MonotoneBasis(mb.ColourDegree, Math.Min(t.NewColour(mb.ColourLo), t.NewColour(mb.ColourHi)),
                Math.Max(t.NewColour(mb.ColourLo), t.NewColour(mb.ColourHi)), mb.Ramps),
            // t flips when a1 < 0: a(t) = 1 + g t becomes (1 + g)(1 + g' t') with g' = -g / (1 + g); the refit absorbs the factor.
            SeparableBasis sb => new SeparableBasis(sb.ColourDegree, Math.Min(t.NewColour(sb.ColourLo), t.NewColour(sb.ColourHi)),
                Math.Max(t.NewColour(sb.ColourLo), t.NewColour(sb.ColourHi)), sb.Ramps, t.A1 > 0 ? sb.Gamma : -sb.Gamma / (1 + sb.Gamma)),
            _ => throw new MethodException($"a calibration of the form \"{ob.Describe}\" cannot be transferred"),
        };
        int p = nb.Count;
        var hull = ValidityDomain.ConvexHull(old.Domain.Hull.Select(v => (t.NewColour(v.Colour), v.Feh)));
        var excluded = old.Domain.ExcludedColours
            .Select(e => (Math.Min(t.NewColour(e.ColourMin), t.NewColour(e.ColourMax)), Math.Max(t.NewColour(e.ColourMin), t.NewColour(e.ColourMax))))
            .OrderBy(e => e.Item1).ToList();
        var grid = new TransferGrid(nb, new ValidityDomain(hull, []));

        var coef = grid.Refit(ob, old.Coefficients, t);
        // Covariance: the old coefficients' covariance mapped linearly (M Cov M^T), plus the spread the
        // transformation's own uncertainty gives the mapped best fit (first order, independent contributions).
        var m = new double[p * ob.Count];
        var unit = new double[ob.Count];
        var lin = t with { B0 = 0, B2 = 0 }; // the part of the map that is linear in the old coefficients
        for (int k = 0; k < ob.Count; k++)
        {
            unit[k] = 1;
            var col = grid.Refit(ob, unit, lin);
            unit[k] = 0;
            for (int j = 0; j < p; j++) m[j * ob.Count + k] = col[j];
        }
        var cov = new double[p * p];
        for (int i = 0; i < p; i++)
            for (int j = 0; j < p; j++)
            {
                double s = 0;
                for (int k = 0; k < ob.Count; k++)
                    for (int l = 0; l < ob.Count; l++) s += m[i * ob.Count + k] * old.CoefficientCovariance[k * ob.Count + l] * m[j * ob.Count + l];
                cov[i * p + j] = s;
            }
        if (t.Ensemble.Length >= 2)
        {
            var mapped = t.Ensemble.Select(q => grid.Refit(ob, old.Coefficients, FilterTransform.FromParameters(q, t))).ToArray();
            for (int i = 0; i < p; i++)
                for (int j = 0; j < p; j++)
                {
                    double mi = mapped.Average(v => v[i]), mj = mapped.Average(v => v[j]);
                    cov[i * p + j] += mapped.Sum(v => (v[i] - mi) * (v[j] - mj)) / (mapped.Length - 1);
                }
        }

        var ens = new double[old.EnsembleCoefficients.Length][];
        var ensSigma = new double[ens.Length];
        for (int e = 0; e < ens.Length; e++)
        {
            var draw = t;
            if (t.Ensemble.Length > 0)
            {
                var rng = Seeds.For(seed, "filter-transfer-apply", e);
                draw = FilterTransform.FromParameters(t.Ensemble[rng.NextInt(t.Ensemble.Length)], t);
            }
            ens[e] = grid.Refit(ob, old.EnsembleCoefficients[e], draw);
            ensSigma[e] = Math.Sqrt(old.EnsembleSigmaInt[e] * old.EnsembleSigmaInt[e] + t.IndexScatter * t.IndexScatter) / Math.Abs(draw.B1);
        }

        var prov = new SortedDictionary<string, string>(old.Provenance.ToDictionary(kv => kv.Key, kv => kv.Value), StringComparer.Ordinal)
        {
            ["transfer.from_filters"] = $"{old.Filters.System}: {old.Filters.BlueBand}, {old.Filters.RedBand}, {old.Filters.NarrowBand}",
            ["transfer.parameters"] = string.Join(" ", t.Parameters.Select(v => v.ToString("R", System.Globalization.CultureInfo.InvariantCulture))),
            ["transfer.stars"] = t.Stars.ToString(System.Globalization.CultureInfo.InvariantCulture),
            ["transfer.seed"] = seed.ToString(System.Globalization.CultureInfo.InvariantCulture),
        };
        return old with
        {
            Basis = nb,
            Coefficients = coef,
            CoefficientCovariance = cov,
            SigmaInt = Math.Sqrt(old.SigmaInt * old.SigmaInt + t.IndexScatter * t.IndexScatter) / Math.Abs(t.B1),
            EnsembleCoefficients = ens,
            EnsembleSigmaInt = ensSigma,
            Domain = new ValidityDomain(hull, excluded),
            Extrapolation = old.Extrapolation is { } x ? MapExtrapolation(x, t, new ValidityDomain(hull, [])) : null,
            Filters = newFilters,
            RmsIndex = old.RmsIndex / Math.Abs(t.B1),
            Provenance = prov,
        };
    }

    /// <summary>
    /// The support (the standards' hull) in the new colours; the colour error per new colour magnitude is kappa |a1| / |b1| (the old index error
    /// per old colour magnitude, through dC_old/dC_new = a1 and the index scale 1/b1); with a1 &lt; 0 the blue and red sides swap.
    /// </summary>
    private static Extrapolation MapExtrapolation(Extrapolation x, FilterTransform t, ValidityDomain newHull)
    {
        var z = t.A1 > 0 ? x.Z : x.Z.Select(v => new[] { v[1], v[0], v[2], v[3] }).ToArray();
        return x with { Support = newHull, KappaColour = x.KappaColour * Math.Abs(t.A1) / Math.Abs(t.B1), KappaColour2 = x.KappaColour2 * t.A1 * t.A1 / Math.Abs(t.B1), Z = z };
    }
}
