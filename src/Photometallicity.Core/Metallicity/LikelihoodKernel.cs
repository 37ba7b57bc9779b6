using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Photometallicity.Metallicity;

/// <summary>
/// The ensemble-marginalised likelihood of one star on the [Fe/H] grid:
/// L(F) = (1/M) sum_m N(X0; f_m(C0, F), s_m^2(F)), with
/// s_m^2 = Var(X0) + g_m^2 Var(C0) - 2 g_m Cov(X0, C0) + sigma_int,m^2 + V_form(C0, F) and g_m = df_m/dC at (C0, F), V_form the
/// calibration's model-form variance beyond its standards (<see cref="Calibration.Extrapolation.ModelFormVariance"/>, zero inside).
/// Derivation (first order): the true colour is C = C0 - dC with (dX, dC) the measurement errors; X0 = f_m(C, F) + dX + e_int
/// ~ f_m(C0, F) - g_m dC + dX + e_int, so X0 - f_m(C0, F) has variance Var(dX) + g_m^2 Var(dC) - 2 g_m Cov(dX, dC) + sigma_int^2.
/// Only grid points within a window where some member has |X0 - f_m| &lt; W sigma_max are evaluated; outside it every term is
/// below exp(-W^2/2) of its own peak. Inner loop in float with System.Numerics.Vector (float keeps ~1e-7 relative precision:
/// the residual X0 - f is ~1e-7 mag accurate and the likelihood ratio ~1e-6, far below what the percentiles need).
/// Stars are processed in batches, member-outer: one member's rows stay in the fastest cache while every star of the batch
/// reads them (stars of a batch mostly share a colour node, as the assigner sorts them by colour).
/// A star whose ensemble-subset rule asks for more than the minimum subset (its likelihood is narrow against the members' spread,
/// which happens for bright stars and beyond the standards, where the bootstrap members fan out) is evaluated on the members'
/// Gaussian moments instead: at each (C0, F) the mixture (1/M) sum_m N(X0; f_m, s^2) over members whose f_m are normally
/// distributed with mean f-bar and variance tau^2 is exactly N(X0; f-bar, s^2 + tau^2) (the convolution of two Gaussians), so one
/// pass over the mean curve with the spread added to the variance replaces M passes; the members' colour slopes and sigma_int^2
/// enter through their means. Stars that need few members (broad likelihoods) keep the exact mixture over a subset.
/// One instance per thread (it owns scratch space).
/// </summary>
internal sealed class LikelihoodKernel
{
    public const int BatchCapacity = 32;

    private readonly EnsembleGrid _g;
    private readonly double _pointsPerSigma;
    private readonly double _gridStep;
    private readonly StarTask[] _tasks = new StarTask[BatchCapacity];
    private readonly float[][] _acc = new float[BatchCapacity][];
    private readonly float[] _fine;

    private readonly double _subsetTol;
    private readonly int _minSubset;

    public LikelihoodKernel(EnsembleGrid grid, double pointsPerSigma, double gridStep, double subsetTolerance, int minSubset)
    {
        _subsetTol = subsetTolerance;
        _minSubset = minSubset;
        _g = grid;
        _pointsPerSigma = pointsPerSigma;
        _gridStep = gridStep;
        for (int i = 0; i < BatchCapacity; i++) _acc[i] = new float[grid.RowStride + Vector<float>.Count];
        _fine = new float[grid.RowStride + Vector<float>.Count];
    }

    /// <summary>Stars queued for <see cref="AccumulateBatch"/>.</summary>
    public int Queued { get; private set; }

    /// <summary>One queued star: colour node and weight, inputs in float, fine window [A, B), evaluated points [Ia, Ib] of Level.</summary>
    private struct StarTask
    {
        public int K, A, B, Level, Ia, Ib, FirstMember, MemberCount;
        public bool Gaussian;
        public float T, X0, VarX, VarC, Cov;
    }

