using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Photometallicity.Metallicity;

/// <summary>
/// The ensemble-marginalised likelihood of one star on the [Fe/H] grid:
/// L(F) = (1/M) sum_m N(X0; f_m(C0, F), s_m^2(F)), with
/// s_m^2 = Var(X0) + g_m^2 Var(C0) - 2 g_m Cov(X0, C0) + sigma_int,m^2 and g_m = df_m/dC at (C0, F).
/// Derivation (first order): the true colour is C = C0 - dC with (dX, dC) the measurement errors; X0 = f_m(C, F) + dX + e_int
/// ~ f_m(C0, F) - g_m dC + dX + e_int, so X0 - f_m(C0, F) has variance Var(dX) + g_m^2 Var(dC) - 2 g_m Cov(dX, dC) + sigma_int^2.
/// Only grid points within a window where some member has |X0 - f_m| &lt; W sigma_max are evaluated; outside it every term is
/// below exp(-W^2/2) of its own peak. Inner loop in float with System.Numerics.Vector (float keeps ~1e-7 relative precision:
/// the residual X0 - f is ~1e-7 mag accurate and the likelihood ratio ~1e-6, far below what the percentiles need).
/// One instance per thread (it owns scratch space).
/// </summary>
internal sealed class LikelihoodKernel
{
    private readonly EnsembleGrid _g;
    private readonly float[] _acc;

    public LikelihoodKernel(EnsembleGrid grid)
    {
        _g = grid;
        _acc = new float[grid.RowStride + Vector<float>.Count];
    }

    /// <summary>The accumulated likelihood (up to a constant) at tabulated points a .. b - 1 after <see cref="Evaluate"/>.</summary>
    public ReadOnlySpan<float> Values(int a, int b) => _acc.AsSpan(a, b - a);

    /// <summary>
    /// Finds the window [a, b) inside the star's [j0, j1] (tabulated indices) and accumulates the likelihood there.
    /// Returns false when the window is empty (the index is more than W sigma beyond every member).
    /// </summary>
    public bool Evaluate(int k, float t, double x0, double varX, double varC, double cov, int j0, int j1, double windowSigmas, out int a, out int b)
    {
        var g = _g;
        // Largest s^2 over members and the slope range of nodes k, k+1: the quadratic g^2 varC - 2 g cov is convex in g,
        // so its maximum over an interval sits at an end.
        double gl = Math.Min(g.SlopeMin[k], g.SlopeMin[k + 1]), gh = Math.Max(g.SlopeMax[k], g.SlopeMax[k + 1]);
        double q = Math.Max(gl * gl * varC - 2 * gl * cov, gh * gh * varC - 2 * gh * cov);
        double sMax = Math.Sqrt(Math.Max(varX + q + g.SigmaInt2Max, 1e-30));
        float lowX = (float)(x0 - windowSigmas * sMax), highX = (float)(x0 + windowSigmas * sMax);
        FindWindow(k, t, lowX, highX, j0, j1, out a, out b);
        if (b <= a) return false;
        Accumulate(k, t, (float)x0, (float)varX, (float)varC, (float)cov, a, b);
        return true;
    }

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

    private void Accumulate(int k, float t, float x0, float varX, float varC, float cov, int a, int b)
    {
        var g = _g;
        int w = Vector<float>.Count;
        int n = b - a;
        int nv = (n + w - 1) / w;
        Array.Clear(_acc, a, nv * w);
        ref float acc = ref MemoryMarshal.GetArrayDataReference(_acc);
        ref float val = ref MemoryMarshal.GetArrayDataReference(g.Value);
        ref float slo = ref MemoryMarshal.GetArrayDataReference(g.Slope);
        var vt = new Vector<float>(t);
        var vx = new Vector<float>(x0);
        var vc = new Vector<float>(varC);
        var v2cov = new Vector<float>(2f * cov);
        var half = new Vector<float>(-0.5f);
        var tiny = new Vector<float>(1e-12f);
        long m = g.Members, stride = g.RowStride;
        for (int mm = 0; mm < m; mm++)
        {
            nuint r0 = (nuint)(((k * m) + mm) * stride + a);
            nuint r1 = (nuint)((((k + 1) * m) + mm) * stride + a);
            var va = new Vector<float>(varX + g.SigmaInt2[mm]);
            for (int i = 0; i < nv; i++)
            {
                nuint o = (nuint)(i * w);
                var f0 = Vector.LoadUnsafe(ref val, r0 + o);
                var f1 = Vector.LoadUnsafe(ref val, r1 + o);
                var s0 = Vector.LoadUnsafe(ref slo, r0 + o);
                var s1 = Vector.LoadUnsafe(ref slo, r1 + o);
                var f = f0 + vt * (f1 - f0);
                var gg = s0 + vt * (s1 - s0);
                var s2 = Vector.Max(va + gg * (gg * vc - v2cov), tiny);
                var inv = Vector<float>.One / s2;
                var d = vx - f;
                var like = Vector.Exp(half * d * d * inv) * Vector.SquareRoot(inv);
                ref float dst = ref Unsafe.Add(ref acc, a + i * w);
                Vector.StoreUnsafe(Vector.LoadUnsafe(ref dst) + like, ref dst);
            }
        }
    }
}
