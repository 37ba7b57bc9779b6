using Photometallicity.Calibration;
using Photometallicity.Metallicity;
using Photometallicity.Photometry;

namespace Photometallicity.Forecast;

/// <summary>
/// Expected [Fe/H] precision from a calibration and per-band photometric error models.
/// A red giant of dereddened blue magnitude B, colour C0 and [Fe/H] F has red = B - C0 and narrow = B + X0 + k C0 with
/// X0 = f(C0, F) from the best-fit model; with band errors sb, sr, sn (at the observed, reddened magnitudes) the index and
/// colour covariance is, as in the photometry, Var(C0) = sb^2 + sr^2, Var(X0) = sn^2 + (1 + k)^2 sb^2 + k^2 sr^2,
/// Cov(X0, C0) = -(1 + k) sb^2 - k sr^2 (from X0 = N - (1 + k) B + k R and C0 = B - R with independent band errors).
/// The precision is the posterior half-width computed exactly as in <see cref="MetallicityAssigner"/> for a star on the model.
/// Searches (faintest magnitude, required depth) bisect on that width, which grows monotonically with the band errors.
/// </summary>
public sealed class PrecisionForecaster
{
    private readonly CalibrationModel _model;
    private readonly BandErrorModels _errors;
    private readonly ForecastOptions _options;
    private readonly MetallicityAssigner _assigner;
    private readonly double _k;

    public PrecisionForecaster(CalibrationModel model, BandErrorModels errors, ForecastOptions options)
    {
        options.Validate();
        _model = model;
        _errors = errors;
        _options = options;
        _k = model.Filters.ColourCoefficient;
        _assigner = new MetallicityAssigner(model, options.Metallicity);
    }

    /// <summary>Expected precision at one (blue magnitude, colour, [Fe/H]).</summary>
    public PrecisionPoint Precision(double blueMag, double colour, double feh) => Precision(blueMag, colour, feh, _errors);

    /// <summary>Every combination of the given blue magnitudes, colours and [Fe/H] (magnitude fastest).</summary>
    public IReadOnlyList<PrecisionPoint> PrecisionGrid(IReadOnlyList<double> blueMags, IReadOnlyList<double> colours, IReadOnlyList<double> fehs)
    {
        var list = new List<PrecisionPoint>(blueMags.Count * colours.Count * fehs.Count);
        foreach (double f in fehs)
            foreach (double c in colours)
                foreach (double b in blueMags) list.Add(Precision(b, c, f));
        return list;
    }

    /// <summary>The faintest blue magnitude reaching <paramref name="precisionDex"/> (posterior half-width) at this distance modulus.</summary>
    public LimitingMagnitude FaintestMagnitude(double distanceModulus, double colour, double feh, double precisionDex)
    {
        LimitingMagnitude Make(double m, ForecastStatus s) => new(distanceModulus, colour, feh, precisionDex, m, m - distanceModulus, s);
        if (!_model.Domain.Contains(colour, feh)) return Make(double.NaN, ForecastStatus.OutsideCalibration);
        bool Reaches(double b) => Reached(Precision(b, colour, feh, _errors), precisionDex);
        double lo = _options.BrightestMag, hi = _options.FaintestMag;
        if (!Reaches(lo)) return Make(double.NaN, ForecastStatus.NotReachable);
        if (Reaches(hi)) return Make(hi, ForecastStatus.BeyondSearchRange);
        return Make(Bisect(lo, hi, Reaches), ForecastStatus.Ok);
    }

