namespace Photometallicity.Calibration;

/// <summary>
/// How the calibration's uncertainty grows outside the standards' support, the box [ColourLo, ColourHi] x [FehLo, FehHi] of the
/// accepted standards. Bluer or redder than the standards, the index of every ensemble member is moved by
/// KappaColour * d_C * z (d_C the colour distance beyond the box in mag, z a standard normal drawn per member and side); beyond the
/// standards' [Fe/H] the member's change of index from the box edge is scaled by exp(KappaFeh * z), so the model's [Fe/H]
/// sensitivity there is uncertain by a factor e^KappaFeh and the index error grows with the distance (first order:
/// KappaFeh * |df/dF| * d_F). Both factors keep the model monotonic in [Fe/H]. The kappas are measured on the standards
/// themselves, by holding out the bluest, reddest, most metal-poor and most metal-rich of them and fitting the prediction errors
/// across the gap (<see cref="ExtrapolationCalibrator"/>). This is an uncertainty in the model's form, which a bootstrap of one
/// model form does not carry (Efron &amp; Tibshirani 1993, An Introduction to the Bootstrap, ch. 6-7).
/// Draws: Z[m] = (blue, red, metal-poor, metal-rich) of ensemble member m.
/// </summary>
public sealed record Extrapolation(double ColourLo, double ColourHi, double FehLo, double FehHi, double KappaColour, double KappaFeh, double[][] Z)
{
    /// <summary>The colour distance (mag) beyond the support, negative on the blue side.</summary>
    public double ColourDistance(double colour) => colour < ColourLo ? colour - ColourLo : colour > ColourHi ? colour - ColourHi : 0.0;

    public bool InsideColour(double colour) => colour >= ColourLo && colour <= ColourHi;

    public bool InsideFeh(double feh) => feh >= FehLo && feh <= FehHi;

    /// <summary>
    /// The variance (mag^2) the model-form error adds to the index at (colour, feh), to first order: (KappaColour d_C)^2 plus
    /// (KappaFeh (f(F) - f(F_edge)))^2 beyond the [Fe/H] support, with f the best fit at this colour (<paramref name="best"/>).
    /// This is the per-star marginal of the members' draws (exact for the colour term, first order in KappaFeh for the other),
    /// which lets the [Fe/H] assignment add it to each star's variance instead of spreading the members.
    /// </summary>
    public double ModelFormVariance(IndexSlice best, double colour, double feh)
    {
        double d = ColourDistance(colour), v = KappaColour * KappaColour * d * d;
        if (feh > FehHi || feh < FehLo)
        {
            double df = best.At(feh).Value - best.At(feh > FehHi ? FehHi : FehLo).Value;
            v += KappaFeh * KappaFeh * df * df;
        }
        return v;
    }

    /// <summary>Ensemble member <paramref name="member"/>'s model at one colour, with its draw of the model-form error.</summary>
    public IndexSlice Perturb(IIndexBasis basis, ReadOnlySpan<double> coefficients, double colour, int member)
    {
        var s = basis.Slice(coefficients, colour);
        var z = Z[member];
        double d = ColourDistance(colour);
        double offset = d < 0 ? KappaColour * -d * z[0] : KappaColour * d * z[1];
        double dOffset = d < 0 ? -KappaColour * z[0] : d > 0 ? KappaColour * z[1] : 0.0;
        return new Perturbed(s, offset, dOffset, FehLo, FehHi, Math.Exp(KappaFeh * z[2]), Math.Exp(KappaFeh * z[3]));
    }

    private sealed class Perturbed : IndexSlice
    {
        private readonly IndexSlice _s;
        private readonly double _offset, _dOffset, _fLo, _fHi, _kLo, _kHi;
        private readonly (double Value, double DColour) _lo, _hi;

        public Perturbed(IndexSlice s, double offset, double dOffset, double fLo, double fHi, double kLo, double kHi)
        {
            (_s, _offset, _dOffset, _fLo, _fHi, _kLo, _kHi) = (s, offset, dOffset, fLo, fHi, kLo, kHi);
            _lo = s.At(fLo);
            _hi = s.At(fHi);
        }

        public override (double Value, double DColour) At(double feh)
        {
            var (f, g) = _s.At(feh);
            if (feh > _fHi) { f = _hi.Value + (f - _hi.Value) * _kHi; g = _hi.DColour + (g - _hi.DColour) * _kHi; }
            else if (feh < _fLo) { f = _lo.Value + (f - _lo.Value) * _kLo; g = _lo.DColour + (g - _lo.DColour) * _kLo; }
            return (f + _offset, g + _dOffset);
        }

        public override double SecondColourDerivative(double feh) => _s.SecondColourDerivative(feh);
    }
}
