using Photometallicity.Errors;
using Photometallicity.Membership;

namespace Photometallicity.Tests.Membership;

/// <summary>
/// Recovery of invented synthetic fields of known truth (<see cref="SyntheticField"/>): the truth is the generator's
/// own input, independent of the fitter.
/// </summary>
public class MembershipFitterTest
{
    private static readonly SyntheticFieldSpec Small = new() { Members = 1000, Foreground = 4000, Seed = 21 };

    private static MembershipOptions Quick(SyntheticFieldSpec s, double offsetArcmin = 0) =>
        SyntheticField.Options(s, offsetArcmin) with { FitBothMetallicityModes = false };

    /// <summary>Great-circle separation in arcmin (haversine; common practice).</summary>
    private static double SeparationArcmin(double ra1, double dec1, double ra2, double dec2)
    {
        double r = Math.PI / 180;
        double a = Math.Pow(Math.Sin((dec2 - dec1) * r / 2), 2) + Math.Cos(dec1 * r) * Math.Cos(dec2 * r) * Math.Pow(Math.Sin((ra2 - ra1) * r / 2), 2);
        return 2 * Math.Asin(Math.Sqrt(a)) / r * 60;
    }

    [Fact]
    public void Run_RecoversSyntheticDwarf()
    {
        var spec = new SyntheticFieldSpec();
        var f = SyntheticField.Make(spec);
        var r = MembershipFitter.Run(f.Inputs, SyntheticField.Options(spec));
        double auc = SyntheticField.Auc(r.PMember, f.IsMember);
        var mdf = r.Mdf!;
        var msg = $"auc={auc:F4} N={r.ExpectedMembers:F1}/{f.MembersInField} mdf={mdf.Mean:F3}+-{mdf.MeanErr:F3} sigma={mdf.Sigma:F3}+-{mdf.SigmaErr:F3} " +
                  $"rh={r.Structure.HalfLightArcmin:F2}+-{r.Structure.HalfLightErrArcmin:F2} e={r.Structure.Ellipticity:F2} pa={r.Structure.PositionAngleDeg:F1} " +
                  $"warnings={string.Join(" | ", r.Warnings)}";
        Assert.True(auc >= 0.97, msg);
        Assert.True(Math.Abs(r.ExpectedMembers - f.MembersInField) <= 0.05 * f.MembersInField, msg);
        Assert.True(Math.Abs(mdf.Mean - spec.MdfMean) <= 2 * mdf.MeanErr, msg);
        Assert.True(Math.Abs(mdf.Sigma - spec.MdfSigma) <= 0.07, msg);
        Assert.True(r.Significant, msg);
        Assert.True(r.Converged, msg);
        Assert.Empty(r.Warnings);
        // structure: within 3 sigma of the truth
        Assert.True(Math.Abs(r.Structure.HalfLightArcmin - spec.HalfLightArcmin) <= 3 * r.Structure.HalfLightErrArcmin, msg);
        Assert.True(Math.Abs(r.Structure.Ellipticity - spec.Ellipticity) <= 3 * r.Structure.EllipticityErr, msg);
        Assert.True(Math.Abs(r.Structure.PositionAngleDeg - spec.PositionAngleDeg) <= 3 * r.Structure.PositionAngleErrDeg, msg);
        // both metallicity modes are reported; the configured one is the one with the metallicity term
        Assert.Same(r.MdfWithMetallicityTerm, r.Mdf);
        Assert.NotNull(r.MdfWithoutMetallicityTerm);
        Assert.True(double.IsFinite(r.MdfWithoutMetallicityTerm!.Mean) && r.MdfWithoutMetallicityTerm.MeanErr > 0);
        Assert.Equal(r.ExpectedMembers, r.PMember.Sum(), 6);
    }

