using System.Diagnostics;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;
using Photometallicity.Calibration;
using Photometallicity.Configuration;
using Photometallicity.CrossMatch;
using Photometallicity.Metallicity;
using Photometallicity.Units;

namespace Photometallicity.Pipeline;

/// <summary>
/// Chains the stages of a run on in-memory data: catalogues, cross-match, photometry, calibration, per-star
/// [Fe/H], membership. Nothing is written here (see <see cref="RunOutputWriter"/>), so a failure at any stage
/// leaves no output behind.
/// </summary>
public static class PipelineRunner
{
    public static PipelineResult Run(PipelineConfig config, ILogger? logger = null, ProgressReporter? progress = null, RunScope? scope = null)
    {
        scope ??= RunScope.Whole;
        var log = logger ?? NullLogger.Instance;
        var timings = new List<(string, double)>();
        var memory = new List<(string, double)>();
        var warnings = new List<string>();
        var clock = Stopwatch.StartNew();
        void Lap(string stage)
        {
            timings.Add((stage, Math.Round(clock.Elapsed.TotalSeconds, 3)));
            double mib = PeakMemory.SoFarMiB();
            memory.Add((stage, mib));
            log.LogInformation("{Stage} took {Seconds:F2} s, peak memory so far {MiB:F0} MiB", stage, clock.Elapsed.TotalSeconds, mib);
            clock.Restart();
        }

        var inputs = InputCatalogues.Load(config);
        log.LogInformation("read {B} broadband rows, {N} narrow-band rows, {S} standards", inputs.Broadband.RowCount, inputs.Narrowband.RowCount,
            inputs.Standards.Sum(s => s.RowCount));
        Lap("read");

        var b = inputs.Broadband;
        double[] bra = b.RequireDoubles(config.Broadband.RaColumn), bdec = b.RequireDoubles(config.Broadband.DecColumn);
        double[] nra = inputs.Narrowband.RequireDoubles(config.Narrowband.RaColumn), ndec = inputs.Narrowband.RequireDoubles(config.Narrowband.DecColumn);
        var pre = scope.Precomputed;
        if (pre is not null && (pre.Match.LeftCount != b.RowCount || pre.Metallicity.Count != b.RowCount))
            throw new Errors.InputException($"the tiles' results cover {pre.Match.LeftCount} broadband rows but {config.Broadband.Path} has {b.RowCount}: the inputs changed after the split");
        var match = pre?.Match ?? CrossMatcher.Run(bra, bdec, nra, ndec, MatchOptions(config), log);
        Lap(pre is null ? "crossmatch" : "crossmatch (from tiles)");

        var photometry = PhotometryStep.Run(config, inputs, match.RightIndex, log);
        Lap("photometry");

        StandardsProducts? standards = null;
        CalibrationResult? calibration = null;
        CalibrationModel cm;
        if (scope.CalibrationPath is { } calPath)
        {
            cm = CalibrationJson.Read(calPath);
            CalibrationCompatibility.Require(cm, photometry.Filters, calPath);
            log.LogInformation("calibration read from {Path}: {Model}, {Members} ensemble members, rms {Rms:F3} dex", calPath, cm.Basis.Describe,
                cm.EnsembleCoefficients.Length, cm.RmsDex);
        }
        else
        {
            standards = StandardsStep.Build(config, inputs, bra, bdec, photometry, log);
            int needed = config.Calibration.Monotone ? new SeparableModelSpec(1, 0).Count + 2 : PolynomialBasis2D.CountFor(1) + 2;
            if (standards.Standards.Count < needed && standards.Excluded.Count > 0)
            {
                string why = string.Join("; ", standards.Excluded.GroupBy(e => e.Reason).OrderByDescending(g => g.Count()).ThenBy(g => g.Key, StringComparer.Ordinal)
                    .Take(3).Select(g => $"{g.Count()} x {g.Key}"));
                throw new Errors.MethodException($"only {standards.Standards.Count} of {standards.Total} standards can enter the calibration (at least {needed} are needed); left out before the fit: {why}. Check the standards' positions and match radius, and the narrow-band catalogue's positions.");
            }
            using (var p = progress?.For("calibration bootstrap"))
            {
                calibration = CalibrationFitter.Run(standards.Standards, new CalibrationOptions
                {
                    Bootstrap = config.Calibration.Bootstrap,
                    Seed = config.Calibration.Seed,
                    Degree = config.Calibration.Degree,
                    MaxDegree = config.Calibration.MaxDegree,
                    Knots = config.Calibration.Knots,
                MaxKnots = config.Calibration.MaxKnots,
                Monotone = config.Calibration.Monotone,
                Outliers = config.Calibration.Outliers,
                    Filters = photometry.Filters,
                    MaxLogG = standards.Standards.LogG is null ? null : config.Calibration.GiantMaxLogG,
                }, log, p);
            }
            cm = calibration.Model;
            Lap("calibration");
        }
        if (scope.StopAfter == PipelineStage.Calibration)
            return new PipelineResult { Config = config, Inputs = inputs, Match = match, Photometry = photometry, Scope = scope, Model = cm,
                Standards = standards, Calibration = calibration, Warnings = warnings, Timings = timings, PeakMemoryMiB = memory };

        var metallicityOptions = MetallicityOptionsOf(config);
        MetallicityResult metallicity;
        using (var p = progress?.For("metallicity"))
        {
            metallicity = pre?.Metallicity ?? MetallicityAssigner.Run(photometry.Index, cm, metallicityOptions, log, p);
        }
        Lap(pre is null ? "metallicity" : "metallicity (from tiles)");
        var dwarf = standards is not null ? DwarfBranch.Run(config, standards, photometry, metallicityOptions, log, progress, pre?.DwarfMetallicity) : null;
        if (pre is not null && (dwarf is null) != (pre.DwarfMetallicity is null))
            throw new Errors.InputException("the tiles' dwarf-branch results do not match this run's standards: the inputs changed after the split");
        if (dwarf is not null) Lap("dwarf branch");
        if (scope.StopAfter == PipelineStage.Metallicity)
        {
            var noMembers = Enumerable.Repeat(double.NaN, inputs.Broadband.RowCount).ToArray();
            return new PipelineResult { Config = config, Inputs = inputs, Match = match, Photometry = photometry, Scope = scope, Model = cm,
                Standards = standards, Calibration = calibration, Metallicity = metallicity, Dwarf = dwarf, Warnings = warnings, Timings = timings,
                PeakMemoryMiB = memory, Stars = StarRowsBuilder.Build(config, inputs, match, photometry, metallicity, noMembers, dwarf?.Metallicity) };
        }

        var magBand = config.Membership.MagnitudeBand == "red" ? config.Red : config.Blue;
        var membership = MembershipStep.Run(config, inputs, bra, bdec, photometry, metallicity, PhotometryStep.BandColumn(magBand, magBand.ErrColumn, inputs.Broadband, inputs.Narrowband, match.RightIndex), log);
        warnings.AddRange(membership.Warnings);
        Lap("membership");

        var request = new ForecastRequest(config.Forecast.Colours, config.Forecast.FehDex, config.Forecast.PrecisionDex, config.Target.DistanceModulus);
        ForecastProducts? forecast = null;
        if (photometry.ErrorModels.Count == 3)
        {
            var em = photometry.ErrorModels;
            forecast = ForecastStep.Run(cm, new Forecast.BandErrorModels(em[0], em[1], em[2]), request);
            foreach (var l in forecast.Limits)
                log.LogInformation("forecast: a giant of colour {C:F2} and [Fe/H] {F:F1} reaches {P:F2} dex down to blue0 = {M:F2} ({Status})", l.Colour, l.Feh, l.PrecisionDex, l.BlueApparent, l.Status);
            Lap("forecast");
        }
        else warnings.Add("no forecast: a photometric error model could not be fitted for every band");

        var (mdfCalErr, mdfCalSpreadErr) = MdfCalibrationError.OfMeanAndSpread(cm, photometry.Index.Colour0, metallicity, membership.PMember);
        if (membership.Mdf is { } mdfFit)
            log.LogInformation("membership: mean [Fe/H] {Mean:F3} +/- {Stat:F3} (statistical) +/- {Cal:F3} (calibration), spread {Sigma:F3} +/- {SStat:F3} +/- {SCal:F3} dex",
                mdfFit.Mean, mdfFit.MeanErr, mdfCalErr, mdfFit.Sigma, mdfFit.SigmaErr, mdfCalSpreadErr);

        var completeness = CompletenessWarnings(photometry, match, membership.PMember, metallicity, warnings);
        var stars = StarRowsBuilder.Build(config, inputs, match, photometry, metallicity, membership.PMember, dwarf?.Metallicity);
        foreach (var w in warnings) log.LogWarning("{Warning}", w);
        return new PipelineResult
        {
            Config = config,
            Inputs = inputs,
            Match = match,
            Photometry = photometry,
            Scope = scope,
            Model = cm,
            Standards = standards,
            Calibration = calibration,
            Metallicity = metallicity,
            Dwarf = dwarf,
            Membership = membership,
            Completeness = completeness,
            Forecast = forecast,
            ForecastRequest = request,
            MdfCalibrationErrorDex = mdfCalErr,
            MdfSpreadCalibrationErrorDex = mdfCalSpreadErr,
            Stars = stars,
            Warnings = warnings,
            Timings = timings,
            PeakMemoryMiB = memory,
        };
    }