    /// <summary>
    /// Finds the window [a, b) inside the star's [j0, j1] (tabulated indices) and queues the star. <paramref name="key"/> (the
    /// star's whole-field row) fixes which ensemble members a subset-sampled star uses, so a star gets the same answer in any
    /// subset of the field (a survey tile). Returns false (nothing
    /// queued) when the window is empty: the index is more than W sigma beyond every member.
    /// </summary>
    public bool Queue(long key, int k, float t, double x0, double varX, double varC, double cov, int j0, int j1, double windowSigmas, out int a, out int b)
    {
        var g = _g;
        // Range of s^2 over members and the slope range of nodes k, k+1: q(g) = g^2 varC - 2 g cov is convex in g, so its
        // maximum over an interval sits at an end and its minimum at g* = cov / varC when inside, else at an end.
        double gl = Math.Min(g.SlopeMin[k], g.SlopeMin[k + 1]), gh = Math.Max(g.SlopeMax[k], g.SlopeMax[k + 1]);
        double ql = gl * gl * varC - 2 * gl * cov, qh = gh * gh * varC - 2 * gh * cov;
        double gs = varC > 0 ? Math.Clamp(cov / varC, gl, gh) : gl;
        double qMin = Math.Min(Math.Min(ql, qh), gs * gs * varC - 2 * gs * cov);
        double sMax = Math.Sqrt(Math.Max(varX + Math.Max(ql, qh) + g.SigmaInt2Max + Math.Max(g.ModelFormVarianceMax[k], g.ModelFormVarianceMax[k + 1]), 1e-30));
        float lowX = (float)(x0 - windowSigmas * sMax), highX = (float)(x0 + windowSigmas * sMax);
        FindWindow(k, t, lowX, highX, j0, j1, out a, out b);
        if (b <= a) return false;

        // Evaluation stride: the narrowest member likelihood in [Fe/H] is sigma_min / max|df/dF| over the window.
        float slopeF = 0, tau2 = 0;
        int rs = g.RowStride;
        for (int j = a; j < b; j++)
        {
            slopeF = Math.Max(slopeF, Math.Max(g.FehSlopeMax[k * rs + j], g.FehSlopeMax[(k + 1) * rs + j]));
            tau2 = Math.Max(tau2, Math.Max(g.EnsembleVariance[k * rs + j], g.EnsembleVariance[(k + 1) * rs + j]));
        }
        double s2Min = Math.Max(varX + qMin + g.SigmaInt2Min, 1e-30);
        double sMin = Math.Sqrt(s2Min);
        int members = g.Members;
        if (_subsetTol > 0)
        {
            double need = tau2 / ((s2Min + tau2) * _subsetTol * _subsetTol);
            members = (int)Math.Clamp(Math.Ceiling(need), Math.Min(_minSubset, g.Members), g.Members);
        }
        double perStep = slopeF > 0 ? sMin / slopeF / (_pointsPerSigma * _gridStep) : double.PositiveInfinity;
        int level = 0;
        while (level + 1 < g.Levels.Length && (1 << (level + 1)) <= perStep) level++;
        int stride = g.Levels[level].Stride;
        bool gaussian = _subsetTol > 0 && members > Math.Min(_minSubset, g.Members);
        _tasks[Queued++] = new StarTask
        {
            K = k, T = t, X0 = (float)x0, VarX = (float)varX, VarC = (float)varC, Cov = (float)cov, A = a, B = b, Level = level,
            Ia = a / stride, Ib = (b - 1 + stride - 1) / stride,
            MemberCount = gaussian ? 0 : members, FirstMember = members == g.Members ? 0 : (int)(key * 7919 % g.Members),
            Gaussian = gaussian,
        };
        return true;
    }

