using System.Globalization;

namespace Photometallicity.Calibration;

/// <summary>
/// A separable forward model, monotonic in [Fe/H] by construction:
///   f(C, F) = p(C) + a(t) sum_j w_j I_j(F),   w_j &gt;= 0,   a(t) = 1 + Gamma t,   t = (C - ColourLo) / (ColourHi - ColourLo),
/// with p a polynomial of degree <see cref="RampBasis.ColourDegree"/> in u = 2t - 1 (tangent continuation outside the standards' colours)
/// and I_j the quadratic I-splines of <see cref="MonotoneRamps"/> (Ramsay 1988, Statistical Science 3, 425). The shape of the
/// index against [Fe/H] is the same at every colour and only its amplitude a changes with colour (linearly between the
/// standards' bluest and reddest colours, 1 at the bluest). Because the standards' colours and [Fe/H] are correlated along the
/// giant branch, a model whose shape may change with colour (<see cref="MonotoneBasis"/>) can trade shape against colour where
/// no standard constrains it and extrapolate badly to the fainter, bluer giants; a shared shape cannot. Outside the standards'
/// colours the amplitude continues exponentially from its value and slope at the edge (a(t) stays positive, so the model stays
/// monotonic; a project choice). Gamma &gt; -1 is found by profile likelihood (<see cref="SeparableModelSpec"/>); for a fixed
/// Gamma the model is linear in its coefficients. Term order: p_0 .. p_d, w_1 .. w_J.
/// </summary>
public sealed class SeparableBasis : RampBasis, IEquatable<SeparableBasis>
{
    public SeparableBasis(int colourDegree, double colourLo, double colourHi, MonotoneRamps ramps, double gamma)
        : base(colourDegree, colourLo, colourHi, ramps, ramps.Count)
    {
        if (!(gamma > -1)) throw new ArgumentOutOfRangeException(nameof(gamma), gamma, "the amplitude ratio 1 + gamma must be positive");
        Gamma = gamma;
    }

    public double Gamma { get; }
    public override int Complexity => Count + 1;

    public override string Describe => string.Create(CultureInfo.InvariantCulture,
        $"separable, monotone in [Fe/H]: colour degree {ColourDegree}, {KnotsText}, amplitude ratio red/blue {1 + Gamma:F3}, {Count + 1} parameters");

    public SeparableBasis WithGamma(double gamma) => new(ColourDegree, ColourLo, ColourHi, Ramps, gamma);

    public bool Equals(SeparableBasis? o) => o is not null && Gamma == o.Gamma && SameShape(o);

    public override bool Equals(object? obj) => Equals(obj as SeparableBasis);

    public override int GetHashCode() => HashCode.Combine(ShapeHash(), Gamma);

    /// <summary>The amplitude a(t) and its t-derivative.</summary>
    private (double A, double DA) Amplitude(double t)
    {
        if (t < 0) { double a0 = 1, k = Gamma / a0; return (a0 * Math.Exp(k * t), Gamma * Math.Exp(k * t)); }
        if (t > 1) { double a1 = 1 + Gamma, k = Gamma / a1, e = Math.Exp(k * (t - 1)); return (a1 * e, Gamma * e); }
        return (1 + Gamma * t, Gamma);
    }

    public override void Terms(double colour, double feh, Span<double> terms)
    {
        int d = ColourDegree, n = Ramps.Count;
        Span<double> pw = stackalloc double[d + 1], dp = stackalloc double[d + 1], d2 = stackalloc double[d + 1];
        Span<double> iv = stackalloc double[n], sl = stackalloc double[n];
        ColourTerms(colour, pw, dp, d2, out double t);
        Ramps.Evaluate(feh, iv, sl);
        var (amp, _) = Amplitude(t);
        for (int a = 0; a <= d; a++) terms[a] = pw[a];
        for (int j = 0; j < n; j++) terms[d + 1 + j] = amp * iv[j];
    }

    public override void TermDerivatives(double colour, double feh, Span<double> dColour, Span<double> dFeh)
    {
        int d = ColourDegree, n = Ramps.Count;
        Span<double> pw = stackalloc double[d + 1], dp = stackalloc double[d + 1], d2 = stackalloc double[d + 1];
        Span<double> iv = stackalloc double[n], sl = stackalloc double[n];
        ColourTerms(colour, pw, dp, d2, out double t);
        Ramps.Evaluate(feh, iv, sl);
        var (amp, damp) = Amplitude(t);
        double dudc = 2 / Width, dtdc = 1 / Width;
        for (int a = 0; a <= d; a++) { dColour[a] = dp[a] * dudc; dFeh[a] = 0; }
        for (int j = 0; j < n; j++) { dColour[d + 1 + j] = damp * dtdc * iv[j]; dFeh[d + 1 + j] = amp * sl[j]; }
    }

    public override IndexSlice Slice(ReadOnlySpan<double> coefficients, double colour) => new SeparableSlice(this, coefficients, colour);

    protected override IEnumerable<string> RampTermNames() => Enumerable.Range(1, Ramps.Count).Select(j => $"a(t) I{j}");

    private sealed class SeparableSlice : RampSlice
    {
        private readonly SeparableBasis _b;
        private readonly double _p, _dp, _d2p, _amp, _damp, _d2amp;
        private readonly double[] _w;

        public SeparableSlice(SeparableBasis b, ReadOnlySpan<double> c, double colour)
        {
            _b = b;
            int d = b.ColourDegree, n = b.Ramps.Count;
            Span<double> pw = stackalloc double[d + 1], dp = stackalloc double[d + 1], d2 = stackalloc double[d + 1];
            b.ColourTerms(colour, pw, dp, d2, out double t);
            double dudc = 2 / b.Width, dtdc = 1 / b.Width;
            for (int a = 0; a <= d; a++) { _p += c[a] * pw[a]; _dp += c[a] * dp[a] * dudc; _d2p += c[a] * d2[a] * dudc * dudc; }
            var (amp, damp) = b.Amplitude(t);
            _amp = amp;
            _damp = damp * dtdc;
            // Inside the colours a is linear (a'' = 0); in the exponential continuation a'' = a'^2 / a.
            _d2amp = t is < 0 or > 1 ? damp * damp / amp * dtdc * dtdc : 0;
            _w = new double[n];
            for (int j = 0; j < n; j++) _w[j] = c[d + 1 + j];
        }

        private double Shape(double feh, out double slope)
        {
            int n = _w.Length;
            Span<double> iv = stackalloc double[n], sl = stackalloc double[n];
            _b.Ramps.Evaluate(feh, iv, sl);
            double g = 0;
            slope = 0;
            for (int j = 0; j < n; j++) { g += _w[j] * iv[j]; slope += _w[j] * sl[j]; }
            return g;
        }

        public override (double Value, double DColour) At(double feh)
        {
            double g = Shape(feh, out _);
            return (_p + _amp * g, _dp + _damp * g);
        }

        public override double FehSlope(double feh)
        {
            Shape(feh, out double s);
            return _amp * s;
        }

        public override double SecondColourDerivative(double feh) => _d2p + _d2amp * Shape(feh, out _);
    }
}
