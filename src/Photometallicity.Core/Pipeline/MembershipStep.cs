using Microsoft.Extensions.Logging;
using Photometallicity.Configuration;
using Photometallicity.Membership;
using Photometallicity.Metallicity;
using Photometallicity.Numerics;

namespace Photometallicity.Pipeline;

/// <summary>Feeds the membership mixture with the run's positions, CMD and [Fe/H] likelihoods.</summary>
public static class MembershipStep
{
    public static MembershipResult Run(PipelineConfig config, double[] ra, double[] dec, PhotometryProducts phot, MetallicityResult? feh,
        double[] magErr, ILogger log)
    {
        var ip = phot.Index;
        int n = ra.Length;
        double[] mag = config.Membership.MagnitudeBand == "red" ? ip.Red0 : ip.Blue0;
        var varMag = new double[n];
        var usable = new bool[n];
        for (int i = 0; i < n; i++)
        {
            varMag[i] = magErr[i] * magErr[i];
            usable[i] = ip.HasUsableColour(i) && double.IsFinite(mag[i]) && double.IsFinite(ip.Colour0[i]) && double.IsFinite(ip.VarColour[i]);
        }
        var inputs = new MembershipInputs
        {
            RaDeg = ra,
            DecDeg = dec,
            Mag = mag,
            Colour0 = ip.Colour0,
            VarColour = ip.VarColour,
            VarMag = varMag,
            Usable = usable,
            Feh = feh?.Likelihoods,
        };
        var options = new MembershipOptions
        {
            InitialCentre = config.Target.Centre,
            DistanceModulus = config.Target.DistanceModulus,
            InitialHalfLightArcmin = config.Target.HalfLightArcmin,
            Profile = config.Target.Profile == "exponential" ? ProfileKind.Exponential : ProfileKind.Plummer,
            UseMetallicity = config.Membership.UseMetallicity && feh is not null,
            OuterRadiusMultiple = config.Membership.OuterRadiusMultiple,
            Seed = Seeds.Derive(config.Seed, "membership"),
        };
        return MembershipFitter.Run(inputs, options, log);
    }
}
