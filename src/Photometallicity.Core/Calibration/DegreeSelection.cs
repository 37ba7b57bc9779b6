using Microsoft.Extensions.Logging;
using Photometallicity.Errors;

namespace Photometallicity.Calibration;

/// <summary>
/// Chooses the forward model's degree: each degree 1..MaxDegree that the standards can support (at least p + 2
/// standards for p coefficients, more distinct [Fe/H] values and colours than the degree) is cross-validated
/// (<see cref="CrossValidation"/>), and the one-standard-error rule picks among them; or the user's fixed degree.
/// </summary>
internal static class DegreeSelection
{
    internal sealed record Outcome(
        int Degree, string Reason, CrossValidation.Outcome Cv, double[] Scores, double[] ScoreErrors, IReadOnlyDictionary<int, string> Ineligible);

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
            scores[deg - 1] = o!.Score;
            scoreErrors[deg - 1] = o.StandardError;
            outcomes.Add(o);
            logger.LogInformation("calibration: degree {Degree}: CV rms {Rms:F4} mag", deg, Math.Sqrt(o.Score));
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
}
