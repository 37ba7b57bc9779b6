namespace Photometallicity.Calibration;

/// <summary>
/// The forward model's basis: all monomials u^i v^j with i + j &lt;= Degree, where u = (C0 - ColourCentre) / ColourScale
/// and v = ([Fe/H] - FehCentre) / FehScale. Centring and scaling keep the normal equations well conditioned
/// (common practice). Term order: by total degree, then by descending power of u:
/// 1, u, v, u^2, uv, v^2, u^3, u^2 v, ...
/// </summary>
public sealed record PolynomialBasis2D(int Degree, double ColourCentre, double ColourScale, double FehCentre, double FehScale) : IIndexBasis
{
    public int Count => (Degree + 1) * (Degree + 2) / 2;

    public string Describe => $"2-D polynomial of degree {Degree}";
    public int Complexity => Degree;
    public bool[]? NonNegative => null;

    public IndexSlice Slice(ReadOnlySpan<double> coefficients, double colour) => new PolynomialSlice(new Metallicity.ColourSlice(this, coefficients, colour));

    private sealed class PolynomialSlice(Metallicity.ColourSlice s) : IndexSlice
    {
        public override (double Value, double DColour) At(double feh) => s.At(feh);
        public override double SecondColourDerivative(double feh) => s.SecondColourDerivative(feh);
    }

    /// <summary>Writes the basis terms at (colour, feh) into <paramref name="terms"/> (length <see cref="Count"/>).</summary>
    public void Terms(double colour, double feh, Span<double> terms)
    {
        double u = (colour - ColourCentre) / ColourScale;
        double v = (feh - FehCentre) / FehScale;
        Span<double> up = stackalloc double[Degree + 1];
        Span<double> vp = stackalloc double[Degree + 1];
        up[0] = vp[0] = 1.0;
        for (int p = 1; p <= Degree; p++) { up[p] = up[p - 1] * u; vp[p] = vp[p - 1] * v; }
        int k = 0;
        for (int d = 0; d <= Degree; d++)
            for (int j = 0; j <= d; j++)
                terms[k++] = up[d - j] * vp[j];
    }

    /// <summary>f(colour, feh) for the given coefficients.</summary>
    public double Value(ReadOnlySpan<double> coefficients, double colour, double feh)
    {
        Span<double> t = stackalloc double[Count];
        Terms(colour, feh, t);
        double s = 0;
        for (int i = 0; i < t.Length; i++) s += coefficients[i] * t[i];
        return s;
    }

    /// <summary>Partial derivatives (df/dC0, df/d[Fe/H]) at (colour, feh), analytic.</summary>
    public (double DColour, double DFeh) Gradient(ReadOnlySpan<double> coefficients, double colour, double feh)
    {
        double u = (colour - ColourCentre) / ColourScale;
        double v = (feh - FehCentre) / FehScale;
        double du = 0, dv = 0;
        int k = 0;
        for (int d = 0; d <= Degree; d++)
            for (int j = 0; j <= d; j++, k++)
            {
                int i = d - j;
                if (i > 0) du += coefficients[k] * i * Math.Pow(u, i - 1) * Math.Pow(v, j);
                if (j > 0) dv += coefficients[k] * j * Math.Pow(u, i) * Math.Pow(v, j - 1);
            }
        return (du / ColourScale, dv / FehScale);
    }
    /// <summary>
    /// Writes the partial derivatives of each basis term with respect to C0 and to [Fe/H] at (colour, feh),
    /// in the order of <see cref="Terms"/>; dot them with coefficients for the model's gradient.
    /// </summary>
    public void TermDerivatives(double colour, double feh, Span<double> dColour, Span<double> dFeh)
    {
        double u = (colour - ColourCentre) / ColourScale;
        double v = (feh - FehCentre) / FehScale;
        Span<double> up = stackalloc double[Degree + 1];
        Span<double> vp = stackalloc double[Degree + 1];
        up[0] = vp[0] = 1.0;
        for (int p = 1; p <= Degree; p++) { up[p] = up[p - 1] * u; vp[p] = vp[p - 1] * v; }
        double su = 1.0 / ColourScale, sv = 1.0 / FehScale;
        int k = 0;
        for (int d = 0; d <= Degree; d++)
            for (int j = 0; j <= d; j++, k++)
            {
                int i = d - j;
                dColour[k] = i > 0 ? i * up[i - 1] * vp[j] * su : 0.0;
                dFeh[k] = j > 0 ? j * up[i] * vp[j - 1] * sv : 0.0;
            }
    }

    /// <summary>Human-readable names of the terms in order ("1", "u", "v", "u^2", "u v", ...).</summary>
    public string[] TermNames()
    {
        var names = new string[Count];
        int k = 0;
        static string Pow(string x, int e) => e == 0 ? "" : e == 1 ? x : $"{x}^{e}";
        for (int d = 0; d <= Degree; d++)
            for (int j = 0; j <= d; j++)
            {
                string a = Pow("u", d - j), b = Pow("v", j);
                names[k++] = d == 0 ? "1" : string.Join(" ", new[] { a, b }.Where(x => x.Length > 0));
            }
        return names;
    }

    /// <summary>Number of coefficients of a full 2-D polynomial of total degree <paramref name="degree"/>.</summary>
    public static int CountFor(int degree) => (degree + 1) * (degree + 2) / 2;
}
