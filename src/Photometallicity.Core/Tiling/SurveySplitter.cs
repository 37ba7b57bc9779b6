using System.Diagnostics;
using Microsoft.Extensions.Logging;
using Photometallicity.Calibration;
using Photometallicity.Catalogues;
using Photometallicity.Configuration;
using Photometallicity.CrossMatch;
using Photometallicity.Errors;
using Photometallicity.Pipeline;
using Photometallicity.Units;

namespace Photometallicity.Tiling;

/// <summary>Settings of a split.</summary>
public sealed record SplitOptions(int Order, Angle? Margin = null);

/// <summary>
/// Splits a field for a tiled run. Once, for the whole field, it reads the catalogues, solves the cross-match
/// (astrometric offset, radius) and fits the calibrations (main and dwarf) exactly as 'run' does; these go to
/// global/. It then writes each non-empty HEALPix tile's rows, with their margin, as FITS tables in tiles/NNNNN/,
/// and last plan.json (so a split that stopped half-way has no plan and no tile will run on it).
/// The margin is at least the larger of 1.2 x (match radius + the largest shift the offset correction applies) and the
/// farthest reach of any source's chains of competing candidates (<see cref="CandidateChains.Measure"/>, itself an
/// upper bound), plus 0.1 arcsec (1.2 and 0.1 are the program's choice: the pairs lie within the radius after the
/// correction, the tiles are cut before it).
/// </summary>
public static class SurveySplitter
{
    public static TilePlan Split(PipelineConfig config, SplitOptions options, string workDirectory, ILogger log, ProgressReporter? progress = null)
    {
        var clock = Stopwatch.StartNew();
        workDirectory = Path.GetFullPath(workDirectory);
        if (File.Exists(workDirectory)) throw new InputException("the work directory is a file", file: workDirectory);
        var global = PipelineRunner.Run(config, log, progress, new RunScope(PipelineStage.Calibration));
        var match = global.Match;
        var solution = match.Solution!;
        var inputs = global.Inputs;
        var b = inputs.Broadband;
        var n = inputs.Narrowband;
        double[] bra = b.RequireDoubles(config.Broadband.RaColumn), bdec = b.RequireDoubles(config.Broadband.DecColumn);
        double[] nra = n.RequireDoubles(config.Narrowband.RaColumn), ndec = n.RequireDoubles(config.Narrowband.DecColumn);

        // The candidate pairs of the whole field, with the solution the tiles will use, give the longest chain of
        // competing candidates; the margin must hold every source on it as well as their own candidates.
        CrossMatcher.RunWith(bra, bdec, nra, ndec, solution, out var pairs, log);
        var (chain, chainReach) = CandidateChains.Measure(pairs, UnitVectors.FromDegrees(bra, bdec), UnitVectors.FromDegrees(nra, ndec));
        double reach = solution.Radius.Radians + solution.LargestShift(FieldRadius(solution, nra, ndec)).Radians;
        var needed = Angle.FromRadians(Math.Max(1.2 * reach, chainReach.Radians) + Angle.FromArcseconds(0.1).Radians);
        log.LogInformation("split: the longest chain of competing match candidates has {Chain} pairs and reaches at most {ChainReach:0.##} arcsec from its source; radius + offset correction {Reach:0.##} arcsec",
            chain, chainReach.Arcseconds, Angle.FromRadians(reach).Arcseconds);
        var margin = options.Margin ?? needed;
        if (margin.Radians < needed.Radians)
            throw new InputException($"the margin of {margin.Arcseconds:0.###} arcsec is smaller than the {needed.Arcseconds:0.###} arcsec the cross-match needs (the larger of 1.2 x (radius + offset correction) and the reach of the chains of competing candidates, plus 0.1 arcsec)");
        var partition = TilePartition.Build(options.Order, margin, bra, bdec, nra, ndec);
        log.LogInformation("split: {Tiles} tiles at HEALPix order {Order} (margin {Margin:0.##} arcsec, rings of order-{Fine} pixels)",
            partition.Pixels.Count, options.Order, margin.Arcseconds, partition.FineOrder);

        var globalDir = Path.Combine(workDirectory, "global");
        Directory.CreateDirectory(globalDir);
        var tilesDir = Path.Combine(workDirectory, "tiles");
        if (Directory.Exists(tilesDir)) Directory.Delete(tilesDir, recursive: true);
        string planPath = Path.Combine(workDirectory, TilePlan.FileName);
        if (File.Exists(planPath)) File.Delete(planPath);
        CalibrationJson.Write(global.Model, global.Calibration, Path.Combine(globalDir, TileFiles.Calibration));
        string dwarfPath = Path.Combine(globalDir, TileFiles.DwarfCalibration);
        if (File.Exists(dwarfPath)) File.Delete(dwarfPath);
        if (global.Standards is { } standards && DwarfBranch.Fit(config, standards, global.Photometry, log, progress) is { } dwarf)
            CalibrationJson.Write(dwarf.Fit.Model, dwarf.Fit, dwarfPath);
        CrossMatchSolutionJson.Write(match, Path.Combine(globalDir, CrossMatchSolutionJson.FileName));

        var plan = new TilePlan
        {
            WorkDirectory = workDirectory,
            ConfigPath = config.ConfigPath,
            OutputDirectory = config.Output.Directory,
            Order = options.Order,
            MarginArcsec = margin.Arcseconds,
            BroadbandRows = b.RowCount,
            NarrowbandRows = n.RowCount,
            Checksums = inputs.Checksums.Take(3).ToList(),
            Tiles = Enumerable.Range(0, partition.Pixels.Count).Select(t => new TileEntry
            {
                Index = t,
                Pixel = partition.Pixels[t],
                OwnedRows = partition.Broadband[t].Ring.Count(r => r == 0),
                BroadbandRows = partition.Broadband[t].Rows.Length,
                NarrowbandRows = partition.Narrowband[t].Rows.Length,
            }).ToList(),
        };
        using (var p = progress?.For("writing tiles"))
        {
            Parallel.For(0, plan.Tiles.Count, new ParallelOptions { MaxDegreeOfParallelism = 2 }, t =>
            {
                string dir = plan.TileDirectory(t);
                Directory.CreateDirectory(dir);
                CatalogueIO.Write(Subset(b, partition.Broadband[t]), Path.Combine(dir, TileFiles.Broadband), new WriteOptions { ExtensionName = "BROADBAND" });
                CatalogueIO.Write(Subset(n, partition.Narrowband[t]), Path.Combine(dir, TileFiles.Narrowband), new WriteOptions { ExtensionName = "NARROWBAND" });
                p?.Report((t + 1.0) / plan.Tiles.Count);
            });
        }
        TilePlanJson.Write(plan, planPath);
        long copies = plan.Tiles.Sum(t => t.BroadbandRows);
        log.LogInformation("split: wrote {Tiles} tiles to {Dir} in {S:F1} s; the margins repeat {Pct:F1}% of the broadband rows",
            plan.Tiles.Count, tilesDir, clock.Elapsed.TotalSeconds, b.RowCount == 0 ? 0 : 100.0 * (copies - b.RowCount) / b.RowCount);
        return plan;
    }

    private static Table Subset(Table t, TileRows rows)
    {
        var s = t.Select(rows.Rows);
        s.Add(new Column<int>(TileFiles.RowColumn, rows.Rows, description: "row of the whole-field catalogue (0-based)"));
        s.Add(new Column<byte>(TileFiles.RingColumn, rows.Ring, description: "0: owned by this tile; 1, 2: margin"));
        return s;
    }

    /// <summary>Largest angle between the solution's centre and any right source (zero when nothing is corrected).</summary>
    private static Angle FieldRadius(AstrometricSolution s, double[] ra, double[] dec)
    {
        if (!s.Corrected) return Angle.FromRadians(0);
        double minCos = 1;
        for (int i = 0; i < ra.Length; i++)
        {
            var (x, y, z) = SkyPosition.FromDegrees(ra[i], dec[i]).ToUnitVector();
            minCos = Math.Min(minCos, x * s.CentreX + y * s.CentreY + z * s.CentreZ);
        }
        return Angle.FromRadians(Math.Acos(Math.Clamp(minCos, -1, 1)));
    }
}