    [Fact]
    public void Run_FieldWithoutGalaxy_ExpectedMembersConsistentWithZeroAndWarns()
    {
        var spec = Small with { Members = 0, Foreground = 5000, Seed = 4 };
        var f = SyntheticField.Make(spec);
        var r = MembershipFitter.Run(f.Inputs, Quick(spec));
        var msg = $"N={r.ExpectedMembers:F1}+-{r.Structure.MemberCountErr:F1} ts={r.TestStatistic:F1} p={r.NoTargetPValue:G3} w={string.Join(" | ", r.Warnings)}";
        Assert.False(r.Significant, msg);
        Assert.Contains(r.Warnings, w => w.StartsWith("no significant galaxy", StringComparison.Ordinal));
        Assert.True(r.ExpectedMembers <= 3 * r.Structure.MemberCountErr || r.ExpectedMembers < 10, msg);
    }

    [Fact]
    public void Run_CentreOffByThirtyPercentOfHalfLight_FindsTrueCentre()
    {
        var f = SyntheticField.Make(Small);
        var o = Quick(Small, 0.3 * Small.HalfLightArcmin) with { InitialHalfLightArcmin = Small.HalfLightArcmin };
        var r = MembershipFitter.Run(f.Inputs, o);
        double sep = SeparationArcmin(r.Structure.Centre.RaDegrees, r.Structure.Centre.DecDegrees, Small.CentreRa, Small.CentreDec);
        double err = Math.Sqrt(Math.Pow(r.Structure.CentreRaCosDecErrArcmin, 2) + Math.Pow(r.Structure.CentreDecErrArcmin, 2));
        Assert.True(sep < 0.1 * Small.HalfLightArcmin && sep < 4 * err, $"separation {sep:F3} arcmin, error {err:F3}");
    }

    [Theory]
    [InlineData(0.1, 15.0)]   // field straddles RA = 0
    [InlineData(37.0, 88.0)]  // near the north pole
    public void Run_AwkwardSkyPositions_RecoversCentre(double ra, double dec)
    {
        var spec = Small with { CentreRa = ra, CentreDec = dec, Seed = 8 };
        var f = SyntheticField.Make(spec);
        Assert.True(f.Inputs.RaDeg.Max() - f.Inputs.RaDeg.Min() > 1.0); // the field's RA really spans the wrap or converges to the pole
        var r = MembershipFitter.Run(f.Inputs, Quick(spec));
        double sep = SeparationArcmin(r.Structure.Centre.RaDegrees, r.Structure.Centre.DecDegrees, ra, dec);
        Assert.True(sep < 0.1 * spec.HalfLightArcmin, $"separation {sep:F3} arcmin");
        Assert.True(Math.Abs(r.Structure.HalfLightArcmin - spec.HalfLightArcmin) < 0.15 * spec.HalfLightArcmin, $"r_h {r.Structure.HalfLightArcmin}");
        Assert.True(SyntheticField.Auc(r.PMember, f.IsMember) >= 0.97);
    }

    [Fact]
    public void Run_SameResultForAnyThreadCount()
    {
        var spec = Small with { Members = 600, Foreground = 9000 }; // > 2 chunks of rows
        var f = SyntheticField.Make(spec);
        var one = MembershipFitter.Run(f.Inputs, Quick(spec) with { MaxThreads = 1 });
        var two = MembershipFitter.Run(f.Inputs, Quick(spec) with { MaxThreads = 2 });
        var many = MembershipFitter.Run(f.Inputs, Quick(spec) with { MaxThreads = 5 });
        Assert.Equal(one.PMember, two.PMember);
        Assert.Equal(one.PMember, many.PMember);
        Assert.Equal(one.Structure, two.Structure);
        Assert.Equal(one.Mdf, many.Mdf);
    }

    [Fact]
    public void Run_WithAstrometry_SeparatesAtLeastAsWell()
    {
        var spec = Small with { Astrometry = true };
        var f = SyntheticField.Make(spec);
        var with = MembershipFitter.Run(f.Inputs, Quick(spec));
        var plain = SyntheticField.Make(spec with { Astrometry = false });
        var without = MembershipFitter.Run(plain.Inputs, Quick(spec));
        double a1 = SyntheticField.Auc(with.PMember, f.IsMember), a0 = SyntheticField.Auc(without.PMember, plain.IsMember);
        Assert.True(a1 >= a0 - 1e-3 && a1 >= 0.98, $"AUC with astrometry {a1:F4}, without {a0:F4}");
        Assert.True(Math.Abs(with.ExpectedMembers - f.MembersInField) <= 0.05 * f.MembersInField);
    }

