using System.Globalization;
using Photometallicity.Catalogues;
using Photometallicity.Demo;
using Photometallicity.Tests.Support;
using Photometallicity.Validation;

namespace Photometallicity.Tests.Validation;

/// <summary>The invented validation fields carry what they promise; the demo field is unchanged by the variants.</summary>
public class ValidationFieldsTest
{
    [Fact]
    public void DemoWithoutVariant_ReproducesTheCommittedSamplesByteForByte()
    {
        // samples/ was written by `demo --out samples --stars 5000 --seed 11 --inputs-only` before the variants existed.
        using var dir = new TempDir();
        DemoWriter.Write(DemoGenerator.Generate(5000, 11), dir.Path, 11);
        foreach (var f in new[] { "broad.csv", "narrow.csv", "standards.csv", "config.json", Path.Combine("truth", "truth.json"), Path.Combine("truth", "truth_stars.csv") })
            Assert.True(File.ReadAllBytes(RepoPaths.Samples(f.Split(Path.DirectorySeparatorChar))).AsSpan().SequenceEqual(File.ReadAllBytes(Path.Combine(dir.Path, f))), f);
    }

    [Theory]
    [InlineData(IndexLawKind.Linear)]
    [InlineData(IndexLawKind.Saturating)]
    [InlineData(IndexLawKind.Curved)]
    public void IndexLaws_IncreaseWithFehAndStayPlausible(IndexLawKind kind)
    {
        var law = IndexLaws.Of(kind);
        for (double c = 0.4; c <= 2.0 + 1e-9; c += 0.02)
        {
            double prev = law(c, -4.0);
            for (double f = -3.99; f <= 0.5 + 1e-9; f += 0.01)
            {
                double x = law(c, f);
                Assert.True(x > prev, $"{kind}: not increasing at C0 = {c:F2}, [Fe/H] = {f:F2}");
                Assert.InRange(x, -2.3, 1.5);
                prev = x;
            }
        }
        // Where the members live (C0 0.6-1.4, [Fe/H] -3.6 to -0.1) the index is of order -1.6 to +0.5 mag.
        for (double c = 0.6; c <= 1.4; c += 0.1)
            foreach (double f in new[] { -3.6, -2.0, -0.1 })
                Assert.InRange(law(c, f), -1.7, 0.5);
    }

    [Fact]
    public void CurvedLaw_HasStrongColourCurvatureAndCrossTerm()
    {
        var law = IndexLaws.Of(IndexLawKind.Curved);
        double d2c = law(1.2, -1.65) - 2 * law(1.0, -1.65) + law(0.8, -1.65); // = 2 a_cc h^2
        Assert.Equal(-0.35 * 2 * 0.04, d2c, 1e-9);
        double cross = law(1.2, -1.15) - law(1.2, -1.65) - law(0.8, -1.15) + law(0.8, -1.65);
        Assert.Equal(0.20 * 0.4 * 0.5, cross, 1e-9);
    }

    private static (Table Standards, Table Truth, Table Broad) Field(StandardsSelection sel, double bad, int stars = 16000)
    {
        var truth = new DemoTruth { CentreRaDeg = 0.03, CentreDecDeg = 5.0 };
        var f = DemoGenerator.Generate(stars, 21, truth, new DemoVariant { Standards = sel, BadShare = bad, StandardsCount = 200, GiantIndex = IndexLaws.NearlyLinear });
        return (f.Standards, f.StarTruth, f.Broadband);
    }

    private static double[] StandardsRed0(Table std, Table truth, Table broad)
    {
        var rowOf = new Dictionary<string, int>();
        var (ra, dec) = (broad["ra"], broad["dec"]);
        for (int i = 0; i < broad.RowCount; i++) rowOf[Key(ra.GetDouble(i), dec.GetDouble(i))] = i;
        double[] red0 = truth.RequireDoubles("red0_true");
        return Enumerable.Range(0, std.RowCount).Select(k => red0[rowOf[Key(std["ra"].GetDouble(k), std["dec"].GetDouble(k))]]).ToArray();
    }

