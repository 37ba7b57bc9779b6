using Photometallicity.CrossMatch;
using Photometallicity.Units;

namespace Photometallicity.Tests.CrossMatch;

/// <summary>
/// The k-d tree against an exhaustive search (every pair's squared chord, computed with the same formula), for a
/// fresh tree and for a tree re-used on moved points, whose widened searches must find exactly the same pairs.
/// </summary>
public class SkyKdTreeTest
{
    private static (UnitVectors Right, UnitVectors Moved, UnitVectors Queries) Field(double moveArcsec, double unevenArcsec)
    {
        var f = SyntheticField.Make(11, 3000, 10.0, -30.0, 0.05, 0.0, 0.0, 0.3, 0.8, 600);
        var right = UnitVectors.FromDegrees(f.RightRa, f.RightDec);
        // Moved copy: a common offset in Dec plus an uneven part that grows across the field.
        var ra = new double[f.RightRa.Length];
        var dec = new double[f.RightDec.Length];
        for (int i = 0; i < ra.Length; i++)
        {
            ra[i] = f.RightRa[i] + unevenArcsec / 3600.0 * (f.RightDec[i] + 30.0) / 0.05;
            dec[i] = f.RightDec[i] + moveArcsec / 3600.0;
        }
        return (right, UnitVectors.FromDegrees(ra, dec), UnitVectors.FromDegrees(f.LeftRa, f.LeftDec));
    }

    private static List<(int Right, double Chord2)> Exhaustive(UnitVectors points, double qx, double qy, double qz, double r2)
    {
        var found = new List<(int, double)>();
        for (int i = 0; i < points.Count; i++)
        {
            double dx = points.X[i] - qx, dy = points.Y[i] - qy, dz = points.Z[i] - qz;
            double d2 = dx * dx + dy * dy + dz * dz;
            if (d2 <= r2) found.Add((i, d2));
        }
        return found;
    }

    private static void AssertSameAsExhaustive(SkyKdTree tree, UnitVectors points, UnitVectors queries, double radiusArcsec)
    {
        double c = SkySeparation.Chord(Angle.FromArcseconds(radiusArcsec));
        var idx = new List<int>();
        var d2 = new List<double>();
        for (int q = 0; q < queries.Count; q++)
        {
            idx.Clear();
            d2.Clear();
            tree.WithinRadius(queries.X[q], queries.Y[q], queries.Z[q], c * c, idx, d2);
            var got = idx.Zip(d2).OrderBy(p => p.First).ToList();
            var want = Exhaustive(points, queries.X[q], queries.Y[q], queries.Z[q], c * c);
            Assert.Equal(want.Count, got.Count);
            for (int k = 0; k < want.Count; k++)
            {
                Assert.Equal(want[k].Right, got[k].First);
                Assert.Equal(want[k].Chord2, got[k].Second);
            }
            Assert.Equal(want.Count, tree.CountWithin(queries.X[q], queries.Y[q], queries.Z[q], c * c));
            Assert.Equal(want.Count > 0, tree.AnyWithin(queries.X[q], queries.Y[q], queries.Z[q], c * c));
        }
    }

    [Fact]
    public void WithinRadius_EqualsExhaustiveSearch()
    {
        var (right, _, queries) = Field(0, 0);
        AssertSameAsExhaustive(SkyKdTree.Build(right), right, queries, 2.0);
    }

    [Theory]
    [InlineData(1.0, 0.0)]
    [InlineData(3.0, 0.5)]
    [InlineData(0.2, 2.0)]
    public void WithMovedPoints_FindsExactlyThePairsOfTheMovedPoints(double moveArcsec, double unevenArcsec)
    {
        var (right, moved, queries) = Field(moveArcsec, unevenArcsec);
        var reused = SkyKdTree.Build(right).WithMovedPoints(moved);
        AssertSameAsExhaustive(reused, moved, queries, 1.0);
        AssertSameAsExhaustive(reused, moved, queries, 4.0);
    }

    [Fact]
    public void Nearest_OnMovedTree_EqualsExhaustiveNearest()
    {
        var (right, moved, queries) = Field(2.0, 1.0);
        var reused = SkyKdTree.Build(right).WithMovedPoints(moved);
        for (int q = 0; q < queries.Count; q++)
        {
            int best = -1;
            double best2 = double.PositiveInfinity;
            for (int i = 0; i < moved.Count; i++)
            {
                double dx = moved.X[i] - queries.X[q], dy = moved.Y[i] - queries.Y[q], dz = moved.Z[i] - queries.Z[q];
                double d2 = dx * dx + dy * dy + dz * dz;
                if (d2 < best2) (best, best2) = (i, d2);
            }
            Assert.Equal(best, reused.Nearest(queries.X[q], queries.Y[q], queries.Z[q], double.PositiveInfinity, out double got2));
            Assert.Equal(best2, got2);
        }
    }
}
