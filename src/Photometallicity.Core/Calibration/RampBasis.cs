using System.Globalization;

namespace Photometallicity.Calibration;

/// <summary>
/// What the two monotone forward models share (<see cref="MonotoneBasis"/>, <see cref="SeparableBasis"/>): a colour polynomial of
/// degree <see cref="ColourDegree"/> in u over the standards' colours [ColourLo, ColourHi] (<see cref="ColourPowers"/>), then
/// non-negative weights of the [Fe/H] ramps (<see cref="MonotoneRamps"/>), which the subclass combines with colour its own way.
/// Value and gradient come from the subclass's slice at one colour.
/// </summary>
public abstract class RampBasis : IIndexBasis
{
    protected RampBasis(int colourDegree, double colourLo, double colourHi, MonotoneRamps ramps, int rampTerms)
    {
        if (colourDegree < 1 || colourDegree > 3) throw new ArgumentOutOfRangeException(nameof(colourDegree), colourDegree, "the colour degree must be 1, 2 or 3");
        if (!(colourHi > colourLo)) throw new ArgumentException($"the colour range [{colourLo}, {colourHi}] is empty");
        ColourDegree = colourDegree;
        ColourLo = colourLo;
        ColourHi = colourHi;
        Ramps = ramps;
        Count = colourDegree + 1 + rampTerms;
        NonNegative = new bool[Count];
        for (int k = colourDegree + 1; k < Count; k++) NonNegative[k] = true;
    }

    public int ColourDegree { get; }
    public double ColourLo { get; }
    public double ColourHi { get; }
    public MonotoneRamps Ramps { get; }
    public int Count { get; }
    public bool[]? NonNegative { get; }
    public abstract int Complexity { get; }
    public abstract string Describe { get; }

    protected double Width => ColourHi - ColourLo;

    /// <summary>"N interior [Fe/H] knot(s)", for <see cref="Describe"/>.</summary>
    protected string KnotsText => string.Create(CultureInfo.InvariantCulture, $"{Ramps.Knots.Length} interior [Fe/H] knot{(Ramps.Knots.Length == 1 ? "" : "s")}");

    /// <summary>t, and the colour powers with their first and second u-derivatives (see <see cref="ColourPowers"/>).</summary>
    protected void ColourTerms(double colour, Span<double> pw, Span<double> dpw, Span<double> d2pw, out double t) =>
        ColourPowers.Evaluate(ColourDegree, ColourLo, ColourHi, colour, pw, dpw, d2pw, out t);

    public abstract void Terms(double colour, double feh, Span<double> terms);

    public abstract void TermDerivatives(double colour, double feh, Span<double> dColour, Span<double> dFeh);

    public abstract IndexSlice Slice(ReadOnlySpan<double> coefficients, double colour);

    public double Value(ReadOnlySpan<double> coefficients, double colour, double feh) => Slice(coefficients, colour).At(feh).Value;

    public (double DColour, double DFeh) Gradient(ReadOnlySpan<double> coefficients, double colour, double feh)
    {
        var s = (RampSlice)Slice(coefficients, colour);
        return (s.At(feh).DColour, s.FehSlope(feh));
    }

    public string[] TermNames()
    {
        var names = new List<string>();
        for (int a = 0; a <= ColourDegree; a++) names.Add(a == 0 ? "1" : a == 1 ? "u" : $"u^{a}");
        names.AddRange(RampTermNames());
        return names.ToArray();
    }

    /// <summary>Names of the ramp terms, in order.</summary>
    protected abstract IEnumerable<string> RampTermNames();

    /// <summary>The same colour polynomial and ramps (the structural part of equality).</summary>
    protected bool SameShape(RampBasis o) => ColourDegree == o.ColourDegree && ColourLo == o.ColourLo && ColourHi == o.ColourHi &&
        Ramps.Lo == o.Ramps.Lo && Ramps.Hi == o.Ramps.Hi && Ramps.Knots.SequenceEqual(o.Ramps.Knots);

    protected int ShapeHash() => HashCode.Combine(ColourDegree, ColourLo, ColourHi, Ramps.Lo, Ramps.Hi, Ramps.Knots.Length);
}

/// <summary>A ramp model at one colour; also gives df/d[Fe/H].</summary>
public abstract class RampSlice : IndexSlice
{
    public abstract double FehSlope(double feh);
}