    /// <summary>Accumulates every queued star's likelihood, member by member.</summary>
    public void AccumulateBatch()
    {
        for (int q = 0; q < Queued; q++)
        {
            ref var s = ref _tasks[q];
            Array.Clear(_acc[q], s.Ia, VectorSpan(s.Ib + 1 - s.Ia));
            if (s.Gaussian) AccumulateGaussian(ref s, _acc[q]);
        }
        int m = _g.Members;
        for (int mm = 0; mm < m; mm++)
        {
            float sint2 = _g.SigmaInt2[mm];
            for (int q = 0; q < Queued; q++)
            {
                ref var s = ref _tasks[q];
                int rel = mm - s.FirstMember;
                if (rel < 0) rel += m;
                if (rel < s.MemberCount) AccumulateMember(ref s, _acc[q], mm, sint2);
            }
        }
    }

    /// <summary>
    /// The likelihood (up to a constant) of queued star q at fine points A .. B - 1. Where the star was evaluated at a stride,
    /// ln L is interpolated linearly between the evaluated points.
    /// </summary>
    public ReadOnlySpan<float> Result(int q)
    {
        ref var s = ref _tasks[q];
        var acc = _acc[q];
        int stride = _g.Levels[s.Level].Stride;
        if (stride == 1) return acc.AsSpan(s.A, s.B - s.A);
        for (int i = s.Ia; i <= s.Ib; i++) acc[i] = MathF.Log(Math.Max(acc[i], 1e-37f));
        float inv = 1f / stride;
        for (int j = s.A; j < s.B; j++)
        {
            int i = j / stride;
            float w = (j - i * stride) * inv;
            _fine[j] = w == 0 ? MathF.Exp(acc[i]) : MathF.Exp(acc[i] + w * (acc[i + 1] - acc[i]));
        }
        return _fine.AsSpan(s.A, s.B - s.A);
    }

    /// <summary>Empties the queue.</summary>
    public void Clear() => Queued = 0;

    private static int VectorSpan(int n) => (n + Vector<float>.Count - 1) / Vector<float>.Count * Vector<float>.Count;

    private float Env(float[] e, int k, float t, int j)
    {
        int s = _g.RowStride;
        float lo = e[k * s + j];
        return lo + t * (e[(k + 1) * s + j] - lo);
    }

    /// <summary>
    /// Points with envMin - W s &lt;= X0 &lt;= envMax + W s. With rising envelopes, envMax is increasing: the first point with
    /// envMax &gt;= lowX and the last with envMin &lt;= highX bound the window (bisection); falling envelopes mirror it.
    /// Where the envelopes are not monotonic (outside the domain's monotonic part), a linear scan is used instead.
    /// </summary>
    private void FindWindow(int k, float t, float lowX, float highX, int j0, int j1, out int a, out int b)
    {
        var g = _g;
        int dir = g.Direction[k] == g.Direction[k + 1] ? g.Direction[k] : 0;
        if (dir == 0)
        {
            a = int.MaxValue; b = int.MinValue;
            for (int j = j0; j <= j1; j++)
                if (Env(g.EnvelopeMax, k, t, j) >= lowX && Env(g.EnvelopeMin, k, t, j) <= highX) { a = Math.Min(a, j); b = j + 1; }
            if (a == int.MaxValue) { a = 0; b = 0; }
            return;
        }
        if (dir > 0)
        {
            a = FirstTrue(j0, j1, j => Env(g.EnvelopeMax, k, t, j) >= lowX);
            b = FirstTrue(j0, j1, j => Env(g.EnvelopeMin, k, t, j) > highX);
        }
        else
        {
            a = FirstTrue(j0, j1, j => Env(g.EnvelopeMin, k, t, j) <= highX);
            b = FirstTrue(j0, j1, j => Env(g.EnvelopeMax, k, t, j) < lowX);
        }
    }

    /// <summary>Smallest j in [lo, hi] where the monotone predicate holds, or hi + 1 (bisection).</summary>
    private static int FirstTrue(int lo, int hi, Func<int, bool> p)
    {
        int l = lo, r = hi + 1;
        while (l < r)
        {
            int mid = (l + r) >>> 1;
            if (p(mid)) r = mid; else l = mid + 1;
        }
        return l;
    }

