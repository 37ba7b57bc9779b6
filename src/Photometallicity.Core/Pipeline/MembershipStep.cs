using Microsoft.Extensions.Logging;
using Photometallicity.Configuration;
using Photometallicity.Membership;
using Photometallicity.Metallicity;
using Photometallicity.Numerics;

namespace Photometallicity.Pipeline;

/// <summary>Feeds the membership mixture with the run's positions, CMD and [Fe/H] likelihoods.</summary>
public static class MembershipStep
{
    public static MembershipResult Run(PipelineConfig config, InputCatalogues catalogues, double[] ra, double[] dec, PhotometryProducts phot, MetallicityResult? feh,
        double[] magErr, ILogger log)
    {
        var mc = config.Membership;
        var inputs0 = catalogues.Broadband;
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
            PmRa = Column(inputs0, mc.PmRaColumn, "membership.pm_ra"),
            PmDec = Column(inputs0, mc.PmDecColumn, "membership.pm_dec"),
            PmRaErr = Column(inputs0, mc.PmRaErrColumn, "membership.pm_ra_err"),
            PmDecErr = Column(inputs0, mc.PmDecErrColumn, "membership.pm_dec_err"),
            Parallax = Column(inputs0, mc.ParallaxColumn, "membership.parallax"),
            ParallaxErr = Column(inputs0, mc.ParallaxErrColumn, "membership.parallax_err"),
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
            Fiducial = mc.FiducialPath is { } fp ? Fiducial(fp) : null,
        };
        return MembershipFitter.Run(inputs, options, log);
    }

    private static double[]? Column(Catalogues.Table t, string? name, string key) => name is null ? null : t.RequireDoubles(name, key);

    /// <summary>A fiducial locus table: columns absolute_mag (mag, the CMD's magnitude band) and colour0 (mag), sorted by magnitude.</summary>
    private static FiducialLocus Fiducial(string path)
    {
        var t = Catalogues.CatalogueIO.Read(path, new Catalogues.ReadOptions { NumericColumns = new HashSet<string> { "absolute_mag", "colour0" } });
        double[] m = t.RequireDoubles("absolute_mag", "membership.fiducial"), c = t.RequireDoubles("colour0", "membership.fiducial");
        var order = Enumerable.Range(0, m.Length).Where(i => double.IsFinite(m[i]) && double.IsFinite(c[i])).OrderBy(i => m[i]).ToArray();
        return new FiducialLocus(order.Select(i => m[i]).ToArray(), order.Select(i => c[i]).ToArray());
    }
}
