namespace Photometallicity.Calibration;

/// <summary>
/// Maximum-likelihood fit of X0 = f(C0, [Fe/H]) = sum_k c_k T_k(C0, [Fe/H]) to standards with errors in every
/// variable and an intrinsic scatter, with iterative outlier clipping. One instance is a reusable workspace
/// (allocation-free refits, for the bootstrap); not thread-safe.
///
/// Likelihood (Hogg, Bovy &amp; Lang 2010, arXiv:1008.4686, sections 7-8; effective variance after Orear 1982,
/// Am. J. Phys. 50, 912):
///   -2 ln L = sum_i m_i [ r_i^2 / V_i + ln V_i ],  r_i = X_i - f(C_i, F_i),
///   V_i = sigma_X^2 + (df/dC)^2 sigma_C^2 - 2 (df/dC) Cov(X, C) + (df/dF)^2 sigma_F^2 + sigma_int^2,
/// with m_i the standard's multiplicity (bootstrap) or 0 (left out). With the gradient terms frozen, the
/// coefficients at fixed sigma_int are the weighted least-squares solution (weights m_i / V_i), so sigma_int is
/// found by maximising the profile likelihood in ln sigma_int (Brent); the gradients are then recomputed from
/// the new coefficients and the two steps repeated until the coefficients settle (iteratively reweighted
/// least squares; at most 8 passes, stopping when no coefficient moves by more than 1e-6 of the largest).
///
/// Outliers: after each fit every candidate standard's normalised residual z_i = r_i / sqrt(V_i) is computed;
/// those with |z_i| &gt; clip are left out of the next fit, those back within the limit return, until the set no
/// longer changes (iterative sigma clipping, common practice).
/// </summary>
internal sealed class EffectiveVarianceFit
{
    private const int MaxGradientIterations = 8;
    private const double LnSigmaMin = -13.815510557964274; // ln 1e-6 mag
    private const double LnSigmaMax = 1.6094379124341003;  // ln 5 mag
    private const double LnSigmaTol = 1e-3;
    private const double WarmBracket = 0.5;

    private readonly FitData _d;
    private readonly int _p;
    private readonly double _clip;
    private readonly double[] _terms, _dTermC, _dTermF; // N x p
    private readonly double[] _outer; // N x p(p+1)/2: lower triangle of T_i T_i^T, and T_i X_i, X_i^2
    private readonly int _stride;
    private readonly bool _gradientFree; // no colour or [Fe/H] errors: V_i does not depend on the gradient
    private readonly double[] _baseVar, _resid, _gradF;
    private readonly bool[] _active, _candidate;
    private readonly double[] _a, _coef, _prev;
    private double[] _w = [];

    public EffectiveVarianceFit(FitData data, PolynomialBasis2D basis, double clipSigma)
    {
        _d = data;
        Basis = basis;
        _p = basis.Count;
        _clip = clipSigma;
        int n = data.N;
        _terms = new double[n * _p];
        _dTermC = new double[n * _p];
        _dTermF = new double[n * _p];
        _stride = _p * (_p + 1) / 2 + _p + 1;
        _gradientFree = true;
        for (int i = 0; i < n; i++)
            if (data.Usable[i] && (data.VarC[i] != 0 || data.VarF[i] != 0 || data.Cov[i] != 0)) { _gradientFree = false; break; }
        _outer = new double[n * _stride];
        for (int i = 0; i < n; i++)
        {
            if (!data.Usable[i]) continue;
            var t = _terms.AsSpan(i * _p, _p);
            basis.Terms(data.C[i], data.F[i], t);
            basis.TermDerivatives(data.C[i], data.F[i], _dTermC.AsSpan(i * _p, _p), _dTermF.AsSpan(i * _p, _p));
            var o = _outer.AsSpan(i * _stride, _stride);
            int k = 0;
            for (int r = 0; r < _p; r++)
                for (int c = 0; c <= r; c++) o[k++] = t[r] * t[c];
            for (int r = 0; r < _p; r++) o[k++] = t[r] * data.X[i];
            o[k] = data.X[i] * data.X[i];
        }
        _baseVar = new double[n];
        _resid = new double[n];
        _gradF = new double[n];
        _active = new bool[n];
        _candidate = new bool[n];
        _a = new double[_p * _p];
        _coef = new double[_p];
        _rhs = new double[_p];
        _prev = new double[_p];
    }

    public PolynomialBasis2D Basis { get; }
    public ReadOnlySpan<double> Coefficients => _coef;
    public double SigmaInt { get; private set; }

    /// <summary>Standards kept by the last fit (candidates not clipped).</summary>
    public ReadOnlySpan<bool> Active => _active;

