using Photometallicity.Calibration;
using Photometallicity.Configuration;
using Photometallicity.CrossMatch;
using Photometallicity.Membership;
using Photometallicity.Metallicity;

namespace Photometallicity.Pipeline;

/// <summary>Everything a run produced, in memory; <see cref="RunOutputWriter"/> turns it into files.</summary>
public sealed record PipelineResult
{
    public required PipelineConfig Config { get; init; }
    public required InputCatalogues Inputs { get; init; }
    public required CrossMatchResult Match { get; init; }
    public required PhotometryProducts Photometry { get; init; }
    public required RunScope Scope { get; init; }

    /// <summary>The calibration in use: fitted in this run, or read from <see cref="RunScope.CalibrationPath"/>.</summary>
    public required CalibrationModel Model { get; init; }

    /// <summary>The standards and the fit, when the calibration was fitted in this run.</summary>
    public StandardsProducts? Standards { get; init; }
    public CalibrationResult? Calibration { get; init; }
    public MetallicityResult? Metallicity { get; init; }

    /// <summary>The dwarf branch, when the standards carry log g and enough of them are dwarfs.</summary>
    public DwarfProducts? Dwarf { get; init; }
    public MembershipResult? Membership { get; init; }
    public NarrowCompleteness? Completeness { get; init; }
    public ForecastProducts? Forecast { get; init; }

    /// <summary>The calibration's share of the error of the members' mean [Fe/H] (dex), see <see cref="MdfCalibrationError"/>.</summary>
    public double MdfCalibrationErrorDex { get; init; } = double.NaN;

    /// <summary>The calibration's share of the error of the members' [Fe/H] spread (dex), see <see cref="MdfCalibrationError.OfMeanAndSpread"/>.</summary>
    public double MdfSpreadCalibrationErrorDex { get; init; } = double.NaN;
    public ForecastRequest? ForecastRequest { get; init; }
    public StarRows? Stars { get; init; }
    public required IReadOnlyList<string> Warnings { get; init; }
    public required IReadOnlyList<(string Stage, double Seconds)> Timings { get; init; }

    /// <summary>Peak resident memory of the process up to the end of each stage (MiB), see <see cref="PeakMemory"/>.</summary>
    public IReadOnlyList<(string Stage, double MiB)> PeakMemoryMiB { get; init; } = [];
}
