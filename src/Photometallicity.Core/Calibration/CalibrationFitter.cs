using System.Globalization;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;
using Photometallicity.Errors;
using Photometallicity.Numerics;

namespace Photometallicity.Calibration;

/// <summary>
/// The calibration stage: fits X0 = f(C0, [Fe/H]) to the standards (see <see cref="EffectiveVarianceFit"/>),
/// chooses the degree by cross-validation, rejects outliers, derives the validity domain from the accepted
/// standards, checks monotonicity in [Fe/H] and builds the bootstrap ensemble. No file I/O.
/// </summary>
public static class CalibrationFitter
{
    /// <summary>Smallest colour spread (mag) and [Fe/H] spread (dex) a 2-D calibration can be fitted to (project choice).</summary>
    public const double MinColourSpread = 0.05, MinFehSpread = 0.1;

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
        RequireCoverage(standards, idx, n);

        var data = new FitData(standards, usable);
        var basisFor = BasisMaker(standards, idx);
        var units = ResampleUnits.Build(standards.Group, usable);
        int folds = Math.Min(options.Folds, units.Count);
        var fold = units.AssignFolds(folds, n, Seeds.Derive(options.Seed, "calibration-cv"));

        // 2. Degree: fixed, or by cross-validation.
        var sel = DegreeSelection.Run(data, standards, idx, units, fold, folds, basisFor, options, logger);
        int degree = sel.Degree;
        var cv = sel.Cv;
        var basis = basisFor(degree);
        int np = basis.Count;

        // 3. Best fit with clipping.
        var fit = new EffectiveVarianceFit(data, basis, options.ClipSigma);
        var ones = new double[n];
        Array.Fill(ones, 1.0);
        string? err = fit.Fit(ones);
        if (err is not null)
            throw new MethodException($"The calibration fit failed at degree {degree} ({np} coefficients) with {idx.Length} usable standards: {err}.");
        var coef = fit.Coefficients.ToArray();
        if (fit.ClipIterations > EffectiveVarianceFit.MaxClipIterations)
            logger.LogWarning("calibration: outlier clipping did not settle after {N} passes; the last pass is used", EffectiveVarianceFit.MaxClipIterations);
        var cov = new double[np * np];
        if (!fit.Covariance(cov)) throw new MethodException($"The calibration's Fisher matrix is singular at degree {degree}; the accepted standards do not constrain {np} coefficients.");

        // 4. Verdicts, residuals.
        var verdicts = new StandardVerdict[n];
        var accepted = new List<int>();
        for (int i = 0; i < n; i++)
        {
            if (!usable[i])
            {
                verdicts[i] = new StandardVerdict(standards.Id[i], preStatus[i], preReason[i]!, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN);
                continue;
            }
            double r = fit.Residual[i], z = fit.Z(i), g = fit.GradientFeh[i];
            bool ok = fit.Active[i];
            if (ok) accepted.Add(i);
            string reason = ok ? "accepted"
                : string.Create(CultureInfo.InvariantCulture, $"outlier: residual {z:+0.0;-0.0} sigma_eff (|z| > {options.ClipSigma}), index residual {r:+0.0000;-0.0000} mag");
            verdicts[i] = new StandardVerdict(standards.Id[i], ok ? StandardStatus.Accepted : StandardStatus.RejectedOutlier, reason,
                r, z, r / g, cv.Residual[i], cv.ResidualDex[i]);
        }
        if (accepted.Count < np + 1)
            throw new MethodException($"Only {accepted.Count} standards were accepted for {np} coefficients (degree {degree}); at least {np + 1} are needed.");
        double rmsIndex = Rms(accepted.Select(i => verdicts[i].ResidualIndex));
        double rmsDex = Rms(accepted.Select(i => verdicts[i].ResidualDex));
        double cvRmsIndex = Rms(accepted.Select(i => verdicts[i].CvResidualIndex));
        double cvRmsDex = Rms(accepted.Select(i => verdicts[i].CvResidualDex));

        // 5. Validity domain from the accepted standards, monotonicity in [Fe/H].
        var hullPoints = ValidityDomain.ConvexHull(accepted.Select(i => (standards.Colour0[i], standards.Feh[i])));
        var mono = MonotonicityCheck.Run(basis, coef, new ValidityDomain(hullPoints, []), options.MinSensitivity);
        foreach (var note in mono.Notes) logger.LogWarning("calibration: {Note}", note);
        var domain = new ValidityDomain(hullPoints, mono.Excluded);
        double span = domain.ColourMax - domain.ColourMin, excludedSpan = mono.Excluded.Sum(e => e.ColourMax - e.ColourMin);
        if (span > 0 && excludedSpan >= span * (1 - 1e-9))
            throw new MethodException($"The degree-{degree} model fitted to {accepted.Count} standards is not usefully monotonic in [Fe/H] at any colour of the domain ({string.Join("; ", mono.Notes)}). The standards do not constrain the metallicity dependence; add standards spanning more [Fe/H] or lower the degree.");

