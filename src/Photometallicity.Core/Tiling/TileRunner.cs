using System.Diagnostics;
using Microsoft.Extensions.Logging;
using Photometallicity.Calibration;
using Photometallicity.Catalogues;
using Photometallicity.Configuration;
using Photometallicity.CrossMatch;
using Photometallicity.Errors;
using Photometallicity.Metallicity;
using Photometallicity.Pipeline;

namespace Photometallicity.Tiling;

/// <summary>
/// Runs one tile of a split survey: the cross-match of the tile's rows with the whole-field solution (checked
/// complete for every owned row, see <see cref="TileMatchCheck"/>), the photometric preparation and the [Fe/H] of the
/// owned rows under the whole-field calibrations. Writes result.bin into the tile's directory; reads nothing outside
/// the work directory but the config's filter curves.
/// </summary>
public static class TileRunner
{
    public static TileResult Run(TilePlan plan, int index, ILogger log, ProgressReporter? progress = null)
    {
        if (index < 0 || index >= plan.Tiles.Count)
            throw new InputException($"tile {index} does not exist: the plan has tiles 0 to {plan.Tiles.Count - 1}", file: Path.Combine(plan.WorkDirectory, TilePlan.FileName));
        var clock = Stopwatch.StartNew();
        TilePlanChecks.RequireUnchanged(plan, configOnly: true);
        var config = ConfigLoader.Load(plan.ConfigPath);
        string dir = plan.TileDirectory(index);
        var broad = ReadTable(Path.Combine(dir, TileFiles.Broadband), config.Broadband.IdColumn);
        var narrow = ReadTable(Path.Combine(dir, TileFiles.Narrowband), config.Narrowband.IdColumn);
        var solution = CrossMatchSolutionJson.ReadSolution(Path.Combine(plan.GlobalDirectory, CrossMatchSolutionJson.FileName));
        var model = CalibrationJson.Read(Path.Combine(plan.GlobalDirectory, TileFiles.Calibration));
        string dwarfPath = Path.Combine(plan.GlobalDirectory, TileFiles.DwarfCalibration);
        var dwarfModel = File.Exists(dwarfPath) ? CalibrationJson.Read(dwarfPath) : null;

        var bRows = Ints(broad, TileFiles.RowColumn);
        var bRing = Bytes(broad, TileFiles.RingColumn);
        var nRows = Ints(narrow, TileFiles.RowColumn);
        var nRing = Bytes(narrow, TileFiles.RingColumn);
        var match = CrossMatcher.RunWith(broad.RequireDoubles(config.Broadband.RaColumn), broad.RequireDoubles(config.Broadband.DecColumn),
            narrow.RequireDoubles(config.Narrowband.RaColumn), narrow.RequireDoubles(config.Narrowband.DecColumn), solution, out var pairs, log);
        TileMatchCheck.Require(pairs, bRing, nRing, index);

        var owned = Enumerable.Range(0, bRing.Length).Where(i => bRing[i] == 0).ToArray();
        var ownedTable = broad.Select(owned);
        var localRight = owned.Select(i => match.RightIndex[i]).ToArray();
        var (coefficients, _) = PhotometryStep.Filters(config, log);
        var phot = PhotometryStep.Prepare(config, ownedTable, narrow, config.Broadband, config.Reddening, localRight, coefficients, log);
        var options = PipelineRunner.MetallicityOptionsOf(config);
        var keys = owned.Select(i => bRows[i]).ToArray();
        MetallicityResult feh;
        using (var p = progress?.For($"tile {index} metallicity"))
        {
            feh = MetallicityAssigner.Run(phot.Photometry, model, options, log, p, keys);
        }
        var dwarf = dwarfModel is null ? null : MetallicityAssigner.Run(phot.Photometry, dwarfModel, options, log, null, keys);
        var result = new TileResult
        {
            TileIndex = index,
            Rows = keys,
            RightIndex = localRight.Select(k => k < 0 ? -1 : nRows[k]).ToArray(),
            SeparationArcsec = owned.Select(i => match.SeparationArcsec[i]).ToArray(),
            Blend = owned.Select(i => match.Blend[i]).ToArray(),
            Metallicity = feh,
            Dwarf = dwarf,
        };
        TileResultFile.Write(result, Path.Combine(dir, TileResultFile.FileName));
        log.LogInformation("tile {Index}: {Owned} owned rows ({Margin} margin rows), {Matched} matched, in {S:F1} s",
            index, owned.Length, bRing.Length - owned.Length, result.RightIndex.Count(k => k >= 0), clock.Elapsed.TotalSeconds);
        return result;
    }

    private static Table ReadTable(string path, string? idColumn)
    {
        if (!File.Exists(path)) throw new InputException("the tile's input is missing: run 'split' again", file: path);
        var text = new HashSet<string>();
        if (idColumn is not null) text.Add(idColumn);
        return CatalogueIO.Read(path, new ReadOptions { TextColumns = text });
    }

    private static int[] Ints(Table t, string name) =>
        t.Require(name) is Column<int> c ? c.Values : throw new InputException($"column {name} is not the tile row number the split writes", file: t.Source, column: name);

    private static byte[] Bytes(Table t, string name) =>
        t.Require(name) is Column<byte> c ? c.Values : throw new InputException($"column {name} is not the ring the split writes", file: t.Source, column: name);
}
