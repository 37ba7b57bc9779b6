using Photometallicity.Units;

namespace Photometallicity.Membership;

/// <summary>
/// Fitted structure of the target with 1-sigma errors from the inverse Hessian of the log-likelihood (finite
/// differences, the other model terms held at their fitted values). Centre errors are on the sky (arcmin), the
/// RA error being the error of (RA cos Dec). <see cref="MemberCount"/> is the number of members inside the field.
/// </summary>
public sealed record StructureFit(
    ProfileKind Profile,
    SkyPosition Centre,
    double CentreRaCosDecErrArcmin,
    double CentreDecErrArcmin,
    double HalfLightArcmin,
    double HalfLightErrArcmin,
    double Ellipticity,
    double EllipticityErr,
    double PositionAngleDeg,
    double PositionAngleErrDeg,
    double MemberCount,
    double MemberCountErr,
    double FootprintFraction);

/// <summary>
/// A Gaussian metallicity distribution of the members (dex): mean and intrinsic spread with 1-sigma errors from
/// the likelihood curvature at fixed membership weights. <see cref="WeightSum"/> is the sum of the members' weights
/// over the <see cref="StarCount"/> stars with a likelihood; <see cref="SigmaAtFloor"/> says the spread hit its lower
/// bound (one grid step), i.e. is unresolved.
/// </summary>
public sealed record MdfFit(double Mean, double MeanErr, double Sigma, double SigmaErr, double WeightSum, int StarCount, bool Converged, bool SigmaAtFloor);

/// <summary>The outcome of <see cref="MembershipFitter.Run"/>.</summary>
public sealed record MembershipResult
{
    /// <summary>Membership probability of every input row; NaN only where the position is missing.</summary>
    public required double[] PMember { get; init; }
    public required StructureFit Structure { get; init; }

    /// <summary>The MDF of the configured mode (null when no star has a [Fe/H] likelihood).</summary>
    public MdfFit? Mdf { get; init; }
    public MdfFit? MdfWithMetallicityTerm { get; init; }
    public MdfFit? MdfWithoutMetallicityTerm { get; init; }

    /// <summary>Foreground metallicity Gaussian (mean, sigma) in dex, when fitted.</summary>
    public (double Mean, double Sigma)? ForegroundMdf { get; init; }

    public required double ExpectedMembers { get; init; }
    public required double LogLikelihood { get; init; }
    public required double ForegroundOnlyLogLikelihood { get; init; }

    /// <summary>2 (ln L - ln L_foreground-only).</summary>
    public required double TestStatistic { get; init; }

    /// <summary>Approximate p-value of the test statistic under "no target" (chi-square with the target's free parameters).</summary>
    public required double NoTargetPValue { get; init; }
    public required bool Significant { get; init; }

    /// <summary>Ridge colour at the magnitudes <see cref="RidgeMag"/>, and its intrinsic width (mag).</summary>
    public required double[] RidgeMag { get; init; }
    public required double[] RidgeColour { get; init; }
    public required double RidgeWidth { get; init; }

    public required double FootprintAreaArcmin2 { get; init; }
    public required IReadOnlyList<string> Warnings { get; init; }
    public required int Iterations { get; init; }
    public required bool Converged { get; init; }
}
