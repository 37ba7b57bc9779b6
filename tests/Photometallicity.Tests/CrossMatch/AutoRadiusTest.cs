using Photometallicity.CrossMatch;
using Photometallicity.Units;

namespace Photometallicity.Tests.CrossMatch;

/// <summary>
/// The automatic radius. Reference: the Rayleigh distribution of 2-D Gaussian position errors (Rayleigh 1880),
/// whose 99.5% point is sigma sqrt(2 ln 200) = 3.255 sigma.
/// </summary>
public class AutoRadiusTest
{
    [Fact]
    public void Run_SparseFieldPicksRayleighCompletenessRadius()
    {
        // Per-axis noise 0.2 arcsec, little chance contamination: expect 3.255 x 0.2 = 0.651 arcsec.
        var f = SyntheticField.Make(21, 20_000, 60.0, 20.0, 0.3, 0.4, -0.3, 0.2, 0.8, 1_000);
        var r = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec, new CrossMatchOptions { AutoRadius = true });
        Assert.True(Math.Abs(r.RadiusUsed.Arcseconds - 0.651) < 0.06, $"{r.RadiusUsed.Arcseconds}: {r.RadiusReason}");
        Assert.Contains("99.5%", r.RadiusReason);
        Assert.Contains("holds", r.RadiusReason);
    }

    [Fact]
    public void Run_CrowdedFieldStopsWhereChanceOvertakes()
    {
        // Large errors (0.5 arcsec) and many unrelated right sources: the chance term overtakes before 99.5%.
        var f = SyntheticField.Make(22, 10_000, 60.0, 20.0, 0.1, 0.0, 0.0, 0.5, 0.5, 60_000);
        var r = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec, new CrossMatchOptions { AutoRadius = true });
        Assert.Contains("outnumber", r.RadiusReason);
        Assert.True(r.RadiusUsed.Arcseconds < 3.255 * 0.5, $"{r.RadiusUsed.Arcseconds}: {r.RadiusReason}");
        Assert.True(r.RadiusUsed.Arcseconds > 0.5, $"{r.RadiusUsed.Arcseconds}: {r.RadiusReason}");
    }

    [Fact]
    public void Choose_TooFewPairsKeepsFallback()
    {
        var counts = new double[AutoRadius.Bins];
        counts[3] = 5;
        var c = AutoRadius.Choose(counts, 0.05, Angle.FromArcseconds(1.5));
        Assert.False(c.Fitted);
        Assert.Equal(1.5, c.Radius.Arcseconds, 12);
        Assert.Contains("too few", c.Reason);
    }

    [Fact]
    public void Choose_RecoversSigmaOfSyntheticHistogram()
    {
        // Exact expected counts of a Rayleigh core (sigma 0.3, 5000 pairs) plus a linear chance term.
        const double s = 0.3, width = 0.05;
        var counts = new double[AutoRadius.Bins];
        for (int i = 0; i < counts.Length; i++)
        {
            double r0 = i * width, r1 = r0 + width;
            counts[i] = 5000 * (Math.Exp(-r0 * r0 / (2 * s * s)) - Math.Exp(-r1 * r1 / (2 * s * s))) + 20 * (r1 * r1 - r0 * r0);
        }
        var c = AutoRadius.Choose(counts, width, Angle.FromArcseconds(1.0));
        Assert.True(c.Fitted);
        Assert.Equal(0.3, c.SigmaArcsec, 2);
        Assert.True(Math.Abs(c.TrueCount - 5000) < 50, $"true count {c.TrueCount}");
    }
}
