using System.Numerics;
using Photometallicity.Calibration;
using Photometallicity.Errors;

namespace Photometallicity.Metallicity;

/// <summary>
/// The calibration's ensemble tabulated once for fast inversion: for every ensemble member m, colour node c_k and [Fe/H] grid
/// point F_j, the model value f_m(c_k, F_j) and its colour slope df_m/dC(c_k, F_j), in float (the index is O(1) mag and float
/// keeps ~1e-7 mag, far below photometric errors). Per star, the model is interpolated linearly in colour between the two
/// nearest nodes; the node spacing h obeys h^2/8 max|d2f/dC2| &lt;= tolerance (the error bound of linear interpolation),
/// so the interpolation error stays below <see cref="MetallicityOptions.ColourInterpolationTolerance"/>.
/// Also kept: the best-fit model on the same nodes, the pointwise minimum and maximum over members (monotone in [Fe/H]
/// wherever every member is, so the star's window can be found by bisection), and the range of the colour slopes.
/// Rows are padded by one SIMD width so vector loops may run past a window's end without bounds checks.
/// Besides the full table (stride 1), decimated copies hold every 2nd, 4th, ... grid point, so that broad likelihoods can be
/// evaluated on fewer points and interpolated (see <see cref="LikelihoodKernel"/>); together they cost less than the full table.
/// </summary>
internal sealed class EnsembleGrid
{
    public const double MaxColourStep = 0.05;
    public const double MinColourStep = 0.0005;

    public required int Members { get; init; }
    public required int ColourNodes { get; init; }
    public required double ColourMin { get; init; }
    public required double ColourStep { get; init; }

    /// <summary>Options-grid index of the first tabulated [Fe/H] point.</summary>
    public required int FehFirst { get; init; }
    public required int FehCount { get; init; }
    public required int RowStride { get; init; }

    /// <summary>Level 0 is the full table; level L holds every 2^L-th point.</summary>
    public required GridLevel[] Levels { get; init; }
    public required float[] SigmaInt2 { get; init; }

    /// <summary>Best-fit model and its colour slope at [k * RowStride + j].</summary>
    public required double[] BestValue { get; init; }
    public required double[] BestSlope { get; init; }
    public required float[] EnvelopeMin { get; init; }
    public required float[] EnvelopeMax { get; init; }

    /// <summary>+1 where the envelopes at node k rise with [Fe/H], -1 where they fall, 0 where they are not monotonic.</summary>
    public required sbyte[] Direction { get; init; }

    /// <summary>Largest |df_m/dF| over members between points j and j + 1 at node k, [k * RowStride + j] (mag/dex).</summary>
    public required float[] FehSlopeMax { get; init; }

    /// <summary>
    /// Variance the calibration's model-form error adds beyond the standards (<see cref="Extrapolation.ModelFormVariance"/>),
    /// per level at [k * level.RowStride + i] (zero inside the standards and for calibrations without an extrapolation model).
    /// </summary>
    public required float[][] ModelFormVariance { get; init; }

    /// <summary>
    /// The members' Gaussian moments per level at [k * level.RowStride + i]: mean f, mean df/dC, and the members' variance of f
    /// plus the model-form variance (mag^2). A star whose subset rule asks for more members than the minimum is evaluated on these
    /// (see <see cref="LikelihoodKernel"/>).
    /// </summary>
    public required float[][] MeanValue { get; init; }
    public required float[][] MeanSlope { get; init; }
    public required float[][] SpreadVariance { get; init; }

    /// <summary>Mean of the members' sigma_int^2 (mag^2).</summary>
    public required float SigmaInt2Mean { get; init; }

    /// <summary>Largest model-form variance at node k over the tabulated points (mag^2).</summary>
    public required double[] ModelFormVarianceMax { get; init; }

    /// <summary>Variance of f_m over the members at node k and point j, [k * RowStride + j] (mag^2).</summary>
    public required float[] EnsembleVariance { get; init; }
    public required double[] SlopeMin { get; init; }
    public required double[] SlopeMax { get; init; }
    public required double SigmaInt2Max { get; init; }
    public required double SigmaInt2Min { get; init; }

