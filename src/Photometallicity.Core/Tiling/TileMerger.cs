using Microsoft.Extensions.Logging;
using Photometallicity.Errors;
using Photometallicity.Metallicity;
using Photometallicity.Pipeline;

namespace Photometallicity.Tiling;

/// <summary>
/// Gathers the tiles' results into whole-field per-star products in the original row order, each row from the
/// one tile that owns it; every row must be owned exactly once. The merged run then takes them in place of its own
/// cross-match and [Fe/H] (<see cref="RunScope.Precomputed"/>) and does the rest as 'run' does. Tiles are read one at a
/// time (their heads first, to size the likelihood store), so the merge holds one tile's result beside the field's.
/// </summary>
public static class TileMerger
{
    public static PerStarProducts Gather(TilePlan plan, ILogger log, IProgress<double>? progress = null)
    {
        string planPath = Path.Combine(plan.WorkDirectory, TilePlan.FileName);
        long total = plan.BroadbandRows;
        if (total > int.MaxValue) throw new InputException($"the plan has {total} broadband rows, more than one run holds", file: planPath);
        if (plan.Tiles.Count == 0) throw new InputException("the plan has no tiles", file: planPath);
        int n = (int)total;
        var paths = plan.Tiles.Select(t => Path.Combine(plan.TileDirectory(t.Index), TileResultFile.FileName)).ToArray();
        var heads = new TileResultFile.Header[paths.Length];
        for (int t = 0; t < paths.Length; t++)
        {
            var h = heads[t] = TileResultFile.ReadHeader(paths[t]);
            if (h.TileIndex != plan.Tiles[t].Index || h.Rows != plan.Tiles[t].OwnedRows)
                throw new InputException($"tile result is for tile {h.TileIndex} with {h.Rows} rows; the plan expects tile {plan.Tiles[t].Index} with {plan.Tiles[t].OwnedRows}: run 'split' and the tiles again", file: paths[t]);
        }
        bool dwarf = heads[0].HasDwarf;
        if (heads.Any(h => h.HasDwarf != dwarf)) throw new InputException("some tiles have dwarf-branch results and some not: run the tiles again", file: plan.WorkDirectory);
        var main = new Store(n, heads.Sum(h => h.WindowValues));
        var dw = dwarf ? new Store(n, heads.Sum(h => h.DwarfWindowValues)) : null;
        var owner = new int[n];
        Array.Fill(owner, -1);
        var right = new int[n];
        var sep = new double[n];
        var blend = new bool[n];
        for (int t = 0; t < paths.Length; t++)
        {
            var r = TileResultFile.Read(paths[t]);
            if ((r.Dwarf is not null) != dwarf) throw new InputException("some tiles have dwarf-branch results and some not: run the tiles again", file: paths[t]);
            for (int k = 0; k < r.Count; k++)
            {
                int row = r.Rows[k];
                if ((uint)row >= (uint)n) throw new InputException($"tile result names row {row}, outside the field's {n} rows", file: paths[t]);
                if (owner[row] >= 0) throw new InputException($"broadband row {row + 1} is owned by tiles {owner[row]} and {r.TileIndex}", file: paths[t]);
                owner[row] = r.TileIndex;
                right[row] = r.RightIndex[k];
                sep[row] = r.SeparationArcsec[k];
                blend[row] = r.Blend[k];
            }
            main.Add(r.Rows, r.Metallicity, r.TileIndex, paths[t]);
            dw?.Add(r.Rows, r.Dwarf!, r.TileIndex, paths[t]);
            progress?.Report((t + 1.0) / paths.Length);
        }
        int missing = Array.IndexOf(owner, -1);
        if (missing >= 0) throw new InputException($"broadband row {missing + 1} is owned by no tile: the plan is inconsistent; run 'split' again", file: planPath);
        var match = CrossMatchSolutionJson.Read(Path.Combine(plan.GlobalDirectory, CrossMatchSolutionJson.FileName), right, sep, blend);
        log.LogInformation("merge: {Rows} rows from {Tiles} tiles", n, paths.Length);
        return new PerStarProducts(match, main.Result(), dw?.Result());
    }

    /// <summary>A whole-field <see cref="MetallicityResult"/> filled tile by tile (windows laid out in tile order).</summary>
    private sealed class Store(int n, long values)
    {
        private readonly double[] _feh = new double[n], _lo = new double[n], _hi = new double[n], _lim = new double[n];
        private readonly FehLimitSide[] _side = new FehLimitSide[n];
        private readonly MetallicityStatus[] _status = new MetallicityStatus[n];
        private readonly int[] _start = new int[n], _length = new int[n], _offset = new int[n];
        private byte[]? _stride;
        private readonly Half[] _values = values <= Array.MaxLength ? new Half[values]
            : throw new MethodException($"the stored likelihoods need {values} values, more than one array holds; use a coarser grid_step");
        private int _used;
        private MetallicityResult? _first;

        public void Add(int[] rows, MetallicityResult m, int tile, string path)
        {
            var l = m.Likelihoods;
            if (_first is { } f && (l.GridMin != f.Likelihoods.GridMin || l.GridStep != f.Likelihoods.GridStep || l.GridCount != f.Likelihoods.GridCount
                                    || m.EnsembleMembers != f.EnsembleMembers || m.ColourNodeStep != f.ColourNodeStep))
                throw new InputException($"tile {tile} was run with another [Fe/H] grid or calibration than the tiles before it: run the tiles again", file: path);
            if (_first is null && l.Stride is not null) _stride = new byte[n];
            if ((l.Stride is null) != (_stride is null))
                throw new InputException($"tile {tile} stores its likelihoods with another layout than the tiles before it: run the tiles again", file: path);
            _first ??= m;
            for (int k = 0; k < rows.Length; k++)
            {
                int i = rows[k];
                _feh[i] = m.Feh[k]; _lo[i] = m.FehLo[k]; _hi[i] = m.FehHi[k]; _lim[i] = m.FehLimit[k];
                _side[i] = m.LimitSide[k]; _status[i] = m.Status[k];
                _start[i] = l.Start[k]; _length[i] = l.Length[k];
                if (_stride is not null) _stride[i] = l.Stride![k];
                if (l.Length[k] == 0) continue;
                var w = l.Window(k);
                if (_used + w.Length > _values.LongLength) throw new InputException("the tile holds more likelihood values than its head says", file: path);
                _offset[i] = _used;
                w.CopyTo(_values.AsSpan((int)_used, w.Length));
                _used += w.Length;
            }
        }

        public MetallicityResult Result()
        {
            var f = _first!;
            return new MetallicityResult
            {
                Feh = _feh, FehLo = _lo, FehHi = _hi, FehLimit = _lim, LimitSide = _side, Status = _status, Counts = MetallicityResult.CountsOf(_status),
                ColourNodeStep = f.ColourNodeStep, EnsembleMembers = f.EnsembleMembers,
                Likelihoods = new FehLikelihoods
                {
                    GridMin = f.Likelihoods.GridMin, GridStep = f.Likelihoods.GridStep, GridCount = f.Likelihoods.GridCount,
                    Offset = _offset, Start = _start, Length = _length, Stride = _stride, Values = _values,
                },
            };
        }
    }
}
