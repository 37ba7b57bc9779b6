using Photometallicity.Units;

namespace Photometallicity.CrossMatch;

/// <summary>
/// The outcome of a cross-match: one entry per left (broadband) row, in input order, and the diagnostics.
/// Offsets are narrow-band minus broadband, [delta RA cos Dec, delta Dec] in arcsec, in the tangent plane about
/// <see cref="FieldCentre"/>.
/// </summary>
public sealed record CrossMatchResult
{
    /// <summary>Right row matched to each left row; -1 when none.</summary>
    public required int[] RightIndex { get; init; }

    /// <summary>Separation from the offset-corrected right position, arcsec; NaN when unmatched.</summary>
    public required double[] SeparationArcsec { get; init; }

    /// <summary>True where the left row had two or more right candidates inside the radius (possible blend).</summary>
    public required bool[] Blend { get; init; }

    public int LeftCount { get; init; }
    public int RightCount { get; init; }
    public int Matched { get; init; }
    public int BlendCount { get; init; }

    /// <summary>Left rows that had a candidate but lost every one of them to closer pairs.</summary>
    public int LostContention { get; init; }

    public Angle RadiusUsed { get; init; }

    /// <summary>One sentence on where the radius came from.</summary>
    public string RadiusReason { get; init; } = "";

    public SkyPosition? FieldCentre { get; init; }

    /// <summary>True when an offset was solved and applied.</summary>
    public bool OffsetSolved { get; init; }

    /// <summary>One sentence on the offset solution (or why there is none).</summary>
    public string OffsetReason { get; init; } = "";

    public (double DRaCosDecArcsec, double DDecArcsec) Offset { get; init; }

    /// <summary>Standard errors of <see cref="Offset"/> (scatter / sqrt(N)); NaN when not solved.</summary>
    public (double DRaCosDecArcsec, double DDecArcsec) OffsetError { get; init; } = (double.NaN, double.NaN);

    /// <summary>Scatter (standard deviation per axis) of the secure pairs about the solution, arcsec.</summary>
    public (double DRaCosDecArcsec, double DDecArcsec) OffsetScatter { get; init; } = (double.NaN, double.NaN);

    /// <summary>
    /// Secure pairs in the last solution (unique both ways within the radius, among at most 200 000 left rows spread
    /// evenly over the field), and how many of them were kept after clipping.
    /// </summary>
    public int SecurePairs { get; init; }
    public int SecurePairsUsed { get; init; }

    /// <summary>Rotation of the right catalogue relative to the left, arcsec (east towards north); null when not solved.</summary>
    public double? RotationArcsec { get; init; }

    /// <summary>Scale of the right catalogue relative to the left; null when not solved.</summary>
    public double? Scale { get; init; }

    /// <summary>Expected fraction of left rows with a chance partner inside the radius (from the local right density).</summary>
    public double ExpectedFalseMatchRate { get; init; }

    /// <summary>Measured fraction from the displaced-position test, and its binomial error.</summary>
    public double MeasuredFalseMatchRate { get; init; }
    public double MeasuredFalseMatchRateError { get; init; }

    public int Iterations { get; init; }
    public bool Converged { get; init; }

    /// <summary>The solution this pairing used, to repeat it exactly on a subset of the catalogues (survey tiles).</summary>
    public AstrometricSolution? Solution { get; init; }
}
