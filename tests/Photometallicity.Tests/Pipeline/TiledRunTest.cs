using Photometallicity.Tests.Support;
using Photometallicity.Tiling;

namespace Photometallicity.Tests.Pipeline;

/// <summary>
/// A tiled run of the committed invented field (split into four HEALPix order-6 tiles, each tile run as its own
/// process, then merged) against the single-machine run of the same config: the stars tables must be identical byte
/// for byte.
/// </summary>
public class TiledRunTest(SamplesRunFixture run) : IClassFixture<SamplesRunFixture>
{
    [Fact]
    public void SplitTileMerge_ReproducesTheSingleMachineRunByteForByte()
    {
        Assert.True(run.ExitCode == 0, run.Log);
        using var dir = new TempDir();
        string work = dir.File("work"), merged = dir.File("merged");
        var split = SamplesRunFixture.RunCli(["split", RepoPaths.Samples("config.json"), "--order", "6", "--out", work], null);
        Assert.True(split.Code == 0, split.Err);
        var plan = TilePlanJson.Read(work);
        Assert.Equal(4, plan.Tiles.Count);
        Assert.Equal(plan.BroadbandRows, plan.Tiles.Sum(t => t.OwnedRows));
        for (int i = 0; i < plan.Tiles.Count; i++)
        {
            var t = SamplesRunFixture.RunCli(["tile", work, "--index", i.ToString(System.Globalization.CultureInfo.InvariantCulture)], i % 2 == 0 ? "1" : null);
            Assert.True(t.Code == 0, t.Err);
        }
        var m = SamplesRunFixture.RunCli(["merge", work, "--out", merged], null);
        Assert.True(m.Code == 0, m.Err);
        foreach (var f in new[] { "stars.csv", "stars.fits", "calibration.json", "calibration_residuals.csv" })
            Assert.True(File.ReadAllBytes(Path.Combine(run.Out, f)).AsSpan().SequenceEqual(File.ReadAllBytes(Path.Combine(merged, f))), f);
    }

    [Fact]
    public void Merge_WithATileNotRun_SaysWhichAndWritesNothing()
    {
        using var dir = new TempDir();
        string work = dir.File("work"), merged = dir.File("merged");
        Assert.Equal(0, SamplesRunFixture.RunCli(["split", RepoPaths.Samples("config.json"), "--order", "6", "--out", work], null).Code);
        Assert.Equal(0, SamplesRunFixture.RunCli(["tile", work, "--index", "0"], null).Code);
        var m = SamplesRunFixture.RunCli(["merge", work, "--out", merged], null);
        Assert.Equal(2, m.Code);
        Assert.Contains("00001", m.Err);
        Assert.Contains("run the 'tile' verb", m.Err);
        Assert.False(Directory.Exists(merged) && Directory.EnumerateFileSystemEntries(merged).Any());
    }

    [Fact]
    public void Tile_WithoutAnIndex_IsAUsageError()
    {
        var r = CliRun.Invoke("tile", "/nonexistent-work-dir");
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("--index", r.Error);
    }
}