        // 6. Bootstrap ensemble.
        var boot = options.Bootstrap > 0
            ? CalibrationBootstrap.Run(data, units, basis, options.ClipSigma, options.Bootstrap, options.Seed, options.MaxThreads, progress)
            : new CalibrationBootstrap.Outcome([], [], 0);
        var se = EnsembleStandardErrors(boot.Coefficients, np);

        var provenance = new SortedDictionary<string, string>(StringComparer.Ordinal);
        if (options.Provenance is not null) foreach (var kv in options.Provenance) provenance[kv.Key] = kv.Value;
        provenance["calibration.seed"] = options.Seed.ToString(CultureInfo.InvariantCulture);
        provenance["calibration.degree"] = degree.ToString(CultureInfo.InvariantCulture);
        provenance["calibration.bootstrap"] = options.Bootstrap.ToString(CultureInfo.InvariantCulture);
        provenance["calibration.clip_sigma"] = options.ClipSigma.ToString("R", CultureInfo.InvariantCulture);

        var model = new CalibrationModel
        {
            Basis = basis,
            Coefficients = coef,
            CoefficientCovariance = cov,
            SigmaInt = fit.SigmaInt,
            EnsembleCoefficients = boot.Coefficients,
            EnsembleSigmaInt = boot.SigmaInt,
            Domain = domain,
            Filters = options.Filters,
            RmsDex = rmsDex,
            RmsIndex = rmsIndex,
            StandardsUsed = accepted.Count,
            StandardsRejected = n - accepted.Count,
            Provenance = provenance,
        };
        logger.LogInformation("calibration: degree {Degree}, {Used} of {N} standards accepted, sigma_int {Sigma:F4} mag, rms {Rms:F4} mag = {RmsDex:F3} dex, {B} bootstrap replicates",
            degree, accepted.Count, n, fit.SigmaInt, rmsIndex, rmsDex, options.Bootstrap);
        return new CalibrationResult
        {
            Model = model,
            PerStandard = verdicts,
            CvScoreByDegree = sel.Scores,
            CvScoreErrorByDegree = sel.ScoreErrors,
            IneligibleDegrees = sel.Ineligible,
            Degree = degree,
            DegreeReason = sel.Reason,
            CvRmsIndex = cvRmsIndex,
            CvRmsDex = cvRmsDex,
            FehSlopeSign = mono.Sign,
            MonotonicityNotes = mono.Notes,
            BootstrapRedrawn = boot.Redrawn,
            ClippingPasses = fit.ClipIterations,
            BootstrapStandardErrors = se,
        };
    }

    private static void RequireCoverage(CalibrationStandards s, int[] idx, int n)
    {
        const int p1 = 3; // degree 1: 1, u, v
        if (idx.Length < p1 + 2)
            throw new MethodException($"{idx.Length} usable calibration standards of {n} given; the simplest model (degree 1) has {p1} coefficients and needs at least {p1 + 2} standards.");
        double cmin = idx.Min(i => s.Colour0[i]), cmax = idx.Max(i => s.Colour0[i]);
        if (cmax - cmin < MinColourSpread)
            throw new MethodException($"The {idx.Length} usable standards are all one colour: C0 spans {cmin:F3} to {cmax:F3} mag ({cmax - cmin:F3} mag < {MinColourSpread} mag needed). Add standards of other colours.");
        double fmin = idx.Min(i => s.Feh[i]), fmax = idx.Max(i => s.Feh[i]);
        if (fmax - fmin < MinFehSpread)
            throw new MethodException($"The {idx.Length} usable standards are all one [Fe/H]: {fmin:F2} to {fmax:F2} dex ({fmax - fmin:F2} dex < {MinFehSpread} dex needed). Add standards of other metallicities.");
    }

    /// <summary>Basis centred on the usable standards' mid-range and scaled by their half-range (common practice).</summary>
    private static Func<int, PolynomialBasis2D> BasisMaker(CalibrationStandards s, int[] idx)
    {
        double cmin = idx.Min(i => s.Colour0[i]), cmax = idx.Max(i => s.Colour0[i]);
        double fmin = idx.Min(i => s.Feh[i]), fmax = idx.Max(i => s.Feh[i]);
        return d => new PolynomialBasis2D(d, 0.5 * (cmin + cmax), 0.5 * (cmax - cmin), 0.5 * (fmin + fmax), 0.5 * (fmax - fmin));
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
