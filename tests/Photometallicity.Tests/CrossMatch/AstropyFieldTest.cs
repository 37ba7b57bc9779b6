using Photometallicity.CrossMatch;

namespace Photometallicity.Tests.CrossMatch;

/// <summary>
/// Nearest neighbours and one-to-one matches on the synthetic fields of tests/fixtures/crossmatch against
/// astropy (version in fields.json): match_coordinates_sky for the nearest neighbour, and a plain reference
/// resolution (search_around_sky pairs, sorted by separation then indices, accepted greedily) for 1:1.
/// </summary>
public class AstropyFieldTest
{
    [Theory]
    [InlineData("wrap")]
    [InlineData("pole")]
    public void Generator_ReproducesThePythonPositions(string name)
    {
        var f = CrossMatchFixtureField.Load(name);
        Assert.Equal(f.Probe[0][0], f.LeftRa[0].ToString("R", System.Globalization.CultureInfo.InvariantCulture));
        Assert.Equal(f.Probe[0][1], f.LeftDec[0].ToString("R", System.Globalization.CultureInfo.InvariantCulture));
        Assert.Equal(f.Probe[1][0], f.LeftRa[^1].ToString("R", System.Globalization.CultureInfo.InvariantCulture));
        Assert.Equal(f.Probe[2][1], f.RightDec[^1].ToString("R", System.Globalization.CultureInfo.InvariantCulture));
    }

    // Source: astropy match_coordinates_sky on the same positions (10^5 x 1.0x10^5 across RA = 0/360;
    // 5000 within 1 deg of the pole). Index must be identical; separation within 1e-8 arcsec.
    [Theory]
    [InlineData("wrap")]
    [InlineData("pole")]
    public void Nearest_EqualsAstropyMatchCoordinatesSky(string name)
    {
        var f = CrossMatchFixtureField.Load(name);
        var tree = SkyKdTree.Build(UnitVectors.FromDegrees(f.RightRa, f.RightDec));
        var q = UnitVectors.FromDegrees(f.LeftRa, f.LeftDec);
        int differ = 0;
        for (int i = 0; i < q.Count; i++)
        {
            int j = tree.Nearest(q.X[i], q.Y[i], q.Z[i], double.PositiveInfinity, out _);
            if (j != f.AstropyNearest[i]) differ++;
            double sep = SkySeparation.Arcseconds(f.LeftRa[i], f.LeftDec[i], f.RightRa[j], f.RightDec[j]);
            Assert.True(Math.Abs(sep - f.AstropyNearestArcsec[i]) < 1e-8, $"row {i}: {sep} vs astropy {f.AstropyNearestArcsec[i]}");
        }
        Assert.Equal(0, differ);
    }

    // Source: reference 1:1 resolution in make_crossmatch_fixtures.py (astropy search_around_sky pairs within
    // 3 arcsec, global order by separation, left, right; greedy). Must be identical row by row.
    [Theory]
    [InlineData("wrap")]
    [InlineData("pole")]
    public void Run_OneToOneEqualsReferenceResolution(string name)
    {
        var f = CrossMatchFixtureField.Load(name);
        var result = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec,
            new CrossMatchOptions { Radius = Photometallicity.Units.Angle.FromArcseconds(f.RadiusArcsec), SolveOffset = false });
        Assert.Equal(f.ReferenceOneToOne, result.RightIndex);
        Assert.Equal(f.ReferenceOneToOne.Count(r => r >= 0), result.Matched);
        // Each right row is used at most once.
        var used = result.RightIndex.Where(r => r >= 0).ToArray();
        Assert.Equal(used.Length, used.Distinct().Count());
        Assert.True(result.BlendCount > 0);
    }
}
