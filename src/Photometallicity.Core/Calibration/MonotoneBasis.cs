using System.Globalization;

namespace Photometallicity.Calibration;

/// <summary>
/// A forward model monotonic in [Fe/H] by construction:
///   f(C, F) = p(C) + sum_j s_j(C) I_j(F),   s_j(C) = max(0, alpha_j (1 - t) + beta_j t),   t = (C - ColourLo) / (ColourHi - ColourLo),
/// with p a polynomial of degree <see cref="RampBasis.ColourDegree"/> in u = 2t - 1, I_j the quadratic I-splines of
/// <see cref="MonotoneRamps"/> (Ramsay 1988, Statistical Science 3, 425), and alpha_j, beta_j &gt;= 0 (the fit's constraints).
/// At fixed colour the index then never falls as [Fe/H] rises: the Ca II H and K absorption grows with metal abundance at a
/// given temperature, which is common practice to assume for this index (e.g. the calibrations of the Ca II K line strength
/// in Beers et al. 1999, AJ 117, 981, recalled from memory, rise with [Fe/H] at every colour). The sensitivity varies linearly
/// with colour between the standards' bluest and reddest colours; the saturation at low [Fe/H] and any curvature come from
/// the ramps.
/// Outside the standards' colours p continues along its tangent (a project choice: no polynomial growth beyond the data), the
/// sensitivities along their straight lines, never below zero. Outside the ramps' [Fe/H] range the ramps continue along
/// their tangents. The linear <see cref="Terms"/> are exact wherever no sensitivity is clamped at zero, which includes every
/// colour between ColourLo and ColourHi, where the standards are.
/// Term order: p_0 .. p_d (powers of u), alpha_1 .. alpha_J, beta_1 .. beta_J.
/// </summary>
public sealed class MonotoneBasis : RampBasis, IEquatable<MonotoneBasis>
{
    public MonotoneBasis(int colourDegree, double colourLo, double colourHi, MonotoneRamps ramps)
        : base(colourDegree, colourLo, colourHi, ramps, 2 * ramps.Count)
    {
    }

    /// <summary>Two bases are equal when they have the same degree, colour range and ramps (structural equality).</summary>
    public bool Equals(MonotoneBasis? other) => other is not null && SameShape(other);

    public override bool Equals(object? obj) => Equals(obj as MonotoneBasis);

    public override int GetHashCode() => ShapeHash();

    public override int Complexity => Count;

    public override string Describe => string.Create(CultureInfo.InvariantCulture,
        $"monotone in [Fe/H]: colour degree {ColourDegree}, {KnotsText}, {Count} coefficients");

    public override void Terms(double colour, double feh, Span<double> terms)
    {
        int d = ColourDegree, n = Ramps.Count;
        Span<double> pw = stackalloc double[d + 1], dp = stackalloc double[d + 1], d2 = stackalloc double[d + 1];
        Span<double> iv = stackalloc double[n], islope = stackalloc double[n];
        ColourTerms(colour, pw, dp, d2, out double t);
        Ramps.Evaluate(feh, iv, islope);
        for (int a = 0; a <= d; a++) terms[a] = pw[a];
        for (int j = 0; j < n; j++) { terms[d + 1 + j] = (1 - t) * iv[j]; terms[d + 1 + n + j] = t * iv[j]; }
    }

    public override void TermDerivatives(double colour, double feh, Span<double> dColour, Span<double> dFeh)
    {
        int d = ColourDegree, n = Ramps.Count;
        Span<double> pw = stackalloc double[d + 1], dp = stackalloc double[d + 1], d2 = stackalloc double[d + 1];
        Span<double> iv = stackalloc double[n], islope = stackalloc double[n];
        ColourTerms(colour, pw, dp, d2, out double t);
        Ramps.Evaluate(feh, iv, islope);
        double dudc = 2 / Width, dtdc = 1 / Width;
        for (int a = 0; a <= d; a++) { dColour[a] = dp[a] * dudc; dFeh[a] = 0; }
        for (int j = 0; j < n; j++)
        {
            dColour[d + 1 + j] = -dtdc * iv[j]; dFeh[d + 1 + j] = (1 - t) * islope[j];
            dColour[d + 1 + n + j] = dtdc * iv[j]; dFeh[d + 1 + n + j] = t * islope[j];
        }
    }

    public override IndexSlice Slice(ReadOnlySpan<double> coefficients, double colour) => new MonotoneSlice(this, coefficients, colour);

    protected override IEnumerable<string> RampTermNames() =>
        Enumerable.Range(1, Ramps.Count).Select(j => $"(1-t) I{j}").Concat(Enumerable.Range(1, Ramps.Count).Select(j => $"t I{j}"));

    private sealed class MonotoneSlice : RampSlice
    {
        private readonly MonotoneBasis _b;
        private readonly double _p, _dp, _d2p;
        private readonly double[] _s, _ds;

        public MonotoneSlice(MonotoneBasis b, ReadOnlySpan<double> c, double colour)
        {
            _b = b;
            int d = b.ColourDegree, n = b.Ramps.Count;
            Span<double> pw = stackalloc double[d + 1], dp = stackalloc double[d + 1], d2 = stackalloc double[d + 1];
            b.ColourTerms(colour, pw, dp, d2, out double t);
            double dudc = 2 / b.Width, dtdc = 1 / b.Width;
            for (int a = 0; a <= d; a++) { _p += c[a] * pw[a]; _dp += c[a] * dp[a] * dudc; _d2p += c[a] * d2[a] * dudc * dudc; }
            _s = new double[n];
            _ds = new double[n];
            for (int j = 0; j < n; j++)
            {
                double alpha = c[d + 1 + j], beta = c[d + 1 + n + j];
                double s = alpha * (1 - t) + beta * t;
                if (s >= 0) { _s[j] = s; _ds[j] = (beta - alpha) * dtdc; } // at s = 0 inside the colours the linear form holds
            }
        }

        public override (double Value, double DColour) At(double feh)
        {
            int n = _s.Length;
            Span<double> iv = stackalloc double[n], sl = stackalloc double[n];
            _b.Ramps.Evaluate(feh, iv, sl);
            double f = _p, g = _dp;
            for (int j = 0; j < n; j++) { f += _s[j] * iv[j]; g += _ds[j] * iv[j]; }
            return (f, g);
        }

        public override double FehSlope(double feh)
        {
            int n = _s.Length;
            Span<double> iv = stackalloc double[n], sl = stackalloc double[n];
            _b.Ramps.Evaluate(feh, iv, sl);
            double g = 0;
            for (int j = 0; j < n; j++) g += _s[j] * sl[j];
            return g;
        }

        public override double SecondColourDerivative(double feh) => _d2p;
    }
}
