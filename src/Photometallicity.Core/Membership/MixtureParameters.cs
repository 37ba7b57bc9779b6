namespace Photometallicity.Membership;

/// <summary>The current parameters of the two-component mixture (mutable inside the EM loop only).</summary>
internal sealed class MixtureParameters
{
    /// <summary>Target fraction among positioned stars.</summary>
    public double Fraction;
    public SurfaceDensityProfile Profile;
    /// <summary>Fraction of the plane-normalised profile inside the footprint.</summary>
    public double FootprintFraction;
    public required RidgeLine Ridge;
    public LuminosityFunction Lf;
    public double MdfMean, MdfSigma, FgMdfMean, FgMdfSigma;
    public HeteroscedasticGaussian PmRa, PmDec, FgPmRa, FgPmDec, FgPlx;
    /// <summary>The target's parallax (mas) from its distance modulus.</summary>
    public double Plx0;

    public MixtureParameters Clone()
    {
        var c = (MixtureParameters)MemberwiseClone();
        c.Ridge = Ridge.Copy();
        return c;
    }
}
