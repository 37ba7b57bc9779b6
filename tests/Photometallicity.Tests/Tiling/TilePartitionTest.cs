using Photometallicity.CrossMatch;
using Photometallicity.Healpix;
using Photometallicity.Numerics;
using Photometallicity.Tests.CrossMatch;
using Photometallicity.Tiling;
using Photometallicity.Units;

namespace Photometallicity.Tests.Tiling;

/// <summary>
/// Invariants of the HEALPix tiling: every source owned by exactly one tile; every source within the margin of an
/// owned (or ring-1) source present in the tile; and the cross-match of every owned source on its tile, with the
/// whole-field solution, equal to the whole-field match. Fields: an ordinary one, one straddling RA = 0/360 and one at
/// the north celestial pole, with an astrometric offset, rotation and spurious sources (invented).
/// </summary>
public class TilePartitionTest
{
    public static TheoryData<double, double, int> Fields => new()
    {
        { 150.0, 20.0, 7 },
        { 0.05, -10.0, 7 },
        { 45.0, 89.8, 7 },
    };

    private static SyntheticField Field(double ra0, double dec0) =>
        SyntheticField.Make(77, 6_000, ra0, dec0, 0.25, 0.6, -0.4, 0.15, 0.8, 1_500, rotationArcsec: 2.0, scale: 1.000002);

    [Theory]
    [MemberData(nameof(Fields))]
    public void EverySourceIsOwnedOnce_AndTheMarginHoldsEveryNeighbour(double ra0, double dec0, int order)
    {
        var f = Field(ra0, dec0);
        var margin = Angle.FromArcseconds(3.0);
        var p = TilePartition.Build(order, margin, f.LeftRa, f.LeftDec, f.RightRa, f.RightDec);
        Assert.True(p.Pixels.Count >= 2, $"{p.Pixels.Count} tiles");
        var owners = new int[f.LeftRa.Length];
        foreach (var t in p.Broadband)
            for (int k = 0; k < t.Rows.Length; k++)
                if (t.Ring[k] == 0) owners[t.Rows[k]]++;
        Assert.All(owners, c => Assert.Equal(1, c));

        // Brute force over pairs closer than the margin (separations by the haversine formula, Sinnott 1984,
        // Sky & Telescope 68, 159, independent of the code's vector form).
        for (int t = 0; t < p.Pixels.Count; t++)
        {
            var b = p.Broadband[t];
            var inB = b.Rows.ToHashSet();
            var inN = p.Narrowband[t].Rows.ToHashSet();
            for (int k = 0; k < b.Rows.Length; k++)
            {
                if (b.Ring[k] > 1) continue;
                int i = b.Rows[k];
                for (int j = 0; j < f.RightRa.Length; j++)
                    if (Haversine(f.LeftRa[i], f.LeftDec[i], f.RightRa[j], f.RightDec[j]) < margin.Arcseconds)
                        Assert.True(inN.Contains(j), $"tile {t}: narrow row {j} within the margin of broadband row {i} (ring {b.Ring[k]}) is missing");
                for (int j = 0; j < f.LeftRa.Length; j++)
                    if (j != i && Haversine(f.LeftRa[i], f.LeftDec[i], f.LeftRa[j], f.LeftDec[j]) < margin.Arcseconds)
                        Assert.True(inB.Contains(j), $"tile {t}: broadband row {j} within the margin of row {i} is missing");
            }
        }
    }

