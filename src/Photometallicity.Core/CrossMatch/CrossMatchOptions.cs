using Photometallicity.Errors;
using Photometallicity.Units;

namespace Photometallicity.CrossMatch;

/// <summary>Settings of the cross-match stage (left = broadband, right = narrow-band catalogue).</summary>
public sealed record CrossMatchOptions
{
    /// <summary>
    /// Match radius. With <see cref="AutoRadius"/> it is the starting radius for the offset solution instead
    /// (default 1 arcsec when zero), and the separation histogram extends to 4 times it (at least 4 arcsec).
    /// </summary>
    public Angle Radius { get; init; } = Angle.FromArcseconds(1.0);

    /// <summary>Choose the radius from the separation distribution (see <see cref="CrossMatch.AutoRadius"/>).</summary>
    public bool AutoRadius { get; init; }

    /// <summary>Solve the astrometric offset (narrow minus broadband) and correct the right catalogue by it.</summary>
    public bool SolveOffset { get; init; } = true;

    /// <summary>Also solve a small rotation and scale (a similarity transform in the tangent plane).</summary>
    public bool SolveRotationScale { get; init; }

    /// <summary>Most offset iterations (solve, correct, rematch); the loop stops earlier when the change is below <see cref="ConvergenceTolerance"/>.</summary>
    public int MaxIterations { get; init; } = 10;

    /// <summary>The loop has converged when the solution moves by less than this anywhere in the field.</summary>
    public Angle ConvergenceTolerance { get; init; } = Angle.FromArcseconds(0.001);

    /// <summary>
    /// Search radius for the first offset estimate (mode of all pair offsets within it); null means
    /// max(3 x radius, 3 arcsec), so that an offset as large as the radius is still found.
    /// </summary>
    public Angle? OffsetSearchRadius { get; init; }

    /// <summary>Fewest secure pairs (unique both ways within the radius) for an offset solution; fewer leaves the offset at zero.</summary>
    public int MinSecurePairs { get; init; } = 5;

    /// <summary>Throws when a setting is out of range (programming error or bad config value).</summary>
    public void Validate()
    {
        if (!AutoRadius && !(Radius.Radians > 0))
            throw new InputException($"the match radius must be positive (got {Radius.Arcseconds} arcsec)");
        if (!(Radius.Radians >= 0) || Radius.Degrees > 10)
            throw new InputException($"the match radius must lie in (0, 36000] arcsec (got {Radius.Arcseconds} arcsec)");
        if (MaxIterations < 1 || MaxIterations > 1000)
            throw new InputException($"the most offset iterations must lie in [1, 1000] (got {MaxIterations})");
        if (MinSecurePairs < 3)
            throw new InputException($"at least 3 secure pairs are needed for an offset (got {MinSecurePairs})");
        if (OffsetSearchRadius is { } w && !(w.Radians > 0))
            throw new InputException($"the offset search radius must be positive (got {w.Arcseconds} arcsec)");
    }
}
