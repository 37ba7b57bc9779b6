using System.Diagnostics;
using MathNet.Numerics.Distributions;
using Microsoft.Extensions.Logging;
using Photometallicity.Calibration;
using Photometallicity.Errors;
using Photometallicity.Photometry;

namespace Photometallicity.Metallicity;

/// <summary>
/// The metallicity stage: per-star [Fe/H] posteriors from the dereddened index and colour, marginalised over the calibration's
/// bootstrap ensemble (equal weights), on a fixed grid restricted to the validity domain at the star's colour.
/// Posterior(F) ∝ prior(F) (1/M) sum_m N(X0; f_m(C0, F), s_m^2) (see <see cref="LikelihoodKernel"/> for s_m).
/// Build once per calibration (the ensemble is tabulated on construction), then <see cref="Run(IndexPhotometry, ILogger?, IProgress{double}?, int[])"/>.
/// Parallel over fixed chunks of stars taken in colour order (for cache locality); every star is independent and written by
/// index, so the output does not depend on the thread count. For two calibration branches (giants, dwarfs), run once per branch.
/// </summary>
public sealed class MetallicityAssigner
{
    private readonly CalibrationModel _model;
    private readonly MetallicityOptions _options;
    private readonly EnsembleGrid _grid;
    private readonly double[] _prior;
    private readonly double _truncZ;
    private readonly int _gridCount;

    public MetallicityAssigner(CalibrationModel model, MetallicityOptions options)
    {
        options.Validate();
        _model = model;
        _options = options;
        _gridCount = (int)Math.Floor((options.GridMax - options.GridMin) / options.GridStep + 1e-9) + 1;
        _grid = EnsembleGrid.Build(model, options, options.GridMin, options.GridStep, _gridCount);
        _prior = new double[_grid.RowStride];
        for (int j = 0; j < _prior.Length; j++)
        {
            double f = options.GridMin + (_grid.FehFirst + j) * options.GridStep;
            _prior[j] = options.PriorMean is { } mu && options.PriorSigma is { } sd ? Math.Exp(-0.5 * Math.Pow((f - mu) / sd, 2)) : 1.0;
        }
        // Phi(z) > fraction  <=>  z > Phi^-1(fraction); inverse normal CDF from MathNet.Numerics.
        _truncZ = Normal.InvCDF(0, 1, options.TruncationFraction);
    }

    /// <summary>Spacing of the colour nodes of the tabulated model (mag).</summary>
    public double ColourNodeStep => _grid.ColourStep;

    /// <summary>
    /// Every star's [Fe/H]. <paramref name="rowKeys"/> gives each star's row in the whole field when
    /// <paramref name="photometry"/> holds only part of it (a survey tile); by default a star's key is its own index.
    /// </summary>
    public static MetallicityResult Run(IndexPhotometry photometry, CalibrationModel model, MetallicityOptions options,
        ILogger? logger = null, IProgress<double>? progress = null, int[]? rowKeys = null) =>
        new MetallicityAssigner(model, options).Run(photometry, logger, progress, rowKeys);

