using System.Globalization;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;
using Photometallicity.Errors;
using Photometallicity.Numerics;

namespace Photometallicity.Calibration;

/// <summary>
/// The calibration stage: fits X0 = f(C0, [Fe/H]) to the standards with a forward model monotonic in [Fe/H] by construction
/// (<see cref="MonotoneBasis"/>) and an explicit outlier component (<see cref="MixtureFit"/>), chooses the model's form by
/// cross-validation (<see cref="ModelChoice"/>), gives every standard its probability of being an outlier, measures how the
/// model's error grows beyond the standards (<see cref="ExtrapolationCalibrator"/>), and builds the bootstrap ensemble. Also
/// keeps the convex hull of the accepted standards, for users who ask for the strict domain. No file I/O.
/// </summary>
public static class CalibrationFitter
{
    /// <summary>Smallest colour spread (mag) and [Fe/H] spread (dex) a 2-D calibration can be fitted to (project choice).</summary>
    public const double MinColourSpread = 0.05, MinFehSpread = 0.1;

    /// <summary>A standard with p_outlier above this (and beyond MixtureFit.MinOutlierSigma) is called an outlier.</summary>
    public const double OutlierThreshold = 0.5;

    /// <summary>
    /// Largest intrinsic scatter (dex, beyond the standards' errors) before the standards are called unusable: published
    /// Ca II H and K photometric calibrations scatter by 0.1-0.3 dex in all (a range recalled from memory; a project choice of limit).
    /// </summary>
    public const double MaxScatterDex = 0.35;

