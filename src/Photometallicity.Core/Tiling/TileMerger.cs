using Microsoft.Extensions.Logging;
using Photometallicity.Errors;
using Photometallicity.Metallicity;
using Photometallicity.Pipeline;

namespace Photometallicity.Tiling;

/// <summary>
/// Gathers the tiles' results into whole-field per-star products in the original row order, each row from the
/// one tile that owns it; every row must be owned exactly once. The merged run then takes them in place of its own
/// cross-match and [Fe/H] (<see cref="RunScope.Precomputed"/>) and does the rest as 'run' does.
/// </summary>
public static class TileMerger
{
    public static PerStarProducts Gather(TilePlan plan, ILogger log)
    {
        long total = plan.BroadbandRows;
        if (total > int.MaxValue) throw new InputException($"the plan has {total} broadband rows, more than one run holds", file: Path.Combine(plan.WorkDirectory, TilePlan.FileName));
        int n = (int)total;
        var owner = new int[n];
        Array.Fill(owner, -1);
        var right = new int[n];
        var sep = new double[n];
        var blend = new bool[n];
        var results = new List<TileResult>(plan.Tiles.Count);
        foreach (var tile in plan.Tiles)
        {
            string path = Path.Combine(plan.TileDirectory(tile.Index), TileResultFile.FileName);
            var r = TileResultFile.Read(path);
            if (r.TileIndex != tile.Index || r.Count != tile.OwnedRows)
                throw new InputException($"tile result is for tile {r.TileIndex} with {r.Count} rows; the plan expects tile {tile.Index} with {tile.OwnedRows}: run 'split' and the tiles again", file: path);
            for (int k = 0; k < r.Count; k++)
            {
                int row = r.Rows[k];
                if ((uint)row >= (uint)n) throw new InputException($"tile result names row {row}, outside the field's {n} rows", file: path);
                if (owner[row] >= 0) throw new InputException($"row {row + 1} is owned by tiles {owner[row]} and {tile.Index}", file: path);
                owner[row] = tile.Index;
                right[row] = r.RightIndex[k];
                sep[row] = r.SeparationArcsec[k];
                blend[row] = r.Blend[k];
            }
            results.Add(r);
        }
        int missing = Array.IndexOf(owner, -1);
        if (missing >= 0) throw new InputException($"broadband row {missing + 1} is owned by no tile: the plan is inconsistent; run 'split' again", file: Path.Combine(plan.WorkDirectory, TilePlan.FileName));
        bool dwarf = results.Count > 0 && results[0].Dwarf is not null;
        if (results.Any(r => (r.Dwarf is not null) != dwarf)) throw new InputException("some tiles have dwarf-branch results and some not: run the tiles again", file: plan.WorkDirectory);
        var match = CrossMatchSolutionJson.Read(Path.Combine(plan.GlobalDirectory, CrossMatchSolutionJson.FileName), right, sep, blend);
        log.LogInformation("merge: {Rows} rows from {Tiles} tiles", n, results.Count);
        return new PerStarProducts(match, Merge(results, r => r.Metallicity, n), dwarf ? Merge(results, r => r.Dwarf!, n) : null);
    }

    /// <summary>One whole-field <see cref="MetallicityResult"/> from the tiles' (likelihood windows laid out in row order).</summary>
    private static MetallicityResult Merge(List<TileResult> tiles, Func<TileResult, MetallicityResult> pick, int n)
    {
        var feh = new double[n];
        var lo = new double[n];
        var hi = new double[n];
        var lim = new double[n];
        var side = new FehLimitSide[n];
        var status = new MetallicityStatus[n];
        var start = new int[n];
        var length = new int[n];
        var source = new (int Tile, int Star)[n];
        if (tiles.Count == 0) throw new InputException("the plan has no tiles");
        var first = pick(tiles[0]);
        for (int t = 0; t < tiles.Count; t++)
        {
            var m = pick(tiles[t]);
            var l = m.Likelihoods;
            if (l.GridMin != first.Likelihoods.GridMin || l.GridStep != first.Likelihoods.GridStep || l.GridCount != first.Likelihoods.GridCount
                || m.EnsembleMembers != first.EnsembleMembers || m.ColourNodeStep != first.ColourNodeStep)
                throw new InputException($"tile {tiles[t].TileIndex} was run with another [Fe/H] grid or calibration than tile {tiles[0].TileIndex}: run the tiles again");
            var rows = tiles[t].Rows;
            for (int k = 0; k < rows.Length; k++)
            {
                int i = rows[k];
                feh[i] = m.Feh[k]; lo[i] = m.FehLo[k]; hi[i] = m.FehHi[k]; lim[i] = m.FehLimit[k];
                side[i] = m.LimitSide[k]; status[i] = m.Status[k];
                start[i] = l.Start[k]; length[i] = l.Length[k];
                source[i] = (t, k);
            }
        }
        var offset = new long[n];
        long total = 0;
        for (int i = 0; i < n; i++) { offset[i] = length[i] > 0 ? total : 0; total += length[i]; }
        if (total > Array.MaxLength) throw new MethodException($"the stored likelihoods need {total} values, more than one array holds; use a coarser grid_step");
        var values = new float[total];
        for (int i = 0; i < n; i++)
        {
            if (length[i] == 0) continue;
            var (t, k) = source[i];
            pick(tiles[t]).Likelihoods.Window(k).CopyTo(values.AsSpan((int)offset[i], length[i]));
        }
        return new MetallicityResult
        {
            Feh = feh, FehLo = lo, FehHi = hi, FehLimit = lim, LimitSide = side, Status = status, Counts = TileResultFile.CountsOf(status),
            ColourNodeStep = first.ColourNodeStep, EnsembleMembers = first.EnsembleMembers,
            Likelihoods = new FehLikelihoods
            {
                GridMin = first.Likelihoods.GridMin, GridStep = first.Likelihoods.GridStep, GridCount = first.Likelihoods.GridCount,
                Offset = offset, Start = start, Length = length, Values = values,
            },
        };
    }
}
