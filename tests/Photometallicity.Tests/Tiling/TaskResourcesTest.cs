using Photometallicity.Tiling;

namespace Photometallicity.Tests.Tiling;

/// <summary>The batch-request model: the documented constants worked through by hand for a few row counts.</summary>
public class TaskResourcesTest
{
    [Fact]
    public void ForRows_NoRows_GivesTheFloors()
    {
        var r = TaskResources.ForRows(0, 0, 2);
        Assert.Equal(512, r.MemoryMiB);
        Assert.Equal(10, r.WallMinutes);
        Assert.Equal(2, r.Cpus);
        Assert.Equal(240, r.EstimatedPeakMiB);
        Assert.Equal(5, r.EstimatedSeconds);
    }

    [Fact]
    public void ForRows_TenMillionBroadband_WorkedByHand()
    {
        // 1e7 x 1600 B = 1.6e10 B = 15258.79 MiB, + 240 MiB = 15498.79 MiB; x 1.5 = 23248.2 -> 23249 MiB.
        // 5 s + 1e7 x 65 us = 655 s; x 3 = 1965 s = 32.75 min -> 33 min.
        var r = TaskResources.ForRows(10_000_000, 0, 2);
        Assert.Equal(15498.79, r.EstimatedPeakMiB, 2);
        Assert.Equal(23249, r.MemoryMiB);
        Assert.Equal(655, r.EstimatedSeconds, 6);
        Assert.Equal(33, r.WallMinutes);
        Assert.Equal("00:33:00", r.SlurmTime);
    }

    [Fact]
    public void ForRows_NarrowBandRowsCountAtTheirOwnRate()
    {
        // 4e7 narrow-band rows: 4e7 x 900 B = 34332.28 MiB + 240 = 34572.28 MiB; x 1.5 = 51858.4 -> 51859 MiB.
        // 5 s + 4e7 x 25 us = 1005 s; x 3 = 3015 s = 50.25 min -> 51 min.
        var r = TaskResources.ForRows(0, 40_000_000, 2);
        Assert.Equal(51859, r.MemoryMiB);
        Assert.Equal(51, r.WallMinutes);
    }

    [Fact]
    public void ForRows_FewerCpusThanTheBenchmark_TakesLongerButMoreDoNotShortenIt()
    {
        var two = TaskResources.ForRows(10_000_000, 0, 2);
        var one = TaskResources.ForRows(10_000_000, 0, 1);
        var eight = TaskResources.ForRows(10_000_000, 0, 8);
        Assert.Equal(1310, one.EstimatedSeconds, 6);
        Assert.Equal(66, one.WallMinutes); // 3930 s = 65.5 min
        Assert.Equal(two.WallMinutes, eight.WallMinutes);
        Assert.Equal(two.MemoryMiB, one.MemoryMiB);
        Assert.Equal(8, eight.Cpus);
    }

    [Theory]
    [InlineData(10, "00:10:00")]
    [InlineData(61, "01:01:00")]
    [InlineData(1439, "23:59:00")]
    [InlineData(1440, "1-00:00:00")]
    [InlineData(3 * 1440 + 125, "3-02:05:00")]
    public void SlurmTime_UsesTheSbatchTimeFormats(int minutes, string expected)
    {
        // sbatch(1), --time: "hours:minutes:seconds" and "days-hours:minutes:seconds" are among the accepted formats.
        var r = TaskResources.ForRows(0, 0, 1) with { WallMinutes = minutes };
        Assert.Equal(expected, r.SlurmTime);
    }

    [Fact]
    public void ForLargestTile_TakesTheLargestMemoryAndTimeOverTheTiles()
    {
        using var dir = new Support.TempDir();
        var plan = TilePlanSamples.FourTiles(dir.Path) with
        {
            BroadbandRows = 30_000_000,
            NarrowbandRows = 60_000_000,
            Tiles =
            [
                TilePlanSamples.Tile(0, 1, 100, 10_000_000, 0),
                TilePlanSamples.Tile(1, 2, 100, 1_000, 40_000_000),
                TilePlanSamples.Tile(2, 3, 100, 1_000, 1_000),
            ],
        };
        var r = TaskResources.ForLargestTile(plan, 2);
        Assert.Equal(TaskResources.ForRows(1_000, 40_000_000, 2).MemoryMiB, r.MemoryMiB);
        Assert.Equal(TaskResources.ForRows(1_000, 40_000_000, 2).WallMinutes, r.WallMinutes);
        Assert.True(r.MemoryMiB > TaskResources.ForRows(10_000_000, 0, 2).MemoryMiB);

        // The merge sees the whole field: 3e7 x 1600 B + 6e7 x 900 B = 45776.37 + 51498.41 MiB, + 240 = 97514.78 MiB; x 1.5 -> 146273 MiB.
        var m = TaskResources.ForMerge(plan, 2);
        Assert.Equal(146273, m.MemoryMiB);
        // 5 + 30e6 x 65e-6 + 60e6 x 25e-6 = 5 + 1950 + 1500 = 3455 s; x 3 = 10365 s = 172.75 min -> 173 min.
        Assert.Equal(173, m.WallMinutes);
        Assert.Equal("02:53:00", m.SlurmTime);
    }

    [Fact]
    public void Override_ReplacesOnlyWhatIsGiven()
    {
        var r = TaskResources.ForRows(10_000_000, 0, 2);
        Assert.Equal(r with { MemoryMiB = 700 }, r.Override(700, null));
        Assert.Equal(r with { WallMinutes = 5 }, r.Override(null, 5));
        Assert.Equal(r, r.Override(null, null));
    }
}