    /// <summary>One pass over the members' mean curve with their spread and the model-form variance added (see the class summary).</summary>
    private void AccumulateGaussian(ref StarTask s, float[] accArr)
    {
        var lv = _g.Levels[s.Level];
        nuint r0 = (nuint)(s.K * lv.RowStride + s.Ia), r1 = (nuint)((s.K + 1) * lv.RowStride + s.Ia);
        Accumulate(ref s, accArr, _g.MeanValue[s.Level], _g.MeanSlope[s.Level], r0, r1, _g.SpreadVariance[s.Level], r0, r1, _g.SigmaInt2Mean);
    }

    /// <summary>One ensemble member's rows, with the model-form variance added.</summary>
    private void AccumulateMember(ref StarTask s, float[] accArr, int mm, float sint2)
    {
        var lv = _g.Levels[s.Level];
        nuint e0 = (nuint)(s.K * lv.RowStride + s.Ia), e1 = (nuint)((s.K + 1) * lv.RowStride + s.Ia);
        nuint r0 = (nuint)(lv.Row(s.K, mm) + s.Ia), r1 = (nuint)(lv.Row(s.K + 1, mm) + s.Ia);
        Accumulate(ref s, accArr, lv.Value, lv.Slope, r0, r1, _g.ModelFormVariance[s.Level], e0, e1, sint2);
    }

    /// <summary>
    /// Adds N(X0; f, s^2) at the star's evaluated points to its accumulator, with f, df/dC and the extra variance interpolated
    /// in colour between rows r0 / r1 (values and slopes) and e0 / e1 (extra variance) of the given tables.
    /// </summary>
    private static void Accumulate(ref StarTask s, float[] accArr, float[] values, float[] slopes, nuint r0, nuint r1, float[] extra, nuint e0, nuint e1, float sint2)
    {
        int w = Vector<float>.Count;
        int nv = VectorSpan(s.Ib + 1 - s.Ia) / w;
        ref float acc = ref Unsafe.Add(ref MemoryMarshal.GetArrayDataReference(accArr), s.Ia);
        ref float val = ref MemoryMarshal.GetArrayDataReference(values);
        ref float slo = ref MemoryMarshal.GetArrayDataReference(slopes);
        ref float ext = ref MemoryMarshal.GetArrayDataReference(extra);
        var vt = new Vector<float>(s.T);
        var vx = new Vector<float>(s.X0);
        var vc = new Vector<float>(s.VarC);
        var v2cov = new Vector<float>(2f * s.Cov);
        var va = new Vector<float>(s.VarX + sint2);
        var half = new Vector<float>(-0.5f);
        var tiny = new Vector<float>(1e-12f);
        for (int i = 0; i < nv; i++)
        {
            nuint o = (nuint)(i * w);
            var f0 = Vector.LoadUnsafe(ref val, r0 + o);
            var f1 = Vector.LoadUnsafe(ref val, r1 + o);
            var s0 = Vector.LoadUnsafe(ref slo, r0 + o);
            var s1 = Vector.LoadUnsafe(ref slo, r1 + o);
            var f = f0 + vt * (f1 - f0);
            var gg = s0 + vt * (s1 - s0);
            var x0 = Vector.LoadUnsafe(ref ext, e0 + o);
            var x1 = Vector.LoadUnsafe(ref ext, e1 + o);
            var s2 = Vector.Max(va + x0 + vt * (x1 - x0) + gg * (gg * vc - v2cov), tiny);
            var inv = Vector<float>.One / s2;
            var d = vx - f;
            var like = FastExp.NonPositive(half * d * d * inv) * Vector.SquareRoot(inv);
            ref float dst = ref Unsafe.Add(ref acc, i * w);
            Vector.StoreUnsafe(Vector.LoadUnsafe(ref dst) + like, ref dst);
        }
    }
}
