using Photometallicity.Validation;

namespace Photometallicity.Tests.Validation;

/// <summary>The scoring's numbers on a small hand-made set of members, worked out by hand.</summary>
public class ValidationScoringTest
{
    private static ScoredStar S(double truth, double feh, double lo, double hi, string status = "ok", bool det = true) => new(truth, feh, lo, hi, status, det, 50);

    [Fact]
    public void Score_HandMadeMembers_GivesBiasPullCoverageAndShares()
    {
        var nan = double.NaN;
        var stars = new[]
        {
            S(-1.0, -0.9, -1.1, -0.7),   // bias +0.1; truth below feh: pull = 0.1 / (feh - lo) = 0.1 / 0.2 = +0.5; covered
            S(-2.0, -2.3, -2.5, -2.2),   // bias -0.3; truth above: pull = -0.3 / (hi - feh) = -0.3 / 0.1 = -3; not covered
            S(-1.5, -1.5, -1.7, -1.2),   // bias 0; truth not above feh: pull = 0 / 0.2 = 0; covered
            S(-1.2, -1.0, -1.4, -0.6, "posterior_truncated"), // bias +0.2; pull = 0.2 / 0.4 = +0.5; covered
            S(-1.8, -1.6, -1.7, -1.5, "extrapolated"),         // a status with full values counts as a value: bias +0.2, pull 0.2 / 0.1 = +2; not covered
            S(-0.3, nan, -0.5, nan, "index_above_range"),      // a limit
            S(-3.0, nan, nan, -2.6, "index_below_range"),      // a limit
            S(-3.0, nan, -3.2, nan, "index_below_range"),      // below range without its upper limit: neither
            S(-1.0, nan, nan, nan, "colour_outside_calibration"),
            S(-1.0, nan, nan, nan, "no_narrow_match", det: false),
        };
        var s = Scoring.Score(stars);
        Assert.Equal(10, s.Members);
        Assert.Equal(9, s.NarrowDetected);
        Assert.Equal(5, s.WithValue);
        Assert.Equal(2, s.WithLimit);
        Assert.Equal(7.0 / 9.0, s.ShareValueOrLimit, 12);
        // biases {+0.1, -0.3, 0, +0.2, +0.2}: median +0.1
        Assert.Equal(0.1, s.MedianBias, 12);
        // pulls {+0.5, -3, 0, +0.5, +2}: median 0.5, |dev| {0, 3.5, 0.5, 0, 1.5}: MAD 0.5, width 1.4826 x 0.5
        Assert.Equal(0.7413, s.PullWidth, 12);
        Assert.Equal(3.0 / 5.0, s.Coverage68, 12);
        // half widths {0.2, 0.15, 0.25, 0.4, 0.1}: median 0.2
        Assert.Equal(0.2, s.MedianHalfWidth, 12);
    }

    [Fact]
    public void Score_NoMembers_GivesNaNsNotErrors()
    {
        var s = Scoring.Score([]);
        Assert.Equal(0, s.Members);
        Assert.True(double.IsNaN(s.MedianBias) && double.IsNaN(s.PullWidth) && double.IsNaN(s.Coverage68) && double.IsNaN(s.ShareValueOrLimit));
    }

    [Fact]
    public void Failures_JudgeOnlyWellPopulatedBinsDownToMuPlusOne()
    {
        var good = new BinScore { Members = 100, NarrowDetected = 100, WithValue = 95, ShareValueOrLimit = 0.95, MedianBias = 0, PullWidth = 1.0, Coverage68 = 0.68 };
        var bad = good with { Coverage68 = 0.3, PullWidth = 2.5, ShareValueOrLimit = 0.5 };
        var thin = bad with { WithValue = 19 };
        var bins = MagnitudeBin.All;
        var f = new FieldScore
        {
            Field = "x",
            Bins = [(bins[0], thin), (bins[1], good), (bins[2], good), (bins[3], good), (bins[4], bad), (bins[5], bad)],
            HighSnrMembers = 10, HighSnrMedianBias = 0.02, StandardsBad = 10, StandardsBadFlagged = 8, StandardsGood = 100, StandardsGoodFlagged = 2,
        };
        var fails = ValidationReport.Failures(f);
        Assert.Equal(3, fails.Count); // only mu..mu+1: coverage, pull width, share
        Assert.All(fails, l => Assert.Contains("mu..mu+1", l));
        Assert.Equal(2, ValidationReport.Failures(f with { Bins = [(bins[1], good)], StandardsBadFlagged = 7, StandardsGoodFlagged = 3 }).Count);
    }
}

/// <summary>Which standards count as flagged, on hand-made residual and standards tables.</summary>
public class ValidationStandardsFlagsTest
{
    [Fact]
    public void StandardsFlags_StatusOrOutlierProbability_ExcludedLeftOut_ClusterForegroundIsBad()
    {
        using var dir = new Photometallicity.Tests.Support.TempDir();
        Directory.CreateDirectory(dir.File("out"));
        File.WriteAllText(dir.File("standards.csv"), "name,FeH,truth_bad\nS1,-1,0\nS2,-1,0\nS3,-1,1\nS4,-1,1\nS5,-1,1\nS6,-1,0\n");
        File.WriteAllText(dir.File(Path.Combine("out", "calibration_residuals.csv")),
            "id,status,reason,p_outlier\n" +
            "S1,accepted,accepted,0.1\n" +      // good, not flagged
            "S2,accepted,accepted,0.7\n" +      // good, flagged by p_outlier
            "S3,outlier,outlier,0.2\n" +        // bad, flagged by status
            "S4,accepted,accepted,0.9\n" +      // bad, flagged by p_outlier
            "S5,accepted,accepted,0.4\n" +      // bad, missed
            "S6,excluded,no counterpart,\n" +   // never entered: not counted
            "Q (invented):CM0001,accepted,accepted,0.0\n" +  // cluster member: good
            "Q (invented):CF0150,outlier,outlier,0.0\n");    // cluster foreground: bad, flagged
        var vt = new System.Text.Json.Nodes.JsonObject { ["standards_id_column"] = "name" };
        var (bad, badFlagged, good, goodFlagged) = FieldScorer.StandardsFlags(dir.Path, dir.File("out"), vt);
        Assert.Equal((4, 3, 3, 1), (bad, badFlagged, good, goodFlagged));
    }
}
