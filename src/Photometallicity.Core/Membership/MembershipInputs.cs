using Photometallicity.Errors;
using Photometallicity.Metallicity;

namespace Photometallicity.Membership;

/// <summary>
/// Per-star inputs of the membership fit, one entry per broadband row (columnar). Positions in degrees (ICRS).
/// <see cref="Mag"/> is the magnitude axis of the colour-magnitude diagram: the dereddened red-band magnitude red0
/// (mag), with <see cref="Colour0"/> = blue0 - red0 (mag); variances in mag^2. <see cref="Usable"/> marks rows
/// with a finite colour and magnitude. <see cref="Feh"/> holds each star's [Fe/H] likelihood (row-indexed; Length 0
/// where there is none) or is null. Optional astrometry: proper motions in mas/yr, parallax in mas, each with its
/// 1-sigma error; NaN where missing. <see cref="VarMag"/> is carried but not used by the CMD term: the magnitude
/// error moves a star along the giant branch, whose colour changes by only ~0.2 mag per mag, a second-order effect
/// next to the colour error.
/// </summary>
public sealed class MembershipInputs
{
    public required double[] RaDeg { get; init; }
    public required double[] DecDeg { get; init; }
    public required double[] Mag { get; init; }
    public required double[] Colour0 { get; init; }
    public required double[] VarColour { get; init; }
    public required double[] VarMag { get; init; }
    public required bool[] Usable { get; init; }
    public FehLikelihoods? Feh { get; init; }
    public double[]? PmRa { get; init; }
    public double[]? PmDec { get; init; }
    public double[]? PmRaErr { get; init; }
    public double[]? PmDecErr { get; init; }
    public double[]? Parallax { get; init; }
    public double[]? ParallaxErr { get; init; }

    public int Count => RaDeg.Length;

    /// <summary>Checks the column lengths; throws <see cref="InputException"/> naming the column at fault.</summary>
    public void Validate()
    {
        int n = Count;
        void Check(Array? a, string name, bool required)
        {
            if (a is null)
            {
                if (required) throw new InputException($"membership input column is missing", column: name);
                return;
            }
            if (a.Length != n) throw new InputException($"has {a.Length} rows but RaDeg has {n}", column: name);
        }
        Check(DecDeg, nameof(DecDeg), true);
        Check(Mag, nameof(Mag), true);
        Check(Colour0, nameof(Colour0), true);
        Check(VarColour, nameof(VarColour), true);
        Check(VarMag, nameof(VarMag), true);
        Check(Usable, nameof(Usable), true);
        bool anyPm = PmRa is not null || PmDec is not null || PmRaErr is not null || PmDecErr is not null;
        Check(PmRa, nameof(PmRa), anyPm);
        Check(PmDec, nameof(PmDec), anyPm);
        Check(PmRaErr, nameof(PmRaErr), anyPm);
        Check(PmDecErr, nameof(PmDecErr), anyPm);
        bool anyPlx = Parallax is not null || ParallaxErr is not null;
        Check(Parallax, nameof(Parallax), anyPlx);
        Check(ParallaxErr, nameof(ParallaxErr), anyPlx);
        if (Feh is not null && Feh.StarCount != 0 && Feh.StarCount != n)
            throw new InputException($"[Fe/H] likelihoods are given for {Feh.StarCount} stars but there are {n} rows", column: nameof(Feh));
    }

    internal bool HasFeh(int i) => Feh is not null && Feh.StarCount == Count && Feh.Length[i] > 0;
}