    public static EnsembleGrid Build(CalibrationModel model, MetallicityOptions options, double gridMin, double gridStep, int gridCount)
    {
        var ens = model.EnsembleCoefficients;
        if (ens.Length == 0) throw new MethodException("the calibration has no bootstrap ensemble; [Fe/H] posteriors need at least one member");
        if (model.EnsembleSigmaInt.Length != ens.Length)
            throw new MethodException($"the calibration has {ens.Length} ensemble members but {model.EnsembleSigmaInt.Length} intrinsic scatters");
        int nb = model.Basis.Count;
        foreach (var c in ens)
            if (c.Length != nb) throw new MethodException($"an ensemble member has {c.Length} coefficients, the basis {nb}");

        var dom = ApplicationDomain.For(model, options);
        int first = Math.Max(0, (int)Math.Ceiling((dom.FehMin - gridMin) / gridStep - 1e-9));
        int last = Math.Min(gridCount - 1, (int)Math.Floor((dom.FehMax - gridMin) / gridStep + 1e-9));
        if (last - first < 1)
            throw new MethodException($"the calibration's [Fe/H] range [{dom.FehMin}, {dom.FehMax}] covers fewer than two points of the grid");
        int nf = last - first + 1;
        int stride = nf + Vector<float>.Count;

        double cmin = dom.ColourMin, cmax = dom.ColourMax;
        double h = ChooseColourStep(model, options.ColourInterpolationTolerance, cmin, cmax, gridMin + first * gridStep, gridMin + last * gridStep);
        // The model-form draws bend each member's colour dependence at the edges of the standards' colours: nodes there keep
        // the interpolation exact at the bend.
        if (ApplicationDomain.Extrapolates(model, options))
        {
            var e = model.Extrapolation!;
            if (e.ColourHi > e.ColourLo) h = (e.ColourHi - e.ColourLo) / Math.Ceiling((e.ColourHi - e.ColourLo) / h - 1e-9);
            cmin = e.ColourLo - Math.Ceiling((e.ColourLo - cmin) / h - 1e-9) * h;
            cmax = e.ColourLo + Math.Ceiling((cmax - e.ColourLo) / h - 1e-9) * h;
        }
        int nc = Math.Max(2, (int)Math.Ceiling((cmax - cmin) / h - 1e-9) + 1);
        h = cmax > cmin ? (cmax - cmin) / (nc - 1) : 1.0;
        int m = ens.Length;

        int levelCount = Math.Max(1, BitOperations.Log2((uint)Math.Max(1, options.MaxEvaluationStride)) + 1);
        var levels = new GridLevel[levelCount];
        for (int l = 0; l < levelCount; l++) levels[l] = new GridLevel(1 << l, nf, nc, m);
        var fehSlope = new float[nc * stride];
        var ensVar = new float[nc * stride];
        var best = new double[nc * stride];
        var bestSlope = new double[nc * stride];
        var envMin = new float[nc * stride];
        var envMax = new float[nc * stride];
        var dir = new sbyte[nc];
        var extra = levels.Select(lv => new float[nc * lv.RowStride]).ToArray();
        var extraMax = new double[nc];
        var meanValue = levels.Select(lv => new float[nc * lv.RowStride]).ToArray();
        var meanSlope = levels.Select(lv => new float[nc * lv.RowStride]).ToArray();
        var spread = levels.Select(lv => new float[nc * lv.RowStride]).ToArray();
        var form = ApplicationDomain.Extrapolates(model, options) ? model.Extrapolation : null;
        var gmin = new double[nc];
        var gmax = new double[nc];

        Parallel.For(0, nc, new ParallelOptions { MaxDegreeOfParallelism = options.MaxDegreeOfParallelism }, k =>
        {
            double c = cmin + k * h;
            var bs = model.Basis.Slice(model.Coefficients, c);
            for (int j = 0; j < nf; j++)
                (best[k * stride + j], bestSlope[k * stride + j]) = bs.At(gridMin + (first + j) * gridStep);
            if (form is not null)
                for (int l = 0; l < levels.Length; l++)
                    for (int i = 0; i < levels[l].Count; i++)
                    {
                        double v = form.ModelFormVariance(bs, c, gridMin + (first + i * levels[l].Stride) * gridStep);
                        extra[l][k * levels[l].RowStride + i] = (float)v;
                        extraMax[k] = Math.Max(extraMax[k], v);
                    }
            var lo = envMin.AsSpan(k * stride, nf);
            var hi = envMax.AsSpan(k * stride, nf);
            lo.Fill(float.PositiveInfinity);
            hi.Fill(float.NegativeInfinity);
            double g0 = double.PositiveInfinity, g1 = double.NegativeInfinity;
            var sum = new double[nf];
            var sum2 = new double[nf];
            for (int mm = 0; mm < m; mm++)
            {
                var s = model.Basis.Slice(ens[mm], c);
                var full = levels[0];
                long row = full.Row(k, mm);
                for (int j = 0; j < nf; j++)
                {
                    var (f, g) = s.At(gridMin + (first + j) * gridStep);
                    full.Value[row + j] = (float)f;
                    full.Slope[row + j] = (float)g;
                    sum[j] += f;
                    sum2[j] += f * f;
                    lo[j] = Math.Min(lo[j], (float)f);
                    hi[j] = Math.Max(hi[j], (float)f);
                    g0 = Math.Min(g0, g);
                    g1 = Math.Max(g1, g);
                    if (j > 0)
                    {
                        float sf = (float)Math.Abs((f - full.Value[row + j - 1]) / gridStep);
                        fehSlope[k * stride + j - 1] = Math.Max(fehSlope[k * stride + j - 1], sf);
                    }
                }
                // Decimated levels (their last point may lie up to stride - 1 steps beyond the table's end).
                for (int l = 1; l < levels.Length; l++)
                {
                    var lv = levels[l];
                    long r = lv.Row(k, mm);
                    for (int i = 0; i < lv.Count; i++)
                    {
                        var (f, g) = s.At(gridMin + (first + i * lv.Stride) * gridStep);
                        lv.Value[r + i] = (float)f;
                        lv.Slope[r + i] = (float)g;
                    }
                }
            }
            // Gaussian moments of the members at every tabulated point of every level.
            for (int l = 0; l < levels.Length; l++)
            {
                var lv = levels[l];
                for (int i = 0; i < lv.Count; i++)
                {
                    double sf = 0, sf2 = 0, sg = 0;
                    for (int mm = 0; mm < m; mm++)
                    {
                        long r = lv.Row(k, mm) + i;
                        double f = lv.Value[r];
                        sf += f; sf2 += f * f; sg += lv.Slope[r];
                    }
                    int at = k * lv.RowStride + i;
                    double mean = sf / m;
                    meanValue[l][at] = (float)mean;
                    meanSlope[l][at] = (float)(sg / m);
                    spread[l][at] = (float)(Math.Max(0, sf2 / m - mean * mean) + extra[l][at]);
                }
            }
            fehSlope[k * stride + nf - 1] = fehSlope[k * stride + nf - 2];
            for (int j = 0; j < nf; j++) ensVar[k * stride + j] = (float)Math.Max(0, sum2[j] / m - (sum[j] / m) * (sum[j] / m));
            gmin[k] = g0;
            gmax[k] = g1;
            dir[k] = Monotonic(lo, hi);
        });

        var sint2 = new float[m];
        double sMax = 0, sMin = double.PositiveInfinity, sMean = 0;
        for (int mm = 0; mm < m; mm++)
        {
            double s = model.EnsembleSigmaInt[mm];
            sint2[mm] = (float)(s * s);
            sMax = Math.Max(sMax, s * s);
            sMin = Math.Min(sMin, s * s);
            sMean += s * s / m;
        }
        return new EnsembleGrid
        {
            Members = m, ColourNodes = nc, ColourMin = cmin, ColourStep = h, FehFirst = first, FehCount = nf, RowStride = stride,
            Levels = levels, MeanValue = meanValue, MeanSlope = meanSlope, SpreadVariance = spread, SigmaInt2Mean = (float)sMean, ModelFormVariance = extra, ModelFormVarianceMax = extraMax, FehSlopeMax = fehSlope, EnsembleVariance = ensVar, SigmaInt2 = sint2, SigmaInt2Min = sMin, BestValue = best, BestSlope = bestSlope,
            EnvelopeMin = envMin, EnvelopeMax = envMax, Direction = dir, SlopeMin = gmin, SlopeMax = gmax, SigmaInt2Max = sMax,
        };
    }