    /// <summary>Residual X - f of each candidate standard at the last fit (mag).</summary>
    public ReadOnlySpan<double> Residual => _resid;

    /// <summary>V_i - sigma_int^2 of each candidate standard at the last fit (mag^2).</summary>
    public ReadOnlySpan<double> BaseVariance => _baseVar;

    /// <summary>df/d[Fe/H] at each candidate standard at the last fit (mag per dex).</summary>
    public ReadOnlySpan<double> GradientFeh => _gradF;

    /// <summary>Clipping passes of the last fit; <see cref="MaxClipIterations"/> + 1 when the kept set never settled.</summary>
    public int ClipIterations { get; private set; }

    public const int MaxClipIterations = 25;

    /// <summary>
    /// Fits the standards with multiplicity <paramref name="weight"/> (0 = not a candidate). Returns null on
    /// success, or why the fit failed (too few standards left, singular normal equations).
    /// </summary>
    public string? Fit(ReadOnlySpan<double> weight)
    {
        int n = _d.N;
        _w = _w.Length == n ? _w : new double[n];
        for (int i = 0; i < n; i++)
        {
            _w[i] = _d.Usable[i] ? weight[i] : 0.0;
            _active[i] = _w[i] > 0;
        }
        SigmaInt = 0;
        for (int iter = 1; iter <= MaxClipIterations; iter++)
        {
            ClipIterations = iter;
            int kept = 0;
            for (int i = 0; i < n; i++) if (_active[i]) kept++;
            if (kept < _p + 1) return $"{kept} standards left for {_p} coefficients (at least {_p + 1} needed)";
            string? err = FitActiveSet(warm: iter > 1);
            if (err is not null) return err;
            double s2 = SigmaInt * SigmaInt;
            double scale = RobustScale(s2);
            bool changed = false;
            for (int i = 0; i < n; i++)
            {
                if (_w[i] <= 0) continue;
                double z = _resid[i] / Math.Sqrt(_baseVar[i] + s2) / scale;
                bool keep = Math.Abs(z) <= _clip;
                _candidate[i] = keep;
                if (keep != _active[i]) changed = true;
            }
            if (!changed) return null;
            for (int i = 0; i < n; i++) if (_w[i] > 0) _active[i] = _candidate[i];
        }
        ClipIterations = MaxClipIterations + 1; // the set oscillates; the last fit stands (the stage warns)
        return null;
    }

    /// <summary>
    /// The spread of the kept standards' normalised residuals by the median absolute deviation (1.4826 MAD, a
    /// consistent estimator of a Gaussian sigma; Hampel 1974, JASA 69, 383), capped at 1. Bad standards inflate the
    /// fitted intrinsic scatter, which shrinks everyone's normalised residual and hides the outliers; dividing by
    /// this robust spread undoes that, and changes nothing when the residuals are Gaussian (spread near 1).
    /// </summary>
    private double RobustScale(double s2)
    {
        int n = _d.N, k = 0;
        _absZ = _absZ.Length == n ? _absZ : new double[n];
        for (int i = 0; i < n; i++)
            if (_active[i]) _absZ[k++] = Math.Abs(_resid[i] / Math.Sqrt(_baseVar[i] + s2));
        if (k < 10) return 1.0;
        var span = _absZ.AsSpan(0, k);
        span.Sort();
        double med = k % 2 == 1 ? span[k / 2] : 0.5 * (span[k / 2 - 1] + span[k / 2]);
        return Math.Clamp(1.4826 * med, 0.5, 1.0);
    }

    private double[] _absZ = [];

    /// <summary>Normalised residual of candidate i at the last fit.</summary>
    public double Z(int i) => _resid[i] / Math.Sqrt(_baseVar[i] + SigmaInt * SigmaInt);

    /// <summary>Inverse Fisher matrix of the coefficients at the last fit (row-major p x p). False if singular.</summary>
    public bool Covariance(Span<double> cov)
    {
        BuildNormalEquations(SigmaInt * SigmaInt, solve: false);
        if (!SmallCholesky.Factor(_a, _p)) return false;
        SmallCholesky.Inverse(_a, _p, cov);
        return true;
    }