    public MetallicityResult Run(IndexPhotometry photometry, ILogger? logger = null, IProgress<double>? progress = null, int[]? rowKeys = null)
    {
        if (rowKeys is not null) Guard.SameLength(rowKeys.Length, photometry.Count, "rowKeys", "Colour0");
        var clock = Stopwatch.StartNew();
        int n = photometry.Count;
        Guard.SameLength(photometry.Index0.Length, n, "Index0", "Colour0");
        var feh = new double[n];
        var lo = new double[n];
        var hi = new double[n];
        var lim = new double[n];
        var side = new FehLimitSide[n];
        var status = new MetallicityStatus[n];
        var start = new int[n];
        var length = new int[n];
        var stride = new byte[n];
        var offset = new int[n];

        // Stars in order of colour node, then index: neighbours in a chunk share the same rows of the tabulated model.
        var keys = new long[n];
        var order = new int[n];
        for (int i = 0; i < n; i++)
        {
            double c = photometry.Colour0[i];
            long node = double.IsFinite(c) ? _grid.Locate(c).Node : _grid.ColourNodes;
            keys[i] = node * n + i;
            order[i] = i;
        }
        Array.Sort(keys, order);

        int chunk = _options.ChunkSize;
        int chunks = (n + chunk - 1) / chunk;
        var buffers = new LikelihoodBuffer[chunks];
        long done = 0;
        Parallel.For(0, chunks, new ParallelOptions { MaxDegreeOfParallelism = _options.MaxDegreeOfParallelism },
            () => new StarSolver(_grid, _model, _options, _prior, _truncZ),
            (ci, _, solver) =>
            {
                var buf = buffers[ci] = new LikelihoodBuffer();
                int end = Math.Min(n, (ci + 1) * chunk);
                void Write(int i, StarSummary s, StoredWindow w)
                {
                    (status[i], feh[i], lo[i], hi[i], lim[i], side[i]) = (s.Status, s.Feh, s.FehLo, s.FehHi, s.Limit, s.Side);
                    start[i] = w.Start;
                    length[i] = w.Length;
                    stride[i] = w.Length > 0 ? w.Stride : (byte)1;
                    offset[i] = buf.Count - w.Length;
                }
                for (int p = ci * chunk; p < end; p++)
                {
                    int i = order[p];
                    if (!photometry.IsUsable(i)) Write(i, StarSummary.Without(MetallicityStatus.BadPhotometry), default);
                    else if (!solver.TryBegin(i, rowKeys is null ? i : rowKeys[i], photometry.Index0[i], photometry.Colour0[i], photometry.VarIndex[i], photometry.VarColour[i],
                                 photometry.CovIndexColour[i], out var early)) Write(i, early, default);
                    if (solver.PendingCount == LikelihoodKernel.BatchCapacity) solver.FinishBatch(buf, Write);
                }
                if (solver.PendingCount > 0) solver.FinishBatch(buf, Write);
                if (progress is not null) progress.Report((double)Interlocked.Add(ref done, end - ci * chunk) / n);
                return solver;
            },
            _ => { });

        // Concatenate the chunks' windows in chunk order (fixed), shifting each star's offset by its chunk's base.
        var bases = new long[chunks + 1];
        for (int c = 0; c < chunks; c++) bases[c + 1] = bases[c] + buffers[c].Count;
        if (bases[chunks] > Array.MaxLength)
            throw new MethodException($"the stored likelihoods need {bases[chunks]} values, more than one array holds; use a coarser grid_step");
        var values = new Half[bases[chunks]];
        for (int c = 0; c < chunks; c++)
        {
            buffers[c].Data.CopyTo(values.AsSpan((int)bases[c]));
            buffers[c] = null!; // the chunk's copy is garbage from here: the whole field is never held twice
        }
        for (int p = 0; p < n; p++)
        {
            int i = order[p];
            offset[i] = length[i] > 0 ? offset[i] + (int)bases[p / chunk] : 0;
        }

        var counts = MetallicityResult.CountsOf(status);
        logger?.LogInformation("[Fe/H] for {Stars} stars with {Members} ensemble members on {Nodes} colour nodes ({Step:F4} mag) in {Seconds:F1} s: {Counts}",
            n, _grid.Members, _grid.ColourNodes, _grid.ColourStep, clock.Elapsed.TotalSeconds,
            string.Join(", ", counts.Where(kv => kv.Value > 0).Select(kv => $"{kv.Key} {kv.Value}")));
        return new MetallicityResult
        {
            Feh = feh, FehLo = lo, FehHi = hi, FehLimit = lim, LimitSide = side, Status = status, Counts = counts,
            ColourNodeStep = _grid.ColourStep, EnsembleMembers = _grid.Members,
            Likelihoods = new FehLikelihoods
            {
                GridMin = _options.GridMin, GridStep = _options.GridStep, GridCount = _gridCount,
                Offset = offset, Start = start, Length = length, Stride = stride, Values = values,
            },
        };
    }

    /// <summary>One star's summary, without storing its likelihood (for the forecast).</summary>
    internal StarSummary SolveOne(double x0, double c0, double varX, double varC, double cov) =>
        new StarSolver(_grid, _model, _options, _prior, _truncZ).Solve(x0, c0, varX, varC, cov);
}
