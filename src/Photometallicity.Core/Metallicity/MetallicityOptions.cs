using System.Numerics;
using Photometallicity.Errors;

namespace Photometallicity.Metallicity;

/// <summary>
/// Options of the [Fe/H] assignment. Defaults: grid -4.5 to +1.0 dex in 0.01 dex, flat prior, likelihood window of 6 sigma,
/// limits beyond 2 sigma_eff, truncation flag above 16 % of the likelihood beyond an edge, colour interpolation error at most
/// 1e-4 mag. <see cref="Validate"/> names the offending key.
/// </summary>
public sealed record MetallicityOptions
{
    /// <summary>Lowest grid [Fe/H] (dex).</summary>
    public double GridMin { get; init; } = -4.5;

    /// <summary>Highest grid [Fe/H] (dex).</summary>
    public double GridMax { get; init; } = 1.0;

    /// <summary>Grid step (dex).</summary>
    public double GridStep { get; init; } = 0.01;

    /// <summary>Mean of an optional Gaussian prior on [Fe/H] (dex); null for a flat prior.</summary>
    public double? PriorMean { get; init; }

    /// <summary>Sigma of the optional Gaussian prior (dex); required with <see cref="PriorMean"/>.</summary>
    public double? PriorSigma { get; init; }

    /// <summary>
    /// True: posteriors are restricted to the convex hull of the accepted standards in (C0, [Fe/H]) (the strict domain).
    /// False (default): the calibration extrapolates beyond the standards with its measured model-form error
    /// (<see cref="Calibration.Extrapolation"/>), over the whole [Fe/H] grid and within <see cref="ColourReach"/> of their colours.
    /// Calibrations without an extrapolation model (older files) always use the hull.
    /// </summary>
    public bool StrictDomain { get; init; }

    /// <summary>How far beyond the standards' colours (mag) the calibration is extrapolated; beyond it a star has no value.</summary>
    public double ColourReach { get; init; } = DefaultColourReach;

    /// <summary>Default <see cref="ColourReach"/> (mag): about the colour change from the brightest giants two to three magnitudes down the branch (project choice).</summary>
    public const double DefaultColourReach = 0.5;

    /// <summary>Half-width of the evaluation window in units of the largest sigma_eff (|X0 - f| &lt; W sigma).</summary>
    public double WindowSigmas { get; init; } = 6.0;

    /// <summary>Distance beyond the model's range at the domain edge, in sigma_eff, at which a limit replaces a value.</summary>
    public double LimitSigmas { get; init; } = 2.0;

    /// <summary>Fraction of the likelihood beyond a domain edge above which the star is flagged PosteriorTruncated.</summary>
    public double TruncationFraction { get; init; } = 0.16;

    /// <summary>
    /// Largest allowed error of the linear interpolation of the model in colour (mag). The colour-node spacing h is chosen so
    /// that h^2/8 max|d2f/dC2| stays below it (the bound on linear interpolation error); 1e-4 mag is far below photometric errors
    /// of real index measurements (&gt; 0.005 mag).
    /// </summary>
    public double ColourInterpolationTolerance { get; init; } = 1e-4;

    /// <summary>
    /// Largest stride (a power of two, 1 = every grid point) at which a broad likelihood may be evaluated before interpolating
    /// ln L linearly to the full grid. The stride is the largest power of two leaving at least <see cref="PointsPerSigma"/>
    /// evaluated points per narrowest member likelihood width sigma_min / max|df/dF|; for a Gaussian, ln L is quadratic and the
    /// interpolation error is at most 1 / (8 P^2) in ln L (0.2 % for P = 8).
    /// </summary>
    public int MaxEvaluationStride { get; init; } = 16;

    /// <summary>Evaluated points per narrowest likelihood width (see <see cref="MaxEvaluationStride"/>).</summary>
    public double PointsPerSigma { get; init; } = 8;

    /// <summary>
    /// Stores every grid point of each likelihood window instead of the per-star stride (see <see cref="FehLikelihoods"/>);
    /// for tests that measure what the compact storage changes.
    /// </summary>
    internal bool StoreEveryGridPoint { get; init; }

