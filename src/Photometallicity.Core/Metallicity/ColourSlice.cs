using Photometallicity.Calibration;

namespace Photometallicity.Metallicity;

/// <summary>
/// The forward model at one fixed colour, reduced to polynomials in v = ([Fe/H] - FehCentre) / FehScale:
/// f(C, v) = sum_j A_j v^j and df/dC(C, v) = sum_j B_j v^j, where A_j = sum_i c_ij u^i and B_j = sum_i i c_ij u^(i-1) / ColourScale
/// (term order of <see cref="PolynomialBasis2D"/>: term (d, j) holds u^(d-j) v^j). Evaluating a whole [Fe/H] grid is then one
/// Horner pass per point, without powers.
/// </summary>
internal readonly struct ColourSlice
{
    private readonly double[] _a;
    private readonly double[] _b;
    private readonly double _fehCentre;
    private readonly double _fehScale;
    private readonly double _colourScale;
    private readonly double[] _c; // second colour derivative coefficients, d2f/dC2 = sum_j C_j v^j

    public ColourSlice(PolynomialBasis2D basis, ReadOnlySpan<double> coefficients, double colour)
    {
        int deg = basis.Degree;
        double u = (colour - basis.ColourCentre) / basis.ColourScale;
        _a = new double[deg + 1];
        _b = new double[deg + 1];
        _c = new double[deg + 1];
        _fehCentre = basis.FehCentre;
        _fehScale = basis.FehScale;
        _colourScale = basis.ColourScale;
        Span<double> up = stackalloc double[deg + 1];
        up[0] = 1;
        for (int p = 1; p <= deg; p++) up[p] = up[p - 1] * u;
        int k = 0;
        for (int d = 0; d <= deg; d++)
            for (int j = 0; j <= d; j++, k++)
            {
                int i = d - j;
                double c = coefficients[k];
                _a[j] += c * up[i];
                if (i >= 1) _b[j] += c * i * up[i - 1];
                if (i >= 2) _c[j] += c * i * (i - 1) * up[i - 2];
            }
        for (int j = 0; j <= deg; j++)
        {
            _b[j] /= _colourScale;
            _c[j] /= _colourScale * _colourScale;
        }
    }

    /// <summary>f and df/dC at this colour and [Fe/H].</summary>
    public (double Value, double DColour) At(double feh)
    {
        double v = (feh - _fehCentre) / _fehScale;
        double f = 0, g = 0;
        for (int j = _a.Length - 1; j >= 0; j--)
        {
            f = f * v + _a[j];
            g = g * v + _b[j];
        }
        return (f, g);
    }

    /// <summary>d2f/dC2 at this colour and [Fe/H].</summary>
    public double SecondColourDerivative(double feh)
    {
        double v = (feh - _fehCentre) / _fehScale;
        double h = 0;
        for (int j = _c.Length - 1; j >= 0; j--) h = h * v + _c[j];
        return h;
    }
}
