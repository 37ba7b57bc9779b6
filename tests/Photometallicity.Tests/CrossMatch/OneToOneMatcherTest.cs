using Photometallicity.CrossMatch;
using Photometallicity.Units;

namespace Photometallicity.Tests.CrossMatch;

/// <summary>Contention rules of the one-to-one assignment, on hand-made cases worked out on paper.</summary>
public class OneToOneMatcherTest
{
    private static double Arcsec(double a) => a / 3600.0;

    private static CrossMatchResult Match(double[] lra, double[] ldec, double[] rra, double[] rdec, double radius = 1.0) =>
        CrossMatcher.Run(lra, ldec, rra, rdec, new CrossMatchOptions { Radius = Angle.FromArcseconds(radius), SolveOffset = false });

    [Fact]
    public void Run_LoserFallsBackToNextCandidate()
    {
        // Left 0 at 0, left 1 at 0.5"; right 0 at 0.3", right 1 at 1.2". Right 0 is 0.3" from L0, 0.2" from L1:
        // L1 takes right 0 (closest pair, 0.2"); right 1 is 1.2" from L0 (outside 1"), so L0 gets none. L1 also
        // has right 1 inside the radius (0.7"), so it is a possible blend. With right 1 at -0.9" instead, L0 falls back to it.
        double[] ldec = [0, 0];
        double[] lra = [10, 10 + Arcsec(0.5)];
        var r = Match(lra, ldec, [10 + Arcsec(0.3), 10 + Arcsec(1.2)], [0, 0]);
        Assert.Equal([-1, 0], r.RightIndex);
        Assert.False(r.Blend[0]);
        Assert.True(r.Blend[1]);
        Assert.Equal(1, r.LostContention);
        r = Match(lra, ldec, [10 + Arcsec(0.3), 10 - Arcsec(0.9)], [0, 0]);
        Assert.Equal([1, 0], r.RightIndex);
        Assert.Equal(0.9, r.SeparationArcsec[0], 6);
        Assert.Equal(0.2, r.SeparationArcsec[1], 6);
    }

    [Fact]
    public void Run_TwoCandidatesFlagPossibleBlend()
    {
        var r = Match([50.0], [-20.0], [50.0, 50.0], [-20.0 + Arcsec(0.4), -20.0 - Arcsec(0.7)]);
        Assert.Equal([0], r.RightIndex);
        Assert.True(r.Blend[0]);
        Assert.Equal(1, r.BlendCount);
    }

    [Fact]
    public void Run_EqualSeparationsGoToTheLowerIndex()
    {
        // Two left sources symmetric about one right source: the tie goes to left 0.
        var r = Match([0.0, 0.0], [Arcsec(-0.5), Arcsec(0.5)], [0.0], [0.0]);
        Assert.Equal([0, -1], r.RightIndex);
    }

    [Fact]
    public void Run_NoPartnerGivesMinusOneAndNaN()
    {
        var r = Match([100.0], [45.0], [100.1], [45.0]);
        Assert.Equal([-1], r.RightIndex);
        Assert.True(double.IsNaN(r.SeparationArcsec[0]));
        Assert.Equal(0, r.Matched);
    }

    [Fact]
    public void Run_EmptyCataloguesGiveEmptyOrUnmatchedResults()
    {
        var r = Match([1.0, 2.0], [0.0, 0.0], [], []);
        Assert.Equal([-1, -1], r.RightIndex);
        var e = Match([], [], [1.0], [0.0]);
        Assert.Empty(e.RightIndex);
    }

    [Fact]
    public void Run_BadPositionNamesRowAndColumn()
    {
        var ex = Assert.Throws<Photometallicity.Errors.InputException>(() => Match([1.0, 2.0], [0.0, 91.0], [1.0], [0.0]));
        Assert.Equal(2, ex.Row);
        Assert.Equal("Dec", ex.Column);
        Assert.Contains("left", ex.Message);
    }

    [Fact]
    public void Run_ScalesWithoutQuadraticLoops()
    {
        // 2 x 10^5 x 2 x 10^5: a pairwise loop would need 4 x 10^10 distance evaluations (minutes); the tree takes
        // well under a second of CPU. The bound is loose so that a busy machine does not fail it.
        var f = SyntheticField.Make(31, 200_000, 10.0, 10.0, 1.0, 0.3, 0.3, 0.1, 0.9, 20_000);
        var clock = System.Diagnostics.Stopwatch.StartNew();
        var r = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec, new CrossMatchOptions { Radius = Angle.FromArcseconds(1.0) });
        Assert.True(clock.Elapsed.TotalSeconds < 30, $"{clock.Elapsed.TotalSeconds} s");
        Assert.True(r.Matched > 170_000);
    }
}