    /// <summary>Node k and weight t of colour c: the model at c is (1 - t) row_k + t row_(k+1).</summary>
    public (int Node, float Weight) Locate(double colour)
    {
        double x = (colour - ColourMin) / ColourStep;
        int k = Math.Clamp((int)Math.Floor(x), 0, ColourNodes - 2);
        return (k, (float)Math.Clamp(x - k, 0.0, 1.0));
    }

    private static sbyte Monotonic(ReadOnlySpan<float> lo, ReadOnlySpan<float> hi)
    {
        bool up = true, down = true;
        for (int j = 1; j < lo.Length; j++)
        {
            if (!(lo[j] > lo[j - 1] && hi[j] > hi[j - 1])) up = false;
            if (!(lo[j] < lo[j - 1] && hi[j] < hi[j - 1])) down = false;
        }
        return up ? (sbyte)1 : down ? (sbyte)-1 : (sbyte)0;
    }

    /// <summary>
    /// h = sqrt(8 tol / max|d2f/dC2|) over the best fit and up to 64 ensemble members on a 101 x 41 probe grid of the domain's
    /// bounding box, clamped to [<see cref="MinColourStep"/>, <see cref="MaxColourStep"/>] mag.
    /// </summary>
    private static double ChooseColourStep(CalibrationModel model, double tol, double cmin, double cmax, double fmin, double fmax)
    {
        double curv = 0;
        int probes = Math.Min(64, model.EnsembleCoefficients.Length);
        for (int p = -1; p < probes; p++)
        {
            var coef = p < 0 ? model.Coefficients : model.EnsembleCoefficients[p * model.EnsembleCoefficients.Length / probes];
            for (int a = 0; a <= 100; a++)
            {
                var s = model.Basis.Slice(coef, cmin + (cmax - cmin) * a / 100.0);
                for (int b = 0; b <= 40; b++) curv = Math.Max(curv, Math.Abs(s.SecondColourDerivative(fmin + (fmax - fmin) * b / 40.0)));
            }
        }
        double h = curv > 0 ? Math.Sqrt(8 * tol / curv) : MaxColourStep;
        return Math.Clamp(h, MinColourStep, MaxColourStep);
    }
}

/// <summary>One table of the ensemble at every <see cref="Stride"/>-th [Fe/H] point: Count points per row, padded rows.</summary>
internal sealed class GridLevel
{
    public GridLevel(int stride, int fullCount, int nodes, int members)
    {
        Stride = stride;
        Count = (fullCount - 1 + stride - 1) / stride + 1;
        RowStride = Count + Vector<float>.Count;
        Members = members;
        Value = new float[(long)nodes * members * RowStride];
        Slope = new float[Value.LongLength];
    }

    public int Stride { get; }
    public int Count { get; }
    public int RowStride { get; }
    public int Members { get; }

    /// <summary>f_m(c_k, F_(i * Stride)) at [Row(k, m) + i].</summary>
    public float[] Value { get; }

    /// <summary>df_m/dC at the same places.</summary>
    public float[] Slope { get; }

    public long Row(int k, int m) => ((long)k * Members + m) * RowStride;
}