    private string? FitActiveSet(bool warm)
    {
        int n = _d.N, p = _p;
        if (!warm)
        {
            // First pass of a fit: no gradient terms yet. Later clipping passes start from the previous
            // pass's gradients and sigma_int, which are already close.
            for (int i = 0; i < n; i++) _gradF[i] = 0;
            for (int i = 0; i < n; i++) if (_w[i] > 0) _baseVar[i] = _d.VarX[i];
        }
        for (int g = 0; g < MaxGradientIterations; g++)
        {
            double t;
            if (warm || g > 0)
            {
                // Search near the previous ln sigma_int; fall back to the full bracket if the minimum is at its edge.
                double t0 = Math.Log(Math.Max(SigmaInt, Math.Exp(LnSigmaMin)));
                double lo = Math.Max(LnSigmaMin, t0 - WarmBracket), hi = Math.Min(LnSigmaMax, t0 + WarmBracket);
                t = BrentMinimizer.Minimize(static (self, lnS) => self.MinusTwoLnL(Math.Exp(2 * lnS)), this, lo, hi, LnSigmaTol);
                if ((t - lo < 10 * LnSigmaTol && lo > LnSigmaMin) || (hi - t < 10 * LnSigmaTol && hi < LnSigmaMax))
                    t = BrentMinimizer.Minimize(static (self, lnS) => self.MinusTwoLnL(Math.Exp(2 * lnS)), this, LnSigmaMin, LnSigmaMax, LnSigmaTol);
            }
            else
                t = BrentMinimizer.Minimize(static (self, lnS) => self.MinusTwoLnL(Math.Exp(2 * lnS)), this, LnSigmaMin, LnSigmaMax, LnSigmaTol);
            SigmaInt = Math.Exp(t);
            if (!double.IsFinite(MinusTwoLnL(SigmaInt * SigmaInt))) return "the normal equations are singular (too few distinct colours or [Fe/H] values for this degree)";
            // New gradients and effective variances from the new coefficients.
            // Convergence: largest coefficient change relative to the largest coefficient (the basis is scaled
            // to [-1, 1], so coefficients are comparable).
            double maxChange = 0, maxCoef = 1e-300;
            for (int k = 0; k < p; k++)
            {
                maxChange = Math.Max(maxChange, Math.Abs(_coef[k] - _prev[k]));
                maxCoef = Math.Max(maxCoef, Math.Abs(_coef[k]));
                _prev[k] = _coef[k];
            }
            maxChange /= maxCoef;
            for (int i = 0; i < n; i++)
            {
                if (_w[i] <= 0) continue;
                double dc = 0, df = 0;
                int o = i * p;
                for (int k = 0; k < p; k++) { dc += _coef[k] * _dTermC[o + k]; df += _coef[k] * _dTermF[o + k]; }
                _gradF[i] = df;
                _baseVar[i] = _d.VarX[i] + dc * dc * _d.VarC[i] - 2 * dc * _d.Cov[i] + df * df * _d.VarF[i];
            }
            if (((g > 0 || warm) && maxChange < 1e-6) || _gradientFree) break;
        }
        // Residuals of every candidate at the final coefficients.
        for (int i = 0; i < n; i++)
        {
            if (_w[i] <= 0) continue;
            double f = 0;
            int o = i * p;
            for (int k = 0; k < p; k++) f += _coef[k] * _terms[o + k];
            _resid[i] = _d.X[i] - f;
        }
        return null;
    }

    /// <summary>
    /// Solves the weighted normal equations at sigma_int^2 = s2 into _coef and returns -2 ln L (+inf if singular).
    /// The weighted residual sum of squares at the solution is sum w X^2 - c . (T^T W X), which needs no pass over
    /// the residuals.
    /// </summary>
    private double MinusTwoLnL(double s2)
    {
        if (!BuildNormalEquations(s2, solve: true)) return double.PositiveInfinity;
        double rss = _sxx;
        for (int k = 0; k < _p; k++) rss -= _coef[k] * _rhs[k];
        return Math.Max(rss, 0) + _logDet;
    }

    private double _sxx, _logDet;
    private readonly double[] _rhs;

    private bool BuildNormalEquations(double s2, bool solve)
    {
        int n = _d.N, p = _p, tri = p * (p + 1) / 2, stride = _stride;
        Span<double> acc = stackalloc double[stride];
        acc.Clear();
        double logDet = 0;
        for (int i = 0; i < n; i++)
        {
            if (!_active[i]) continue;
            double v = _baseVar[i] + s2;
            double w = _w[i] / v;
            logDet += _w[i] * Math.Log(v);
            var o = new ReadOnlySpan<double>(_outer, i * stride, stride);
            for (int k = 0; k < stride; k++) acc[k] += w * o[k];
        }
        var a = _a.AsSpan();
        int q = 0;
        for (int r = 0; r < p; r++)
            for (int c = 0; c <= r; c++) a[r * p + c] = acc[q++];
        for (int r = 0; r < p; r++) _rhs[r] = acc[tri + r];
        _sxx = acc[tri + p];
        _logDet = logDet;
        if (!solve) return true;
        if (!SmallCholesky.Factor(a, p)) return false;
        _rhs.AsSpan().CopyTo(_coef);
        SmallCholesky.Solve(a, p, _coef);
        return true;
    }
}
