namespace Photometallicity.Calibration;

/// <summary>
/// The forward model's basis, X0 = f(C0, [Fe/H]) = sum_k c_k T_k(C0, [Fe/H]): the linear form the fitters use, plus the
/// evaluation the later stages use. Two kinds exist: <see cref="PolynomialBasis2D"/> (a full 2-D polynomial, the first form
/// of this program, still read from older calibration files) and <see cref="MonotoneBasis"/> (monotone in [Fe/H] by
/// construction when its constrained coefficients are non-negative).
/// </summary>
public interface IIndexBasis
{
    /// <summary>Number of coefficients.</summary>
    int Count { get; }

    /// <summary>A short description for logs and summaries, e.g. "monotone: colour degree 2, 1 interior [Fe/H] knot".</summary>
    string Describe { get; }

    /// <summary>A small integer that orders models by complexity (the polynomial's degree, or the number of coefficients).</summary>
    int Complexity { get; }

    /// <summary>True for coefficients the fit must keep non-negative (monotonicity in [Fe/H]); null when none is constrained.</summary>
    bool[]? NonNegative { get; }

    /// <summary>Writes the linear terms at (colour, feh) into <paramref name="terms"/> (length <see cref="Count"/>).</summary>
    void Terms(double colour, double feh, Span<double> terms);

    /// <summary>Partial derivatives of each term with respect to C0 and to [Fe/H].</summary>
    void TermDerivatives(double colour, double feh, Span<double> dColour, Span<double> dFeh);

    /// <summary>f(colour, feh) for the given coefficients.</summary>
    double Value(ReadOnlySpan<double> coefficients, double colour, double feh);

    /// <summary>(df/dC0, df/d[Fe/H]) at (colour, feh).</summary>
    (double DColour, double DFeh) Gradient(ReadOnlySpan<double> coefficients, double colour, double feh);

    /// <summary>The model at one colour, for evaluating many [Fe/H] values fast.</summary>
    IndexSlice Slice(ReadOnlySpan<double> coefficients, double colour);

    /// <summary>Human-readable names of the terms, in order.</summary>
    string[] TermNames();
}

/// <summary>The forward model at one fixed colour: f and df/dC against [Fe/H], and d2f/dC2.</summary>
public abstract class IndexSlice
{
    /// <summary>f and df/dC at this colour and [Fe/H].</summary>
    public abstract (double Value, double DColour) At(double feh);

    /// <summary>d2f/dC2 at this colour and [Fe/H].</summary>
    public abstract double SecondColourDerivative(double feh);
}
