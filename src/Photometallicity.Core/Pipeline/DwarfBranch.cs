using Microsoft.Extensions.Logging;
using Photometallicity.Calibration;
using Photometallicity.Configuration;
using Photometallicity.Metallicity;

namespace Photometallicity.Pipeline;

/// <summary>The dwarf branch of a run: a calibration fitted to the high-gravity standards and every star's [Fe/H] under it.</summary>
public sealed record DwarfProducts(CalibrationResult Calibration, MetallicityResult Metallicity, int Standards);

/// <summary>
/// Dwarfs and giants. When the standards carry log g, the main (giant) calibration uses only standards with
/// log g at or below <see cref="CalibrationConfig.GiantMaxLogG"/> (the others are rejected from it with the reason), and,
/// when at least <see cref="MinStandards"/> standards lie above it, a second calibration is fitted to those dwarfs, so that
/// every star also gets an [Fe/H] as if it were a foreground dwarf (columns feh_dwarf, feh_dwarf_lo, feh_dwarf_hi).
/// The boundary log g = 3.5 between giants and dwarfs is common practice, not a published value.
/// </summary>
public static class DwarfBranch
{
    public const int MinStandards = 8;

    /// <summary>
    /// The dwarf calibration and every star's [Fe/H] under it; <paramref name="precomputed"/> supplies the per-star
    /// [Fe/H] when it was computed elsewhere (survey tiles) with this same calibration.
    /// </summary>
    public static DwarfProducts? Run(PipelineConfig config, StandardsProducts standards, PhotometryProducts photometry, MetallicityOptions metallicityOptions,
        ILogger log, ProgressReporter? progress, MetallicityResult? precomputed = null)
    {
        if (Fit(config, standards, photometry, log, progress) is not { } fitted) return null;
        var (fit, count) = fitted;
        var feh = precomputed ?? MetallicityAssigner.Run(photometry.Index, fit.Model, metallicityOptions, log);
        log.LogInformation("dwarf calibration: {Used} standards used, {Model}, rms {Rms:F3} dex", fit.Model.StandardsUsed, fit.Model.Basis.Describe, fit.Model.RmsDex);
        return new DwarfProducts(fit, feh, count);
    }

    /// <summary>The dwarf calibration alone (null when the standards carry no log g or too few are dwarfs), and how many dwarf standards it had.</summary>
    public static (CalibrationResult Fit, int Standards)? Fit(PipelineConfig config, StandardsProducts standards, PhotometryProducts photometry,
        ILogger log, ProgressReporter? progress)
    {
        var s = standards.Standards;
        if (s.LogG is not { } logg) return null;
        double limit = config.Calibration.GiantMaxLogG;
        var rows = Enumerable.Range(0, s.Count).Where(i => double.IsFinite(logg[i]) && logg[i] > limit).ToArray();
        if (rows.Length < MinStandards)
        {
            log.LogInformation("no dwarf calibration: {N} standards with log g above {Limit} ({Min} needed)", rows.Length, limit, MinStandards);
            return null;
        }
        var dwarfs = s.Select(rows);
        CalibrationResult fit;
        using (var p = progress?.For("dwarf calibration bootstrap"))
        {
            fit = CalibrationFitter.Run(dwarfs, new CalibrationOptions
            {
                Bootstrap = config.Calibration.Bootstrap,
                Seed = Numerics.Seeds.Derive(config.Calibration.Seed, "dwarf-branch"),
                Degree = config.Calibration.Degree,
                MaxDegree = config.Calibration.MaxDegree,
                Knots = config.Calibration.Knots,
                MaxKnots = config.Calibration.MaxKnots,
                Monotone = config.Calibration.Monotone,
                Outliers = config.Calibration.Outliers,
                Filters = photometry.Filters,
            }, log, p);
        }
        return (fit, rows.Length);
    }
}
