using System.Globalization;

namespace Photometallicity.Calibration;

/// <summary>
/// One candidate form of the monotone forward model: the colour polynomial's degree and the number of interior [Fe/H] knots.
/// <see cref="Build"/> places the basis on a set of standards: colour range = their colour span, ramp range = their [Fe/H]
/// span, interior knots at equally spaced quantiles of their [Fe/H] (common practice for regression splines; e.g. Hastie,
/// Tibshirani &amp; Friedman 2009, The Elements of Statistical Learning, 2nd ed., section 5.2), at least
/// <see cref="MinKnotGap"/> dex from each other and from the ends (a project choice, so that every ramp spans some standards).
/// </summary>
public sealed record MonotoneModelSpec(int ColourDegree, int InteriorKnots) : ModelSpec
{
    public const double MinKnotGap = 0.15;

    public override int Count => ColourDegree + 1 + 2 * (InteriorKnots + 2);

    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"colour degree {ColourDegree}, {InteriorKnots} knot{(InteriorKnots == 1 ? "" : "s")}");

    /// <summary>The basis on the given standards, or null when they cannot carry this many knots.</summary>
    public override IIndexBasis? Build(IReadOnlyList<double> colour, IReadOnlyList<double> feh)
    {
        double cLo = colour.Min(), cHi = colour.Max(), fLo = feh.Min(), fHi = feh.Max();
        if (!(cHi > cLo) || !(fHi > fLo)) return null;
        var sorted = feh.OrderBy(v => v).ToArray();
        var knots = new List<double>();
        for (int k = 1; k <= InteriorKnots; k++)
        {
            double q = Quantile(sorted, (double)k / (InteriorKnots + 1));
            double prev = knots.Count > 0 ? knots[^1] : fLo;
            if (q - prev < MinKnotGap || fHi - q < MinKnotGap) return null;
            knots.Add(q);
        }
        return new MonotoneBasis(ColourDegree, cLo, cHi, new MonotoneRamps(fLo, fHi, knots));
    }

    private static double Quantile(double[] sorted, double q)
    {
        double x = q * (sorted.Length - 1);
        int i = (int)Math.Floor(x);
        return i + 1 < sorted.Length ? sorted[i] + (x - i) * (sorted[i + 1] - sorted[i]) : sorted[i];
    }
}

/// <summary>A candidate form of the forward model; <see cref="Build"/> places its basis on a set of standards.</summary>
public abstract record ModelSpec
{
    public abstract int Count { get; }

    public abstract IIndexBasis? Build(IReadOnlyList<double> colour, IReadOnlyList<double> feh);
}

/// <summary>
/// The full 2-D polynomial of total degree <see cref="Degree"/> (the first form of this program; no monotonicity built in),
/// centred on the standards' mid-range and scaled by their half-range (common practice).
/// </summary>
public sealed record PolynomialModelSpec(int Degree) : ModelSpec
{
    public override int Count => PolynomialBasis2D.CountFor(Degree);

    public override string ToString() => $"polynomial of degree {Degree}";

    public override IIndexBasis? Build(IReadOnlyList<double> colour, IReadOnlyList<double> feh)
    {
        double cmin = colour.Min(), cmax = colour.Max(), fmin = feh.Min(), fmax = feh.Max();
        if (!(cmax > cmin) || !(fmax > fmin)) return null;
        return new PolynomialBasis2D(Degree, 0.5 * (cmin + cmax), 0.5 * (cmax - cmin), 0.5 * (fmin + fmax), 0.5 * (fmax - fmin));
    }
}

/// <summary>
/// The separable monotone model (<see cref="SeparableBasis"/>): colour degree and interior knots as <see cref="MonotoneModelSpec"/>,
/// plus the amplitude's colour slope Gamma, found by profile likelihood (<see cref="Profile"/>). It counts Gamma among its parameters.
/// </summary>
public sealed record SeparableModelSpec(int ColourDegree, int InteriorKnots) : ModelSpec
{
    public override int Count => ColourDegree + 1 + InteriorKnots + 2 + 1;

    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"separable, colour degree {ColourDegree}, {InteriorKnots} knot{(InteriorKnots == 1 ? "" : "s")}");

    public override IIndexBasis? Build(IReadOnlyList<double> colour, IReadOnlyList<double> feh) =>
        new MonotoneModelSpec(ColourDegree, InteriorKnots).Build(colour, feh) is MonotoneBasis m ? new SeparableBasis(ColourDegree, m.ColourLo, m.ColourHi, m.Ramps, 0.0) : null;

    /// <summary>Bounds of ln(1 + Gamma), the log of the amplitude ratio between the reddest and bluest standards (project choice: a factor 20 either way).</summary>
    public const double LnRatioMax = 3.0;

    /// <summary>
    /// A weak Gaussian prior on ln(1 + Gamma), sd 0.5 (a project choice): the index's sensitivity may change by a factor of
    /// about e^0.5 = 1.6 across the standards' colours without cost, more only when the standards demand it. Bright standards'
    /// colours and [Fe/H] are correlated along the giant branch, so without it the fit can explain the index's saturation at
    /// low [Fe/H] by colour instead (measured on an invented field: an amplitude ratio of 4.4 against a true 1.56, and the
    /// fainter, bluer members biased by +0.24 dex).
    /// </summary>
    public const double LnRatioPriorSigma = 0.5;

    /// <summary>
    /// The basis at the Gamma that maximises the mixture likelihood of the standards with multiplicity <paramref name="weight"/>
    /// times the prior on ln(1 + Gamma) (<see cref="LnRatioPriorSigma"/>) (Brent on ln(1 + Gamma) in [-3, 3], tolerance 0.005;
    /// each evaluation a full mixture fit at that Gamma).
    /// </summary>
    internal static SeparableBasis Profile(FitData d, ReadOnlySpan<double> weight, bool outliers, SeparableBasis start)
    {
        var w = weight.ToArray();
        double Objective(double lnRatio)
        {
            var fit = new MixtureFit(d, start.WithGamma(Math.Exp(lnRatio) - 1), outliers);
            double prior = 0.5 * (lnRatio / LnRatioPriorSigma) * (lnRatio / LnRatioPriorSigma);
            return fit.Fit(w) is null ? -fit.MixtureLogLikelihood + prior : double.PositiveInfinity;
        }
        double best = BrentMinimizer.Minimize(static (f, x) => f(x), (Func<double, double>)Objective, -LnRatioMax, LnRatioMax, 0.005);
        return start.WithGamma(Math.Exp(best) - 1);
    }
}