    [Theory]
    [MemberData(nameof(Fields))]
    public void OwnedSources_AreMatchedOnTheirTileExactlyAsInTheWholeField(double ra0, double dec0, int order)
    {
        var f = Field(ra0, dec0);
        var whole = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec, new CrossMatchOptions { Radius = Angle.FromArcseconds(1.0), SolveRotationScale = true });
        var solution = whole.Solution!;
        Assert.True(solution.Corrected);
        var margin = Angle.FromRadians(1.2 * (solution.Radius.Radians + solution.LargestShift(Angle.FromDegrees(0.5)).Radians));
        var p = TilePartition.Build(order, margin, f.LeftRa, f.LeftDec, f.RightRa, f.RightDec);
        int checkedRows = 0;
        for (int t = 0; t < p.Pixels.Count; t++)
        {
            var b = p.Broadband[t];
            var n = p.Narrowband[t];
            var m = CrossMatcher.RunWith(b.Rows.Select(i => f.LeftRa[i]).ToArray(), b.Rows.Select(i => f.LeftDec[i]).ToArray(),
                n.Rows.Select(j => f.RightRa[j]).ToArray(), n.Rows.Select(j => f.RightDec[j]).ToArray(), solution, out var pairs);
            TileMatchCheck.Require(pairs, b.Ring, n.Ring, t);
            for (int k = 0; k < b.Rows.Length; k++)
            {
                if (b.Ring[k] != 0) continue;
                int i = b.Rows[k];
                int local = m.RightIndex[k];
                Assert.Equal(whole.RightIndex[i], local < 0 ? -1 : n.Rows[local]);
                Assert.Equal(whole.Blend[i], m.Blend[k]);
                Assert.Equal(BitConverter.DoubleToInt64Bits(whole.SeparationArcsec[i]), BitConverter.DoubleToInt64Bits(m.SeparationArcsec[k]));
                checkedRows++;
            }
        }
        Assert.Equal(f.LeftRa.Length, checkedRows);
    }

    [Fact]
    public void MatchCheck_RefusesAChainThatReachesTheOuterRing()
    {
        // Left 0 (owned) and 1 (ring 2, closer) compete for right 0: the chain of earlier pairs reaches the outer ring.
        var left = UnitVectors.FromDegrees([10.0, 10.00015], [10.0, 10.0]);
        var right = UnitVectors.FromDegrees([10.0001], [10.0]);
        var tree = SkyKdTree.Build(right);
        double chord = SkySeparation.Chord(Angle.FromArcseconds(1.0));
        var pairs = CandidatePairs.Find(tree, left, chord * chord);
        Assert.Equal(2, pairs.PairCount);
        var e = Assert.Throws<Errors.MethodException>(() => TileMatchCheck.Require(pairs, [0, 2], [1], 3));
        Assert.Contains("tile 3", e.Message);
        TileMatchCheck.Require(pairs, [0, 1], [1], 3);
    }

    [Fact]
    public void LongestChain_CountsPairsThatEachComeBeforeTheLast()
    {
        // Along a line of Dec at RA 10: L0 at 0", R0 at 0.9", L1 at 1.4", R1 at 1.7"; pairs within 1":
        // (L1,R1) 0.3" then (L1,R0) 0.5" then (L0,R0) 0.9": a chain of 3.
        double Dec(double arcsec) => 10 + arcsec / 3600;
        var left = UnitVectors.FromDegrees([10.0, 10.0], [Dec(0), Dec(1.4)]);
        var right = UnitVectors.FromDegrees([10.0, 10.0], [Dec(0.9), Dec(1.7)]);
        double chord = SkySeparation.Chord(Angle.FromArcseconds(1.0));
        var pairs = CandidatePairs.Find(SkyKdTree.Build(right), left, chord * chord);
        Assert.Equal(3, pairs.PairCount);
        Assert.Equal(3, CandidateChains.LongestChain(pairs, 2));
        // Ring 2 on L0 is harmless for an owned L1 (L0's pair comes after L1's) but not the other way round.
        TileMatchCheck.Require(pairs, [2, 0], [1, 1], 0);
        Assert.Throws<Errors.MethodException>(() => TileMatchCheck.Require(pairs, [0, 2], [1, 1], 0));
    }

    [Theory]
    [InlineData(4)]
    [InlineData(9)]
    [InlineData(14)]
    public void PointsWithinTheInnerWidth_LieInThePixelOrItsNeighbours(int order)
    {
        // The claim the margin rests on (TilePartition.InnerWidthFraction): anything within 0.35 x sqrt(pixel area)
        // of a point is in the point's pixel or one of its neighbours; tested with room at 0.5 x, near the poles
        // and the RA = 0 seam as well as at random.
        var h = new HealpixNested(order);
        double d = 0.5 * Math.Sqrt(h.PixelArea);
        var rng = new Rng(31 + (ulong)order);
        for (int trial = 0; trial < 3000; trial++)
        {
            double z = trial % 3 == 0 ? 1 - 0.02 * rng.NextDouble() : trial % 3 == 1 ? 2 * rng.NextDouble() - 1 : -1 + 0.02 * rng.NextDouble();
            double ra = trial % 5 == 0 ? 360 * (rng.NextDouble() < 0.5 ? rng.NextDouble() * 1e-3 : 1 - rng.NextDouble() * 1e-3) : 360 * rng.NextDouble();
            double dec = Math.Asin(z) * 180 / Math.PI;
            long p = h.FromRaDec(ra, dec);
            var allowed = h.Neighbours(p).Append(p).ToHashSet();
            for (int k = 0; k < 8; k++)
            {
                double pa = 2 * Math.PI * (k + rng.NextDouble()) / 8;
                var (r2, d2) = Offset(ra, dec, d * rng.NextDouble(), pa);
                Assert.Contains(h.FromRaDec(r2, d2), allowed);
            }
        }
    }

    /// <summary>The point at angular distance rho (rad) and position angle pa from (ra, dec): spherical trigonometry (direct problem on the sphere).</summary>
    private static (double Ra, double Dec) Offset(double raDeg, double decDeg, double rho, double pa)
    {
        double a = raDeg * Math.PI / 180, dlt = decDeg * Math.PI / 180;
        double sd = Math.Sin(dlt) * Math.Cos(rho) + Math.Cos(dlt) * Math.Sin(rho) * Math.Cos(pa);
        double d2 = Math.Asin(Math.Clamp(sd, -1, 1));
        double a2 = a + Math.Atan2(Math.Sin(pa) * Math.Sin(rho) * Math.Cos(dlt), Math.Cos(rho) - Math.Sin(dlt) * sd);
        double r = a2 * 180 / Math.PI % 360;
        return (r < 0 ? r + 360 : r, d2 * 180 / Math.PI);
    }

    private static double Haversine(double ra1, double dec1, double ra2, double dec2)
    {
        const double r = Math.PI / 180;
        double s1 = Math.Sin((dec2 - dec1) * r / 2), s2 = Math.Sin((ra2 - ra1) * r / 2);
        return 2 * Math.Asin(Math.Sqrt(s1 * s1 + Math.Cos(dec1 * r) * Math.Cos(dec2 * r) * s2 * s2)) / r * 3600;
    }
}
