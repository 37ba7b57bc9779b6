namespace Photometallicity.Calibration;

/// <summary>
/// How the calibration's uncertainty grows outside the standards' support, the convex hull of the accepted standards in
/// (C0, [Fe/H]) (<see cref="Support"/>; the box [ColourLo, ColourHi] x [FehLo, FehHi] is its bounding box). The standards' colours
/// and [Fe/H] are correlated along the giant branch, so a star can lie inside the box yet far from any standard; the hull sees
/// that. Bluer or redder than the hull at the star's [Fe/H], the index of every ensemble member is moved by KappaColour * d_C * z
/// (d_C the colour distance beyond the hull in mag, z a standard normal drawn per member and side); beyond the hull's [Fe/H] at
/// the star's colour, the member's change of index from the hull's edge is scaled by exp(KappaFeh * z), so the model's [Fe/H]
/// sensitivity there is uncertain by a factor e^KappaFeh and the index error grows with the distance (first order:
/// KappaFeh * |df/dF| * d_F). The [Fe/H] factor keeps the model monotonic in [Fe/H]. The kappas are measured on the standards
/// themselves, by holding out the bluest, reddest, most metal-poor and most metal-rich of them and fitting the prediction errors
/// across the gap (<see cref="ExtrapolationCalibrator"/>). This is an uncertainty in the model's form, which a bootstrap of one
/// model form does not carry (Efron &amp; Tibshirani 1993, An Introduction to the Bootstrap, ch. 6-7).
/// Draws: Z[m] = (blue, red, metal-poor, metal-rich) of ensemble member m.
/// </summary>
public sealed record Extrapolation(ValidityDomain Support, double KappaColour, double KappaFeh, double[][] Z)
{
    /// <summary>Quadratic term of the colour error: beyond the hull the index is uncertain by KappaColour d + KappaColour2 d^2 (mag).</summary>
    public double KappaColour2 { get; init; }

    /// <summary>The colour route's index error (mag) at colour distance d (mag).</summary>
    public double ColourError(double d) => KappaColour * Math.Abs(d) + KappaColour2 * d * d;

    public double ColourLo => Support.ColourMin;
    public double ColourHi => Support.ColourMax;
    public double FehLo => Support.FehMin;
    public double FehHi => Support.FehMax;

    /// <summary>The colour distance (mag) beyond the hull at this [Fe/H] (clamped to the hull's [Fe/H] span), negative on the blue side.</summary>
    public double ColourDistance(double colour, double feh)
    {
        var r = Support.ColourRangeAt(Math.Clamp(feh, FehLo, FehHi)) ?? (ColourLo, ColourHi);
        return colour < r.ColourLo ? colour - r.ColourLo : colour > r.ColourHi ? colour - r.ColourHi : 0.0;
    }

    /// <summary>The hull's [Fe/H] interval at this colour (clamped to the hull's colour span).</summary>
    public (double Lo, double Hi) FehEdges(double colour)
    {
        var r = Support.FehRangeAt(Math.Clamp(colour, ColourLo, ColourHi)) ?? (FehLo, FehHi);
        return (r.FehLo, r.FehHi);
    }

    /// <summary>True when (colour, feh) lies inside the standards' hull.</summary>
    public bool Inside(double colour, double feh) => Support.Contains(colour, feh);

    /// <summary>
    /// The variance (mag^2) the model-form error adds to the index at (colour, feh), to first order: the smaller of
    /// (KappaColour d_C)^2 (the way into the hull along the colour) and (KappaFeh (f(F) - f(F_edge)))^2 (along [Fe/H]), with f the
    /// best fit at this colour (<paramref name="best"/>): the star is as far from the standards as its nearest way in.
    /// This is the per-star marginal of the members' draws (exact for the colour term, first order in KappaFeh for the other),
    /// which lets the [Fe/H] assignment add it to each star's variance instead of spreading the members.
    /// </summary>
    public double ModelFormVariance(IndexSlice best, double colour, double feh)
    {
        double d = ColourDistance(colour, feh), ec = ColourError(d), vc = ec * ec;
        if (colour < ColourLo || colour > ColourHi) return vc; // beyond every standard's colour: only the colour route exists
        var (lo, hi) = FehEdges(colour);
        double vf = 0;
        if (feh > hi || feh < lo)
        {
            double df = best.At(feh).Value - best.At(feh > hi ? hi : lo).Value;
            vf = KappaFeh * KappaFeh * df * df;
        }
        return Math.Min(vc, vf);
    }

    /// <summary>Ensemble member <paramref name="member"/>'s model at one colour, with its draw of the model-form error.</summary>
    public IndexSlice Perturb(IIndexBasis basis, ReadOnlySpan<double> coefficients, double colour, int member)
    {
        var s = basis.Slice(coefficients, colour);
        var z = Z[member];
        // The colour offset is taken at the hull's colour span for this colour's [Fe/H] edges (the draw's colour part does not
        // vary with [Fe/H], so the member stays monotonic in [Fe/H]).
        double d = colour < ColourLo ? colour - ColourLo : colour > ColourHi ? colour - ColourHi : 0.0;
        double offset = ColourError(d) * (d < 0 ? z[0] : z[1]);
        double dOffset = d < 0 ? -(KappaColour + 2 * KappaColour2 * -d) * z[0] : d > 0 ? (KappaColour + 2 * KappaColour2 * d) * z[1] : 0.0;
        var (lo, hi) = FehEdges(colour);
        return new Perturbed(s, offset, dOffset, lo, hi, Math.Exp(KappaFeh * z[2]), Math.Exp(KappaFeh * z[3]));
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
