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

    /// <summary>f_m(c_k, F_j) at [(k * Members + m) * RowStride + j].</summary>
    public required float[] Value { get; init; }
    public required float[] Slope { get; init; }
    public required float[] SigmaInt2 { get; init; }

    /// <summary>Best-fit model and its colour slope at [k * RowStride + j].</summary>
    public required double[] BestValue { get; init; }
    public required double[] BestSlope { get; init; }
    public required float[] EnvelopeMin { get; init; }
    public required float[] EnvelopeMax { get; init; }

    /// <summary>+1 where the envelopes at node k rise with [Fe/H], -1 where they fall, 0 where they are not monotonic.</summary>
    public required sbyte[] Direction { get; init; }
    public required double[] SlopeMin { get; init; }
    public required double[] SlopeMax { get; init; }
    public required double SigmaInt2Max { get; init; }

    public static EnsembleGrid Build(CalibrationModel model, MetallicityOptions options, double gridMin, double gridStep, int gridCount)
    {
        var ens = model.EnsembleCoefficients;
        if (ens.Length == 0) throw new MethodException("the calibration has no bootstrap ensemble; [Fe/H] posteriors need at least one member");
        if (model.EnsembleSigmaInt.Length != ens.Length)
            throw new MethodException($"the calibration has {ens.Length} ensemble members but {model.EnsembleSigmaInt.Length} intrinsic scatters");
        int nb = model.Basis.Count;
        foreach (var c in ens)
            if (c.Length != nb) throw new MethodException($"an ensemble member has {c.Length} coefficients, the basis {nb}");

        var dom = model.Domain;
        int first = Math.Max(0, (int)Math.Ceiling((dom.FehMin - gridMin) / gridStep - 1e-9));
        int last = Math.Min(gridCount - 1, (int)Math.Floor((dom.FehMax - gridMin) / gridStep + 1e-9));
        if (last - first < 1)
            throw new MethodException($"the calibration's [Fe/H] range [{dom.FehMin}, {dom.FehMax}] covers fewer than two points of the grid");
        int nf = last - first + 1;
        int stride = nf + Vector<float>.Count;

        double cmin = dom.ColourMin, cmax = dom.ColourMax;
        double h = ChooseColourStep(model, options.ColourInterpolationTolerance, cmin, cmax, gridMin + first * gridStep, gridMin + last * gridStep);
        int nc = Math.Max(2, (int)Math.Ceiling((cmax - cmin) / h - 1e-9) + 1);
        h = cmax > cmin ? (cmax - cmin) / (nc - 1) : 1.0;
        int m = ens.Length;

        var value = new float[(long)nc * m * stride];
        var slope = new float[value.LongLength];
        var best = new double[nc * stride];
        var bestSlope = new double[nc * stride];
        var envMin = new float[nc * stride];
        var envMax = new float[nc * stride];
        var dir = new sbyte[nc];
        var gmin = new double[nc];
        var gmax = new double[nc];

        Parallel.For(0, nc, new ParallelOptions { MaxDegreeOfParallelism = options.MaxDegreeOfParallelism }, k =>
        {
            double c = cmin + k * h;
            var bs = new ColourSlice(model.Basis, model.Coefficients, c);
            for (int j = 0; j < nf; j++)
                (best[k * stride + j], bestSlope[k * stride + j]) = bs.At(gridMin + (first + j) * gridStep);
            var lo = envMin.AsSpan(k * stride, nf);
            var hi = envMax.AsSpan(k * stride, nf);
            lo.Fill(float.PositiveInfinity);
            hi.Fill(float.NegativeInfinity);
            double g0 = double.PositiveInfinity, g1 = double.NegativeInfinity;
            for (int mm = 0; mm < m; mm++)
            {
                var s = new ColourSlice(model.Basis, ens[mm], c);
                long row = ((long)k * m + mm) * stride;
                for (int j = 0; j < nf; j++)
                {
                    var (f, g) = s.At(gridMin + (first + j) * gridStep);
                    value[row + j] = (float)f;
                    slope[row + j] = (float)g;
                    lo[j] = Math.Min(lo[j], (float)f);
                    hi[j] = Math.Max(hi[j], (float)f);
                    g0 = Math.Min(g0, g);
                    g1 = Math.Max(g1, g);
                }
            }
            gmin[k] = g0;
            gmax[k] = g1;
            dir[k] = Monotonic(lo, hi);
        });

        var sint2 = new float[m];
        double sMax = 0;
        for (int mm = 0; mm < m; mm++)
        {
            double s = model.EnsembleSigmaInt[mm];
            sint2[mm] = (float)(s * s);
            sMax = Math.Max(sMax, s * s);
        }
        return new EnsembleGrid
        {
            Members = m, ColourNodes = nc, ColourMin = cmin, ColourStep = h, FehFirst = first, FehCount = nf, RowStride = stride,
            Value = value, Slope = slope, SigmaInt2 = sint2, BestValue = best, BestSlope = bestSlope,
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
                var s = new ColourSlice(model.Basis, coef, cmin + (cmax - cmin) * a / 100.0);
                for (int b = 0; b <= 40; b++) curv = Math.Max(curv, Math.Abs(s.SecondColourDerivative(fmin + (fmax - fmin) * b / 40.0)));
            }
        }
        double h = curv > 0 ? Math.Sqrt(8 * tol / curv) : MaxColourStep;
        return Math.Clamp(h, MinColourStep, MaxColourStep);
    }
}