    /// <summary>
    /// Tolerance of the ensemble subset per star, as a fraction eps of the posterior width; 0 = always every member.
    /// The mixture over M' of the M members (a rotating, star-dependent subset of the exchangeable bootstrap members) differs from
    /// the full mixture by a shift of about tau / sqrt(M') (tau = the members' spread of f), against a posterior width of about
    /// sqrt(s^2 + tau^2) in the index. M' = tau^2 / ((s_min^2 + tau^2) eps^2), at least <see cref="MinEnsembleSubset"/>: broad
    /// likelihoods (tau much smaller than s, the expensive stars) need few members, bright stars keep them all.
    /// </summary>
    public double EnsembleSubsetTolerance { get; init; } = 0.03;

    /// <summary>Fewest members used per star when the ensemble is subset.</summary>
    public int MinEnsembleSubset { get; init; } = 64;

    /// <summary>Stars per parallel work item (fixed, so results do not depend on the thread count).</summary>
    public int ChunkSize { get; init; } = 2048;

    /// <summary>Maximum threads; -1 for the runtime default.</summary>
    public int MaxDegreeOfParallelism { get; init; } = -1;

    public void Validate()
    {
        if (!(double.IsFinite(GridMin) && double.IsFinite(GridMax) && GridMax > GridMin))
            throw Bad("grid", $"grid_min = {GridMin} and grid_max = {GridMax} must be finite with grid_max > grid_min");
        if (!(GridStep > 0 && (GridMax - GridMin) / GridStep <= 1e6))
            throw Bad("grid_step", $"grid_step = {GridStep} must be > 0 and give at most 10^6 grid points");
        if (PriorMean.HasValue != PriorSigma.HasValue)
            throw Bad("prior", "prior_mean and prior_sigma must be given together");
        if (PriorSigma is { } ps && !(ps > 0 && double.IsFinite(ps)))
            throw Bad("prior_sigma", $"prior_sigma = {ps} must be a positive number (dex)");
        if (PriorMean is { } pm && !double.IsFinite(pm))
            throw Bad("prior_mean", $"prior_mean = {pm} must be finite (dex)");
        if (!(WindowSigmas >= 3 && WindowSigmas <= 50))
            throw Bad("window_sigmas", $"window_sigmas = {WindowSigmas} is outside [3, 50]");
        if (!(LimitSigmas > 0 && LimitSigmas < WindowSigmas))
            throw Bad("limit_sigmas", $"limit_sigmas = {LimitSigmas} must be > 0 and below window_sigmas = {WindowSigmas}");
        if (!(TruncationFraction > 0 && TruncationFraction < 0.5))
            throw Bad("truncation_fraction", $"truncation_fraction = {TruncationFraction} is outside (0, 0.5)");
        if (!(ColourInterpolationTolerance > 0 && ColourInterpolationTolerance <= 0.01))
            throw Bad("colour_interpolation_tolerance", $"colour_interpolation_tolerance = {ColourInterpolationTolerance} is outside (0, 0.01] mag");
        if (MaxEvaluationStride < 1 || MaxEvaluationStride > 64 || !BitOperations.IsPow2(MaxEvaluationStride))
            throw Bad("max_evaluation_stride", $"max_evaluation_stride = {MaxEvaluationStride} must be a power of two in [1, 64]");
        if (!(PointsPerSigma >= 2 && PointsPerSigma <= 1000))
            throw Bad("points_per_sigma", $"points_per_sigma = {PointsPerSigma} is outside [2, 1000]");
        if (!(EnsembleSubsetTolerance >= 0 && EnsembleSubsetTolerance <= 0.1))
            throw Bad("ensemble_subset_tolerance", $"ensemble_subset_tolerance = {EnsembleSubsetTolerance} is outside [0, 0.1]");
        if (MinEnsembleSubset < 1) throw Bad("min_ensemble_subset", $"min_ensemble_subset = {MinEnsembleSubset} must be >= 1");
        if (ChunkSize < 1) throw Bad("chunk_size", $"chunk_size = {ChunkSize} must be >= 1");
        if (MaxDegreeOfParallelism == 0 || MaxDegreeOfParallelism < -1)
            throw Bad("max_degree_of_parallelism", $"max_degree_of_parallelism = {MaxDegreeOfParallelism} must be -1 or >= 1");
    }

    private static InputException Bad(string key, string message) => new($"config key 'metallicity.{key}': {message}");
}