    /// <summary>
    /// The 5-sigma depth <paramref name="band"/> needs (the other bands as given) for the precision at this blue magnitude.
    /// NotReachable when even an infinitely deep band (its error at the floor) misses it; BeyondSearchRange when the band could
    /// be 5 mag shallower than the star and still reach it.
    /// </summary>
    public DepthRequirement RequiredDepth(ForecastBand band, double blueMag, double colour, double feh, double precisionDex)
    {
        double current = _errors[band].Depth5Sigma;
        DepthRequirement Make(double d, ForecastStatus s) => new(band, blueMag, colour, feh, precisionDex, d, current, s);
        if (!_model.Domain.Contains(colour, feh)) return Make(double.NaN, ForecastStatus.OutsideCalibration);
        double bandMag = BandMags(blueMag, colour, _model.Evaluate(colour, feh))[(int)band];
        bool Reaches(double depth) => Reached(Precision(blueMag, colour, feh, _errors.With(band, _errors[band] with { Depth5Sigma = depth })), precisionDex);
        // 40 mag deeper than the star is infinite depth for every purpose (S/N ~ 10^16).
        double shallow = bandMag - 5, deep = bandMag + 40;
        if (!Reaches(deep)) return Make(double.NaN, ForecastStatus.NotReachable);
        if (Reaches(shallow)) return Make(shallow, ForecastStatus.BeyondSearchRange);
        // Reaches is false at shallow and true at deep: find the shallowest depth that reaches.
        return Make(Bisect(shallow, deep, d => !Reaches(d)), ForecastStatus.Ok);
    }

    /// <summary>Only an Ok posterior counts: a truncated one is narrow because the domain ends, not because the data are good.</summary>
    private static bool Reached(PrecisionPoint p, double precision) => p.Status == MetallicityStatus.Ok && p.SigmaFeh <= precision;

    /// <summary>Largest x in [lo, hi] with ok(x) true, given ok(lo) and not ok(hi), to the magnitude tolerance.</summary>
    private double Bisect(double lo, double hi, Func<double, bool> ok)
    {
        while (hi - lo > _options.MagTolerance)
        {
            double mid = 0.5 * (lo + hi);
            if (ok(mid)) lo = mid; else hi = mid;
        }
        return 0.5 * (lo + hi);
    }

    /// <summary>Dereddened blue, red and narrow magnitudes of a giant on the model.</summary>
    private double[] BandMags(double blue, double colour, double index) => [blue, blue - colour, blue + index + _k * colour];

    private PrecisionPoint Precision(double blueMag, double colour, double feh, BandErrorModels errors)
    {
        var f = _model.Filters;
        double x0 = _model.Evaluate(colour, feh);
        var m = BandMags(blueMag, colour, x0);
        double e = _options.Reddening;
        double sb = errors.Blue.Sigma(m[0] + f.BlueExtinction * e);
        double sr = errors.Red.Sigma(m[1] + f.RedExtinction * e);
        double sn = errors.Narrow.Sigma(m[2] + f.NarrowExtinction * e);
        double k = _k;
        double varC = sb * sb + sr * sr;
        double varX = sn * sn + (1 + k) * (1 + k) * sb * sb + k * k * sr * sr;
        double cov = -(1 + k) * sb * sb - k * sr * sr;

        var (dC, dF) = _model.Basis.Gradient(_model.Coefficients, colour, feh);
        double seff2 = varX + dC * dC * varC - 2 * dC * cov + _model.SigmaInt * _model.SigmaInt;
        double seff = Math.Sqrt(seff2);
        double tau2 = EnsembleVariance(colour, feh);

        var s = _assigner.SolveOne(x0, colour, varX, varC, cov);
        return new PrecisionPoint(blueMag, colour, feh, x0, sb, sr, sn, Math.Sqrt(varX), Math.Sqrt(varC), cov, seff, dF,
            (s.FehHi - s.FehLo) / 2, s.Feh, seff / Math.Abs(dF), Math.Sqrt(seff2 + tau2) / Math.Abs(dF), s.Status);
    }

    private double EnsembleVariance(double colour, double feh)
    {
        var ens = _model.EnsembleCoefficients;
        double sum = 0, sum2 = 0;
        foreach (var c in ens)
        {
            double v = _model.Basis.Value(c, colour, feh);
            sum += v;
            sum2 += v * v;
        }
        double mean = sum / ens.Length;
        return Math.Max(0, sum2 / ens.Length - mean * mean);
    }
}
