using Microsoft.Extensions.Logging;
using Photometallicity.Errors;

namespace Photometallicity.Calibration;

/// <summary>
/// Chooses the forward model's degree: each degree 1..MaxDegree that the standards can support (at least p + 2
/// standards for p coefficients, more distinct [Fe/H] values and colours than the degree) is cross-validated
/// (<see cref="CrossValidation"/>), and the one-standard-error rule picks among them; or the user's fixed degree.
/// A degree whose full fit is not monotonic in [Fe/H] over more than <see cref="MaxNonMonotonicFraction"/> of the
/// standards' colour span is not eligible (a polynomial that turns over inside the data gives a second, false root
/// there; project choice), unless every degree is, in which case the least affected one is taken.
/// </summary>
internal static class DegreeSelection
{
    internal sealed record Outcome(
        int Degree, string Reason, CrossValidation.Outcome Cv, double[] Scores, double[] ScoreErrors, IReadOnlyDictionary<int, string> Ineligible);

    /// <summary>Largest fraction of the colour span a chosen degree may lose to non-monotonicity (project choice).</summary>
    public const double MaxNonMonotonicFraction = 0.1;

    public static Outcome Run(FitData data, CalibrationStandards standards, int[] idx, ResampleUnits units, int[] fold, int folds,
        Func<int, PolynomialBasis2D> basisFor, CalibrationOptions options, ILogger logger)
    {
        int distinctColours = idx.Select(i => standards.Colour0[i]).Distinct().Count();
        int distinctFeh = idx.Select(i => standards.Feh[i]).Distinct().Count();
        var scores = Enumerable.Repeat(double.NaN, 4).ToArray();
        var scoreErrors = Enumerable.Repeat(double.NaN, 4).ToArray();
        var ineligible = new SortedDictionary<int, string>();
        var outcomes = new List<CrossValidation.Outcome>();
        CrossValidation.Outcome? fixedFallback = null;
        var nonMonotonic = new List<(int Degree, double Lost, CrossValidation.Outcome Cv)>();
        int[] degrees = options.Degree is { } fixedDegree ? [fixedDegree] : Enumerable.Range(1, options.MaxDegree).ToArray();
        foreach (int deg in degrees)
        {
            int p = PolynomialBasis2D.CountFor(deg);
            string? why = idx.Length < p + 2 ? $"{idx.Length} usable standards for {p} coefficients (at least {p + 2} needed)"
                : distinctFeh < deg + 1 ? $"{distinctFeh} distinct [Fe/H] values (at least {deg + 1} needed)"
                : distinctColours < deg + 1 ? $"{distinctColours} distinct colours (at least {deg + 1} needed)" : null;
            var o = why is null ? CrossValidation.Run(data, fold, folds, basisFor(deg), options.ClipSigma) : null;
            why ??= o!.Failure;
            if (why is not null)
            {
                ineligible[deg] = why;
                // A degree the user fixed is still fitted when only its cross-validation failed (too few standards
                // per fold); the cross-validated residuals are then partly missing.
                if (options.Degree is not null && o is not null) fixedFallback = o;
                logger.LogInformation("calibration: degree {Degree} not eligible: {Why}", deg, why);
                continue;
            }
            if (options.Degree is null)
            {
                double lost = NonMonotonicFraction(data, standards, idx, basisFor(deg), options);
                if (lost > MaxNonMonotonicFraction)
                {
                    string note = $"its fit is not monotonic in [Fe/H] over {100 * lost:F0}% of the standards' colour span";
                    ineligible[deg] = note;
                    nonMonotonic.Add((deg, lost, o!));
                    logger.LogInformation("calibration: degree {Degree} not eligible: {Why}", deg, note);
                    continue;
                }
            }
            scores[deg - 1] = o!.Score;
            scoreErrors[deg - 1] = o.StandardError;
            outcomes.Add(o);
            logger.LogInformation("calibration: degree {Degree}: CV rms {Rms:F4} mag", deg, Math.Sqrt(o.Score));
        }
        if (outcomes.Count == 0 && nonMonotonic.Count > 0)
        {
            var least = nonMonotonic.OrderBy(x => x.Lost).ThenBy(x => x.Degree).First();
            scores[least.Degree - 1] = least.Cv.Score;
            scoreErrors[least.Degree - 1] = least.Cv.StandardError;
            ineligible.Remove(least.Degree);
            logger.LogWarning("calibration: every degree turns over inside the data; degree {Degree} loses the least ({Lost:F0}% of the colour span)", least.Degree, 100 * least.Lost);
            return new Outcome(least.Degree, $"every degree tried is non-monotonic somewhere; degree {least.Degree} loses the least colour span", least.Cv, scores, scoreErrors, ineligible);
        }
        if (outcomes.Count == 0 && fixedFallback is null)
            throw new MethodException(
                $"The standards cannot support a calibration: {idx.Length} usable standards ({units.Count} independent units, {distinctColours} distinct colours, {distinctFeh} distinct [Fe/H] values) of {standards.Count} given. " +
                string.Join("; ", ineligible.Select(kv => $"degree {kv.Key}: {kv.Value}")) + ". Add standards spanning more colours and [Fe/H] values.");
        var (degree, reason) = options.Degree is { } fd ? (fd, $"degree {fd} fixed by the options") : CrossValidation.Choose(outcomes);
        var cv = outcomes.FirstOrDefault(o => o.Degree == degree) ?? fixedFallback!;
        logger.LogInformation("calibration: {Reason}", reason);
        return new Outcome(degree, reason, cv, scores, scoreErrors, ineligible);
    }

    /// <summary>The fraction of the accepted standards' colour span where the degree's best fit is not monotonic in [Fe/H].</summary>
    private static double NonMonotonicFraction(FitData data, CalibrationStandards s, int[] idx, PolynomialBasis2D basis, CalibrationOptions options)
    {
        var fit = new EffectiveVarianceFit(data, basis, options.ClipSigma);
        var ones = new double[s.Count];
        Array.Fill(ones, 1.0);
        if (fit.Fit(ones) is not null) return 1.0;
        var active = fit.Active;
        var points = new List<(double, double)>();
        foreach (int i in idx) if (active[i]) points.Add((s.Colour0[i], s.Feh[i]));
        var hull = new ValidityDomain(ValidityDomain.ConvexHull(points), []);
        double span = hull.ColourMax - hull.ColourMin;
        if (!(span > 0)) return 1.0;
        var mono = MonotonicityCheck.Run(basis, fit.Coefficients, hull, options.MinSensitivity);
        return mono.Excluded.Sum(e => e.ColourMax - e.ColourMin) / span;
    }
}