    public static CalibrationResult Run(CalibrationStandards standards, CalibrationOptions options, ILogger? logger = null, IProgress<double>? progress = null)
    {
        logger ??= NullLogger.Instance;
        options.Validate();
        standards.Validate();
        int n = standards.Count;

        // 1. Which standards can enter the fit at all.
        var usable = new bool[n];
        var preReason = new string?[n];
        var preStatus = new StandardStatus[n];
        for (int i = 0; i < n; i++)
        {
            preReason[i] = standards.Unusable(i);
            preStatus[i] = StandardStatus.Unusable;
            if (preReason[i] is null && options.MaxLogG is { } gmax && standards.LogG is { } lg && double.IsFinite(lg[i]) && lg[i] > gmax)
            {
                preReason[i] = $"log g = {lg[i].ToString("G4", CultureInfo.InvariantCulture)} is above the giant limit {gmax.ToString("G4", CultureInfo.InvariantCulture)}";
                preStatus[i] = StandardStatus.RejectedLogG;
            }
            usable[i] = preReason[i] is null;
        }
        var idx = Enumerable.Range(0, n).Where(i => usable[i]).ToArray();
        RequireCoverage(standards, idx, n, options);

        var data = new FitData(standards, usable);
        var units = ResampleUnits.Build(standards.Group, usable);
        int folds = Math.Min(options.Folds, units.Count);
        var fold = units.AssignFolds(folds, n, Seeds.Derive(options.Seed, "calibration-cv"));

        // 2. The model's form by cross-validation (or the user's fixed choice).
        var specs = new List<ModelSpec>();
        foreach (int d in options.Degree is { } fd ? [fd] : Enumerable.Range(1, options.MaxDegree))
        {
            if (!options.Monotone) { specs.Add(new PolynomialModelSpec(d)); continue; }
            foreach (int k in options.Knots is { } fk ? [fk] : Enumerable.Range(0, options.MaxKnots + 1))
            {
                specs.Add(new SeparableModelSpec(d, k));
                if (!options.SeparableOnly) specs.Add(new MonotoneModelSpec(d, k));
            }
        }
        var choice = ModelChoice.Run(data, idx, fold, folds, specs, options.Outliers, logger);
        var spec = choice.Chosen.Spec;
        var basis = choice.Chosen.Basis!;
        if (basis is SeparableBasis sep) basis = SeparableModelSpec.Profile(data, Enumerable.Repeat(1.0, n).ToArray(), options.Outliers, sep);
        int np = basis.Count;

        // 3. Best fit.
        var fit = new MixtureFit(data, basis, options.Outliers);
        var ones = new double[n];
        Array.Fill(ones, 1.0);
        string? err = fit.Fit(ones);
        if (err is not null)
            throw new MethodException($"The calibration fit failed for the model \"{basis.Describe}\" with {idx.Length} usable standards: {err}.");
        if (fit.Passes > 200)
            logger.LogWarning("calibration: the outlier mixture did not settle after 200 passes; the last pass is used");
        // Deleted residuals: a bad standard at an end of the [Fe/H] range can bend the fit towards itself and hide; predicted
        // from the cross-validation fit that left it out (choice.Chosen.Residual), it cannot. A standard the mixture kept is also
        // an outlier when its held-out residual is (same mixture, variance inflated by 1 + p / n_train for the prediction; common
        // practice for deleted residuals, e.g. Cook & Weisberg 1982, Residuals and Influence in Regression, ch. 2), and the fit is
        // redone without those.
        var cvOutlier = new bool[n];
        var pCv = Enumerable.Repeat(double.NaN, n).ToArray();
        var cvRes = choice.Chosen.Residual;
        if (options.Outliers && cvRes.Length == n)
        {
            int added = 0;
            double inflate = 1 + (double)np / Math.Max(1, 0.8 * idx.Length), pi = fit.OutlierFraction;
            foreach (int i in idx)
            {
                double r = cvRes[i];
                if (fit.IsOutlier(i) || !double.IsFinite(r)) continue;
                double v = (fit.BaseVariance(i) + fit.SigmaInt * fit.SigmaInt) * inflate, g = fit.GradientFeh[i];
                double vb = v + Math.Max(g * g * MixtureFit.BadFehSigma * MixtureFit.BadFehSigma, 3 * v);
                double good = (1 - pi) * Math.Exp(-0.5 * r * r / v) / Math.Sqrt(v), bad = pi * Math.Exp(-0.5 * r * r / vb) / Math.Sqrt(vb);
                pCv[i] = good + bad > 0 ? bad / (good + bad) : 1.0;
                if (pCv[i] > 0.5 && Math.Abs(r) > MixtureFit.MinOutlierSigma * Math.Sqrt(v)) { cvOutlier[i] = true; added++; }
            }
            if (added > 0)
            {
                var w = new double[n];
                for (int i = 0; i < n; i++) w[i] = cvOutlier[i] ? 0.0 : 1.0;
                string? err2 = fit.Fit(w);
                if (err2 is not null)
                    throw new MethodException($"The calibration fit failed for the model \"{basis.Describe}\" without {added} standards whose held-out residuals are outliers: {err2}.");
                logger.LogInformation("calibration: {N} more standards are outliers by their held-out residuals", added);
            }
        }
        var coef = fit.Coefficients.ToArray();
        // sigma_int marginalised over its uncertainty (see MixtureFit.PosteriorMeanSigmaInt2): the excess of the posterior mean
        // of sigma_int^2 over the ML value is added to the model's and every ensemble member's sigma_int^2.
        double sigmaIntMl = fit.SigmaInt;
        double sigmaExcess2 = Math.Max(0, fit.PosteriorMeanSigmaInt2() - sigmaIntMl * sigmaIntMl);
        var cov = new double[np * np];
        if (!fit.Covariance(cov)) throw new MethodException($"The calibration's Fisher matrix is singular for the model \"{basis.Describe}\"; the accepted standards do not constrain its {np} coefficients.");

        // 4. Verdicts, residuals.
        var verdicts = new StandardVerdict[n];
        var accepted = new List<int>();
        var cvResid = choice.Chosen.Residual;
        int flagged = 0;
        for (int i = 0; i < n; i++)
        {
            if (!usable[i])
            {
                verdicts[i] = new StandardVerdict(standards.Id[i], preStatus[i], preReason[i]!, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN);
                continue;
            }
            double r = fit.Residual[i], z = fit.Z(i), g = fit.GradientFeh[i], po = cvOutlier[i] ? pCv[i] : fit.POutlier(i);
            bool ok = !fit.IsOutlier(i) && !cvOutlier[i];
            if (ok) accepted.Add(i); else flagged++;
            string reason = ok ? "accepted"
                : string.Create(CultureInfo.InvariantCulture, $"outlier{(cvOutlier[i] ? " by its held-out residual" : "")}: p_outlier {po:F3}, residual {z:+0.0;-0.0} sigma_eff, index residual {r:+0.0000;-0.0000} mag = {r / g:+0.00;-0.00} dex");
            double cvr = i < cvResid.Length ? cvResid[i] : double.NaN;
            verdicts[i] = new StandardVerdict(standards.Id[i], ok ? StandardStatus.Accepted : StandardStatus.RejectedOutlier, reason,
                r, z, r / g, cvr, cvr / g, po);
        }
        if (flagged * 2 > idx.Length || fit.OutlierFraction >= MixtureFit.MaxOutlierFraction - 1e-9)
            throw new MethodException(string.Create(CultureInfo.InvariantCulture,
                $"{flagged} of the {idx.Length} usable standards are more likely outliers than not (fitted outlier share {fit.OutlierFraction:F2}): more than half of them disagree with any smooth calibration. Check the standards' [Fe/H] column, their cross-match to the catalogue and the band columns."));
        if (accepted.Count < np + 1)
            throw new MethodException($"Only {accepted.Count} standards were accepted for {np} coefficients (model \"{basis.Describe}\"); at least {np + 1} are needed.");
        double rmsIndex = Rms(accepted.Select(i => verdicts[i].ResidualIndex));
        // With most standards wrong (or an index that does not follow [Fe/H]) the mixture cannot tell good from bad and settles on
        // a broad relation instead: the intrinsic scatter, expressed in [Fe/H] through the model's median sensitivity at the kept
        // standards, then exceeds anything a photometric calibration shows. Measured in units of the standards' own errors this
        // does not depend on how faint they are.
        var slopes = accepted.Select(i => Math.Abs(fit.GradientFeh[i])).Where(double.IsFinite).Order().ToArray();
        double medianSlope = slopes.Length > 0 ? slopes[slopes.Length / 2] : double.NaN;
        double scatterDex = sigmaIntMl / medianSlope;
        if (!(scatterDex <= MaxScatterDex))
            throw new MethodException(string.Create(CultureInfo.InvariantCulture,
                $"The {accepted.Count} accepted standards scatter about the best calibration by {sigmaIntMl:F3} mag beyond their errors, {scatterDex:F2} dex at the median sensitivity of {medianSlope:F3} mag/dex (more than {MaxScatterDex} dex): more than half of them disagree with any smooth calibration, or the index does not follow their [Fe/H]. Check the standards' [Fe/H] column, their cross-match to the catalogue and the band columns."));
        double rmsDex = Rms(accepted.Select(i => verdicts[i].ResidualDex));
        double cvRmsIndex = Rms(accepted.Select(i => verdicts[i].CvResidualIndex));
        double cvRmsDex = Rms(accepted.Select(i => verdicts[i].CvResidualDex));

        // 5. The convex hull of the accepted standards (the strict domain, and the support beyond which the extrapolation error grows).
        var hullPoints = ValidityDomain.ConvexHull(accepted.Select(i => (standards.Colour0[i], standards.Feh[i])));
        var domain = new ValidityDomain(hullPoints, []);
        var start = fit.Current;
        var extra = ExtrapolationCalibrator.Run(data, accepted.ToArray(), spec, options.Outliers);
        var notes = new List<string>
        {
            string.Create(CultureInfo.InvariantCulture, $"model-form error beyond the standards: {extra.KappaColour:F3} d + {extra.KappaColour2:F3} d^2 mag of index at colour distance d (from {extra.HeldOutColour} held-out standards across the bluest and reddest gaps, one and two fifths wide), sensitivity uncertain by a factor e^{extra.KappaFeh:F3} beyond their [Fe/H] (from {extra.HeldOutFeh} held-out standards)"),
        };
        if (extra.Note.Length > 0) notes.Add(extra.Note);
        foreach (var note in notes) logger.LogInformation("calibration: {Note}", note);

        // 6. Bootstrap ensemble, each member with its own draw of the model-form error.
        var boot = options.Bootstrap > 0
            ? CalibrationBootstrap.Run(data, units, basis, options.Outliers, start, options.Bootstrap, options.Seed, options.MaxThreads, progress)
            : new CalibrationBootstrap.Outcome([], [], 0);
        var se = EnsembleStandardErrors(boot.Coefficients, np);
        var draws = new double[boot.Coefficients.Length][];
        for (int m = 0; m < draws.Length; m++)
        {
            var rng = Seeds.For(options.Seed, "calibration-extrapolation", m);
            draws[m] = [rng.NextGaussian(0, 1), rng.NextGaussian(0, 1), rng.NextGaussian(0, 1), rng.NextGaussian(0, 1)];
        }
        var acc = accepted.ToArray();
        var extrapolation = new Extrapolation(domain, extra.KappaColour, extra.KappaFeh, draws) { KappaColour2 = extra.KappaColour2 };

        var provenance = new SortedDictionary<string, string>(StringComparer.Ordinal);
        if (options.Provenance is not null) foreach (var kv in options.Provenance) provenance[kv.Key] = kv.Value;
        provenance["calibration.seed"] = options.Seed.ToString(CultureInfo.InvariantCulture);
        provenance["calibration.model"] = basis.Describe;
        provenance["calibration.bootstrap"] = options.Bootstrap.ToString(CultureInfo.InvariantCulture);

        var model = new CalibrationModel
        {
            Basis = basis,
            Coefficients = coef,
            CoefficientCovariance = cov,
            SigmaInt = Math.Sqrt(sigmaIntMl * sigmaIntMl + sigmaExcess2),
            EnsembleCoefficients = boot.Coefficients,
            EnsembleSigmaInt = boot.SigmaInt.Select(sm => Math.Sqrt(sm * sm + sigmaExcess2)).ToArray(),
            Domain = domain,
            Extrapolation = extrapolation,
            OutlierFraction = fit.OutlierFraction,
            Filters = options.Filters,
            RmsDex = rmsDex,
            RmsIndex = rmsIndex,
            StandardsUsed = accepted.Count,
            StandardsRejected = n - accepted.Count,
            Provenance = provenance,
        };
        logger.LogInformation("calibration: intrinsic scatter {Dex:F3} dex at the median sensitivity {Slope:F3} mag/dex", scatterDex, medianSlope);
        logger.LogInformation("calibration: {Model}; {Used} of {N} standards accepted ({Flagged} flagged as outliers, fitted outlier share {Share:F3}), sigma_int {Sigma:F4} mag (maximum likelihood {Ml:F4}), rms {Rms:F4} mag = {RmsDex:F3} dex, {B} bootstrap replicates",
            basis.Describe, accepted.Count, n, flagged, fit.OutlierFraction, model.SigmaInt, sigmaIntMl, rmsIndex, rmsDex, options.Bootstrap);
        return new CalibrationResult
        {
            Model = model,
            PerStandard = verdicts,
            CvScores = choice.All.Select(c => new FormScore(c.Spec.ToString(), c.Spec.Count, c.Score, c.StandardError, c.Failure)).ToArray(),
            Degree = spec switch { MonotoneModelSpec ms => ms.ColourDegree, SeparableModelSpec ss => ss.ColourDegree, _ => ((PolynomialModelSpec)spec).Degree },
            DegreeReason = choice.Reason,
            CvRmsIndex = cvRmsIndex,
            CvRmsDex = cvRmsDex,
            OutlierFraction = fit.OutlierFraction,
            SigmaIntMaximumLikelihood = sigmaIntMl,
            Notes = notes,
            BootstrapRedrawn = boot.Redrawn,
            FitPasses = fit.Passes,
            BootstrapStandardErrors = se,
        };
    }