    [Fact]
    public void Run_RowsWithoutPositionOrPhotometry_AreAccountedFor()
    {
        var f = SyntheticField.Make(Small);
        var inp = f.Inputs;
        inp.RaDeg[0] = double.NaN;
        inp.Usable[1] = false;
        inp.Colour0[1] = double.NaN;
        var r = MembershipFitter.Run(inp, Quick(Small));
        Assert.Equal(inp.Count, r.PMember.Length);
        Assert.True(double.IsNaN(r.PMember[0]));
        Assert.True(r.PMember.Skip(1).All(p => p >= 0 && p <= 1));
    }

    [Fact]
    public void Run_WithoutMetallicityTerm_FitsMdfAfterwardsAndReportsBoth()
    {
        var f = SyntheticField.Make(Small);
        var r = MembershipFitter.Run(f.Inputs, SyntheticField.Options(Small) with { UseMetallicity = false });
        Assert.Same(r.MdfWithoutMetallicityTerm, r.Mdf);
        Assert.NotNull(r.MdfWithMetallicityTerm);
        Assert.Null(r.ForegroundMdf); // the configured fit has no metallicity term
        Assert.True(SyntheticField.Auc(r.PMember, f.IsMember) >= 0.97);
        // the members' MDF is still found, if pulled towards the metal-rich foreground by the weaker separation
        Assert.InRange(r.Mdf!.Mean, Small.MdfMean - 0.1, Small.MdfMean + 0.3);
        Assert.InRange(r.MdfWithMetallicityTerm!.Mean, Small.MdfMean - 3 * r.MdfWithMetallicityTerm.MeanErr - 0.02, Small.MdfMean + 3 * r.MdfWithMetallicityTerm.MeanErr + 0.02);
    }

    [Fact]
    public void Run_WithFiducialLocus_RecoversMembers()
    {
        var f = SyntheticField.Make(Small);
        // the generator's own ridge, tabulated against absolute magnitude
        var absMag = Enumerable.Range(0, 31).Select(k => -4.0 + 0.2 * k).ToArray();
        var colour = absMag.Select(m => SyntheticField.RidgeColour(m + Small.DistanceModulus, Small.DistanceModulus)).ToArray();
        var r = MembershipFitter.Run(f.Inputs, SyntheticField.Options(Small) with { Fiducial = new FiducialLocus(absMag, colour) });
        Assert.True(SyntheticField.Auc(r.PMember, f.IsMember) >= 0.97);
        Assert.True(Math.Abs(r.ExpectedMembers - f.MembersInField) <= 0.05 * f.MembersInField, $"N {r.ExpectedMembers:F1} vs {f.MembersInField}");
        Assert.Equal(SyntheticField.RidgeColour(22.0, Small.DistanceModulus), r.RidgeColour[Array.FindIndex(r.RidgeMag, m => Math.Abs(m - 22.0) < 0.2)], 1);
    }

    [Fact]
    public void Run_MismatchedColumn_NamesIt()
    {
        var f = SyntheticField.Make(Small);
        var bad = new MembershipInputs
        {
            RaDeg = f.Inputs.RaDeg, DecDeg = f.Inputs.DecDeg, Mag = f.Inputs.Mag, Colour0 = f.Inputs.Colour0[..10],
            VarColour = f.Inputs.VarColour, VarMag = f.Inputs.VarMag, Usable = f.Inputs.Usable,
        };
        var ex = Assert.Throws<InputException>(() => MembershipFitter.Run(bad, Quick(Small)));
        Assert.Contains("Colour0", ex.Message);
    }
}
