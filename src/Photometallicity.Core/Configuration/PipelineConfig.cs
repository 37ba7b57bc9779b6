using Photometallicity.Units;

namespace Photometallicity.Configuration;

/// <summary>The validated, resolved configuration of a run (all paths absolute).</summary>
public sealed record PipelineConfig
{
    /// <summary>Absolute path of the config file.</summary>
    public required string ConfigPath { get; init; }
    public required CatalogueConfig Broadband { get; init; }
    public required CatalogueConfig Narrowband { get; init; }
    public required BandConfig Blue { get; init; }
    public required BandConfig Red { get; init; }
    public required BandConfig Narrow { get; init; }
    public required string PhotometricSystem { get; init; }
    public required ReddeningConfig Reddening { get; init; }
    public required CrossMatchConfig CrossMatch { get; init; }
    public required IndexConfig Index { get; init; }
    public required IReadOnlyList<StandardSetConfig> Standards { get; init; }

    /// <summary>The cluster fields among the standards ("kind": "cluster"), in config order.</summary>
    public IReadOnlyList<ClusterStandardConfig> ClusterStandards { get; init; } = [];
    public required CalibrationConfig Calibration { get; init; }
    public required MetallicityConfig Metallicity { get; init; }
    public required TargetConfig Target { get; init; }
    public required MembershipConfig Membership { get; init; }
    public required ForecastConfig Forecast { get; init; }
    public required OutputConfig Output { get; init; }

    /// <summary>The master seed: every random draw of the run derives from it.</summary>
    public required ulong Seed { get; init; }
}

/// <summary>Which catalogue a band's columns come from.</summary>
public enum CatalogueSide { Broadband, Narrowband }

public sealed record CatalogueConfig(string Path, string? IdColumn, string RaColumn, string DecColumn, string? FlagColumn,
    IReadOnlyList<double> MissingValues, string? Extension);

/// <summary>A band's extinction coefficient A_band / E(B-V): a number, or computed from a filter curve.</summary>
public sealed record ExtinctionSpec(double? Value, string? CurvePath, string Law, double Rv, double? TeffK)
{
    public override string ToString() => Value is { } v ? v.ToString("G6", System.Globalization.CultureInfo.InvariantCulture)
        : $"{System.IO.Path.GetFileName(CurvePath)} ({Law}, R_V = {Rv})";
}

/// <summary>One band: where its columns are, its filter's name (recorded in the calibration), extinction, zero point, error cut.</summary>
public sealed record BandConfig(string Name, CatalogueSide From, string MagColumn, string ErrColumn, ExtinctionSpec Extinction,
    double ZeroPoint, double MaxError, string Filter);

public sealed record ReddeningConfig(string? Column, double? Value, string? ErrorColumn, double? Error);

public sealed record CrossMatchConfig(double? RadiusArcsec, bool AutoRadius, bool SolveOffset, bool SolveRotationScale);

public sealed record IndexConfig(double ColourCoefficient, double? ColourMin, double? ColourMax);

public sealed record StandardSetConfig(string Path, string? IdColumn, string RaColumn, string DecColumn, string FehColumn,
    string FehErrColumn, string? LogGColumn, double MatchRadiusArcsec, string Name);

/// <summary>
/// A cluster field used as one block of standards: its own catalogue pair (same band columns as the main field),
/// the cluster's centre and selection radius, the literature [Fe/H] its members share, its reddening, and the
/// red-giant-branch selection settings. <see cref="Key"/> is the config path ("standards[1]") for messages.
/// </summary>
public sealed record ClusterStandardConfig(
    string Key,
    string Name,
    CatalogueConfig Broadband,
    CatalogueConfig Narrowband,
    SkyPosition Centre,
    double RadiusArcmin,
    double Feh,
    double FehErr,
    ReddeningConfig Reddening,
    int RidgeDegree,
    double KeepSigma,
    double? Blue0Bright,
    double? Blue0Faint,
    string Source);

/// <summary>Calibration settings; <see cref="GiantMaxLogG"/> separates giants from dwarfs when the standards carry log g.</summary>
public sealed record CalibrationConfig(int Bootstrap, ulong Seed, int? Degree, int MaxDegree, int? Knots, int MaxKnots)
{
    public double GiantMaxLogG { get; init; } = 3.5;

    /// <summary>True: the monotone model (default); false: the full 2-D polynomial.</summary>
    public bool Monotone { get; init; } = true;

    /// <summary>Fit an outlier component for bad standards (default true).</summary>
    public bool Outliers { get; init; } = true;
}

/// <summary>Per-star [Fe/H] settings; <see cref="StrictDomain"/> restricts posteriors to the standards' convex hull, else the model extrapolates beyond them within <see cref="ColourReach"/> mag of their colours.</summary>
public sealed record MetallicityConfig(double GridMin, double GridMax, double GridStep, double? PriorMean, double? PriorSigma)
{
    public bool StrictDomain { get; init; }
    public double ColourReach { get; init; } = Metallicity.MetallicityOptions.DefaultColourReach;
}

public sealed record TargetConfig(SkyPosition Centre, double DistanceModulus, double? HalfLightArcmin, string Profile);

/// <summary>Membership settings; the proper-motion and parallax columns (broadband catalogue) are optional, in pairs with their errors.</summary>
public sealed record MembershipConfig(bool UseMetallicity, double OuterRadiusMultiple, string MagnitudeBand)
{
    public string? PmRaColumn { get; init; }
    public string? PmDecColumn { get; init; }
    public string? PmRaErrColumn { get; init; }
    public string? PmDecErrColumn { get; init; }
    public string? ParallaxColumn { get; init; }
    public string? ParallaxErrColumn { get; init; }

    /// <summary>Optional fiducial red-giant locus: a table of absolute magnitude and dereddened colour.</summary>
    public string? FiducialPath { get; init; }
}

public sealed record ForecastConfig(double PrecisionDex, IReadOnlyList<double> Colours, double FehDex);

public sealed record OutputConfig(string Directory, IReadOnlyList<string> Formats, bool Plots);
