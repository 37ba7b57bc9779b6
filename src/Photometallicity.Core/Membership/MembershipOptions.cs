using Photometallicity.Errors;
using Photometallicity.Units;

namespace Photometallicity.Membership;

/// <summary>A fiducial red-giant locus: colour (mag) against absolute magnitude on the CMD's magnitude axis.</summary>
public sealed record FiducialLocus(double[] AbsoluteMag, double[] Colour);

/// <summary>
/// Options of the membership fit. <see cref="InitialCentre"/> is where to look; the fit searches for the density
/// peak within one half-light radius of it and then fits the centre. <see cref="InitialHalfLightArcmin"/> null means
/// "guess 10% of the field radius". The foreground's colour-magnitude density is learned from stars beyond
/// <see cref="OuterRadiusMultiple"/> half-light radii. <see cref="MaxThreads"/> 0 uses all cores; results do not
/// depend on it.
/// </summary>
public sealed record MembershipOptions
{
    public required SkyPosition InitialCentre { get; init; }
    public required double DistanceModulus { get; init; }
    public double? InitialHalfLightArcmin { get; init; }
    public ProfileKind Profile { get; init; } = ProfileKind.Plummer;
    public bool UseMetallicity { get; init; } = true;
    public double OuterRadiusMultiple { get; init; } = 3.0;
    public FiducialLocus? Fiducial { get; init; }
    public int MaxIterations { get; init; } = 300;
    /// <summary>Master seed of the run. The fit itself draws no random numbers (it is deterministic); kept so that
    /// a resampling estimate of the errors can derive its stream from it.</summary>
    public ulong Seed { get; init; }

    /// <summary>Degree of the learned ridge-line polynomial colour(mag).</summary>
    public int RidgeDegree { get; init; } = 2;

    /// <summary>Also fit the other metallicity mode, so that both MDF estimates are reported.</summary>
    public bool FitBothMetallicityModes { get; init; } = true;

    /// <summary>Relative change of the log-likelihood per star below which EM stops.</summary>
    public double Tolerance { get; init; } = 1e-9;

    public int MaxThreads { get; init; }

    public void Validate()
    {
        if (!double.IsFinite(DistanceModulus) || DistanceModulus < 0 || DistanceModulus > 40)
            throw new InputException($"membership.distance_modulus = {DistanceModulus} is outside [0, 40] mag", column: "distance_modulus");
        if (InitialHalfLightArcmin is { } rh && !(rh > 0 && double.IsFinite(rh)))
            throw new InputException($"membership half-light radius = {rh} arcmin must be positive", column: "half_light_arcmin");
        if (!(OuterRadiusMultiple >= 1.0 && OuterRadiusMultiple <= 100))
            throw new InputException($"membership outer radius multiple = {OuterRadiusMultiple} is outside [1, 100]", column: "outer_radius_multiple");
        if (MaxIterations < 1) throw new InputException($"membership max iterations = {MaxIterations} must be at least 1", column: "max_iterations");
        if (RidgeDegree < 0 || RidgeDegree > 5) throw new InputException($"ridge degree = {RidgeDegree} is outside [0, 5]", column: "ridge_degree");
        if (Fiducial is { } f)
        {
            if (f.AbsoluteMag.Length != f.Colour.Length || f.AbsoluteMag.Length < 2)
                throw new InputException($"fiducial locus needs at least 2 (absolute mag, colour) pairs of equal length; got {f.AbsoluteMag.Length} and {f.Colour.Length}", column: "fiducial");
            for (int k = 1; k < f.AbsoluteMag.Length; k++)
                if (!(f.AbsoluteMag[k] > f.AbsoluteMag[k - 1]))
                    throw new InputException($"fiducial locus absolute magnitudes must increase strictly (entry {k})", column: "fiducial");
        }
    }
}