    private static string Key(double ra, double dec) => string.Create(CultureInfo.InvariantCulture, $"{ra:R}/{dec:R}");

    [Fact]
    public void BrightStandards_ComeOnlyFromTheBrightestTwoMagnitudes_WithTheAskedBadShare()
    {
        var (std, truth, broad) = Field(StandardsSelection.Bright, 0.10);
        Assert.Equal(200, std.RowCount);
        double[] member = truth.RequireDoubles("is_member"), red0 = truth.RequireDoubles("red0_true");
        double tip = Enumerable.Range(0, truth.RowCount).Where(i => member[i] != 0).Min(i => red0[i]);
        var sr = StandardsRed0(std, truth, broad);
        Assert.All(sr, r => Assert.InRange(r, tip, tip + 2.0));
        double[] bad = std.RequireDoubles("truth_bad"), feh = std.RequireDoubles("feh_spec"), tfeh = std.RequireDoubles("truth_feh");
        Assert.Equal(20, bad.Count(b => b != 0));
        for (int k = 0; k < std.RowCount; k++)
        {
            double off = Math.Abs(feh[k] - tfeh[k]);
            if (bad[k] != 0) Assert.InRange(off, 0.5 - 0.6, 1.2 + 0.6); // 0.5-1.2 dex plus the spectroscopic error (< 0.12 dex, 5 sigma)
            else Assert.True(off < 0.6, $"good standard {k} off by {off:F2}");
        }
        // the bad ones are 0.5-1.2 dex off on average, with both signs
        var signed = Enumerable.Range(0, std.RowCount).Where(k => bad[k] != 0).Select(k => feh[k] - tfeh[k]).ToArray();
        Assert.Contains(signed, d => d > 0);
        Assert.Contains(signed, d => d < 0);
        Assert.InRange(signed.Average(Math.Abs), 0.5, 1.2);
        // every RA in [0, 360) although the field straddles RA = 0
        Assert.All(broad.RequireDoubles("ra"), r => Assert.InRange(r, 0.0, 359.9999999));
        Assert.Contains(broad.RequireDoubles("ra"), r => r > 359);
    }

    [Fact]
    public void SpreadStandards_CoverTheBranch_AndBadShareZeroMeansNone()
    {
        var (std, truth, broad) = Field(StandardsSelection.Spread, 0.0);
        Assert.Equal(200, std.RowCount);
        Assert.All(std.RequireDoubles("truth_bad"), b => Assert.Equal(0, b));
        var sr = StandardsRed0(std, truth, broad);
        double mu = new DemoTruth().DistanceModulus;
        Assert.True(sr.Max() - sr.Min() > 4.0, $"standards span {sr.Min():F2} to {sr.Max():F2}");
        Assert.True(sr.Count(r => r > mu) >= 40, "too few standards below mu");
        Assert.All(sr, r => Assert.True(r < mu + 1.5));
    }

    [Fact]
    public void ShallowDepth_PutsNarrowSnrFiveToTenAtMuPlusOne()
    {
        var f = ValidationGrid.Full.First(x => x.Depth == NarrowDepth.Shallow && x.Standards != StandardsSource.Cluster);
        var truth = new DemoTruth { MeanFeh = f.MeanFeh, SigmaFeh = f.SigmaFeh };
        double d5 = ValidationFieldWriter.NarrowDepth5(f, truth, IndexLaws.Of(f.Law));
        var field = DemoGenerator.Generate(8000, 3, truth with { NarrowDepth5 = d5 }, new DemoVariant { GiantIndex = IndexLaws.Of(f.Law) });
        double[] member = field.StarTruth.RequireDoubles("is_member"), red0 = field.StarTruth.RequireDoubles("red0_true"), snr = field.StarTruth.RequireDoubles("narrow_snr_true");
        var near = Enumerable.Range(0, member.Length).Where(i => member[i] != 0 && Math.Abs(red0[i] - (truth.DistanceModulus + 1)) < 0.1).Select(i => snr[i]).ToArray();
        Assert.True(near.Length > 30);
        Assert.InRange(Scoring.Median(near), 5.0, 10.0);
    }
}