    private static void RequireCoverage(CalibrationStandards s, int[] idx, int n, CalibrationOptions options)
    {
        int p1 = options.Monotone ? new SeparableModelSpec(1, 0).Count : PolynomialBasis2D.CountFor(1); // the simplest form
        if (idx.Length < p1 + 2)
            throw new MethodException($"{idx.Length} usable calibration standards of {n} given; the simplest model (separable, colour degree 1, no interior knot) has {p1} coefficients and needs at least {p1 + 2} standards.");
        double cmin = idx.Min(i => s.Colour0[i]), cmax = idx.Max(i => s.Colour0[i]);
        if (cmax - cmin < MinColourSpread)
            throw new MethodException($"The {idx.Length} usable standards are all one colour: C0 spans {cmin:F3} to {cmax:F3} mag ({cmax - cmin:F3} mag < {MinColourSpread} mag needed). Add standards of other colours.");
        double fmin = idx.Min(i => s.Feh[i]), fmax = idx.Max(i => s.Feh[i]);
        if (fmax - fmin < MinFehSpread)
            throw new MethodException($"The {idx.Length} usable standards are all one [Fe/H]: {fmin:F2} to {fmax:F2} dex ({fmax - fmin:F2} dex < {MinFehSpread} dex needed). Add standards of other metallicities.");
    }

    private static double Rms(IEnumerable<double> values)
    {
        double s = 0;
        int k = 0;
        foreach (double v in values) { if (!double.IsFinite(v)) continue; s += v * v; k++; }
        return k == 0 ? double.NaN : Math.Sqrt(s / k);
    }

    internal static double[] EnsembleStandardErrors(double[][] ensemble, int p)
    {
        var se = Enumerable.Repeat(double.NaN, p).ToArray();
        if (ensemble.Length < 2) return se;
        for (int k = 0; k < p; k++)
        {
            double m = 0;
            foreach (var c in ensemble) m += c[k];
            m /= ensemble.Length;
            double v = 0;
            foreach (var c in ensemble) v += (c[k] - m) * (c[k] - m);
            se[k] = Math.Sqrt(v / (ensemble.Length - 1));
        }
        return se;
    }
}