    /// <summary>The cross-match settings of a config.</summary>
    public static CrossMatchOptions MatchOptions(PipelineConfig config) => new()
    {
        Radius = Angle.FromArcseconds(config.CrossMatch.RadiusArcsec ?? 1.0),
        AutoRadius = config.CrossMatch.AutoRadius,
        SolveOffset = config.CrossMatch.SolveOffset,
        SolveRotationScale = config.CrossMatch.SolveRotationScale,
    };

    /// <summary>The metallicity settings of a config.</summary>
    public static MetallicityOptions MetallicityOptionsOf(PipelineConfig config) => new()
    {
        GridMin = config.Metallicity.GridMin,
        GridMax = config.Metallicity.GridMax,
        GridStep = config.Metallicity.GridStep,
        PriorMean = config.Metallicity.PriorMean,
        PriorSigma = config.Metallicity.PriorSigma,
        StrictDomain = config.Metallicity.StrictDomain,
        ColourReach = config.Metallicity.ColourReach,
    };

    private static NarrowCompleteness CompletenessWarnings(PhotometryProducts phot, CrossMatchResult match, double[] pMember, MetallicityResult feh, List<string> warnings)
    {
        var ip = phot.Index;
        int n = ip.Count;
        var has = new bool[n];
        var consider = new bool[n];
        for (int i = 0; i < n; i++)
        {
            has[i] = match.RightIndex[i] >= 0;
            consider[i] = ip.HasUsableColour(i) && pMember[i] >= 0.5;
        }
        var c = NarrowCompleteness.Measure(ip.Blue0, has, consider);
        if (!double.IsFinite(c.CompleteToMag)) return c;
        double wAll = 0, wBeyond = 0, outside = 0, withColour = 0, truncated = 0, limits = 0;
        for (int i = 0; i < n; i++)
        {
            double p = pMember[i];
            if (!double.IsFinite(p)) continue;
            if (ip.HasUsableColour(i)) withColour += p;
            if (feh.Status[i] == MetallicityStatus.ColourOutsideCalibration) outside += p;
            if (feh.Status[i] == MetallicityStatus.PosteriorTruncated) truncated += p;
            if (feh.Status[i] is MetallicityStatus.IndexAboveRange or MetallicityStatus.IndexBelowRange) limits += p;
            if (!double.IsFinite(feh.Feh[i])) continue;
            wAll += p;
            if (ip.Blue0[i] > c.CompleteToMag) wBeyond += p;
        }
        if (wAll > 0 && wBeyond / wAll > 0.1)
            warnings.Add($"{100 * wBeyond / wAll:F0}% of the members' [Fe/H] weight comes from stars fainter than blue0 = {c.CompleteToMag:F2}, where narrow-band detection is incomplete: the metallicity distribution may be biased metal-poor there");
        double withFeh = wAll + limits;
        if (withFeh > 0 && (truncated + limits) / withFeh > 0.2)
            warnings.Add($"{100 * (truncated + limits) / withFeh:F0}% of the likely members with an index have [Fe/H] posteriors cut by the calibration's validity domain (truncated or limits): the metallicity distribution leans towards the domain's interior; standards covering the members' colours and [Fe/H] would remove this");
        if (withColour > 0 && outside / withColour > 0.05)
            warnings.Add($"{100 * outside / withColour:F0}% of the likely members lie outside the calibrated colour range");
        return c;
    }
}
