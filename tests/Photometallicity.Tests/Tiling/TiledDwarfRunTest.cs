using Microsoft.Extensions.Logging.Abstractions;
using Photometallicity.Configuration;
using Photometallicity.Pipeline;
using Photometallicity.Tests.Pipeline;
using Photometallicity.Tests.Support;
using Photometallicity.Tiling;

namespace Photometallicity.Tests.Tiling;

/// <summary>
/// The tiled run in-process on the invented field with a dwarf branch (standards with log g): split, every tile,
/// merge; every per-star value (both [Fe/H] branches, membership) equal bit for bit to the whole-field run's.
/// </summary>
public class TiledDwarfRunTest
{
    [Fact]
    public void TiledRun_WithADwarfBranch_EqualsTheWholeFieldRunBitForBit()
    {
        using var dir = new TempDir();
        var (_, configPath) = DwarfBranchTest.WriteField(dir.Path);
        var config = ConfigLoader.Load(configPath);
        var log = NullLogger.Instance;
        var whole = PipelineRunner.Run(config, log);
        Assert.NotNull(whole.Dwarf);

        var plan = SurveySplitter.Split(config, new SplitOptions(7), dir.File("work"), log);
        Assert.True(plan.Tiles.Count >= 3, $"{plan.Tiles.Count} tiles");
        Assert.True(File.Exists(Path.Combine(plan.GlobalDirectory, TileFiles.DwarfCalibration)));
        foreach (var t in plan.Tiles) TileRunner.Run(TilePlanJson.Read(plan.WorkDirectory), t.Index, log);
        var merged = PipelineRunner.Run(config, log, scope: new RunScope { Precomputed = TileMerger.Gather(plan, log) });

        var a = whole.Stars!;
        var b = merged.Stars!;
        Assert.Equal(Strings(a.Id), Strings(b.Id));
        Assert.Equal(Strings(a.NarrowId), Strings(b.NarrowId));
        Assert.Equal(a.Status, b.Status);
        foreach (var (x, y, name) in new[] { (a.Feh, b.Feh, "feh"), (a.FehLo, b.FehLo, "feh_lo"), (a.FehHi, b.FehHi, "feh_hi"), (a.FehDwarf!, b.FehDwarf!, "feh_dwarf"),
                     (a.PMember, b.PMember, "p_member"), (a.MatchSepArcsec, b.MatchSepArcsec, "match_sep"), (a.Index0, b.Index0, "index0") })
            Assert.True(x.Select(BitConverter.DoubleToInt64Bits).SequenceEqual(y.Select(BitConverter.DoubleToInt64Bits)), name);
        Assert.Equal(whole.Membership!.Mdf!.Mean, merged.Membership!.Mdf!.Mean);
    }

    private static string?[] Strings(Photometallicity.Catalogues.Column c) => Enumerable.Range(0, c.Length).Select(c.GetString).ToArray();
}
