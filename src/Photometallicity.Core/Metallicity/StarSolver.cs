namespace Photometallicity.Metallicity;

/// <summary>What <see cref="StarSolver"/> found for one star.</summary>
internal readonly record struct StarSummary(MetallicityStatus Status, double Feh, double FehLo, double FehHi, double Limit, FehLimitSide Side)
{
    public static StarSummary Without(MetallicityStatus s) => new(s, double.NaN, double.NaN, double.NaN, double.NaN, FehLimitSide.None);
}

/// <summary>
/// One star from photometry to status, percentiles and stored likelihood. Edge tests use the best-fit model at the star's first
/// and last grid points inside the domain: z = (X0 - f_edge) / sigma_eff,edge beyond the edge where the model is largest (or
/// smallest). z &gt; <see cref="MetallicityOptions.LimitSigmas"/> gives a limit; Phi(z) &gt; TruncationFraction (the share of
/// the likelihood, in the index, that the domain cuts off) gives PosteriorTruncated. Percentiles: the posterior on the grid is
/// integrated by the trapezoid rule and the CDF interpolated linearly. One instance per thread.
/// </summary>
internal sealed class StarSolver
{
    private readonly EnsembleGrid _g;
    private readonly LikelihoodKernel _kernel;
    private readonly MetallicityOptions _o;
    private readonly Calibration.ValidityDomain _domain;
    private readonly Calibration.Extrapolation? _extrapolation;
    private readonly double _gridMin, _gridStep, _sint2Best, _truncZ;
    private readonly double[] _prior;
    private readonly double[] _post;

    public StarSolver(EnsembleGrid grid, Calibration.CalibrationModel model, MetallicityOptions o, double[] prior, double truncZ)
    {
        _g = grid;
        _kernel = new LikelihoodKernel(grid, o.PointsPerSigma, o.GridStep, o.EnsembleSubsetTolerance, o.MinEnsembleSubset);
        _o = o;
        _domain = ApplicationDomain.For(model, o);
        _extrapolation = ApplicationDomain.Extrapolates(model, o) ? model.Extrapolation : null;
        _gridMin = o.GridMin;
        _gridStep = o.GridStep;
        _sint2Best = model.SigmaInt * model.SigmaInt;
        _prior = prior;
        _truncZ = truncZ;
        _post = new double[grid.RowStride];
    }

    /// <summary>[Fe/H] of tabulated point j.</summary>
    private double FehAt(double j) => _gridMin + (_g.FehFirst + j) * _gridStep;

    /// <summary>A star between <see cref="TryBegin"/> and <see cref="Finish"/>.</summary>
    internal struct Pending
    {
        public int Star, Queue, J0, J1, A, B;
        public bool Rising;
        public double ZAbove, ZBelow, Colour;
    }

    /// <summary>Queued stars (at most <see cref="LikelihoodKernel.BatchCapacity"/>) waiting for <see cref="FinishBatch"/>.</summary>
    public int PendingCount => _pendingCount;

    private readonly Pending[] _pending = new Pending[LikelihoodKernel.BatchCapacity];
    private int _pendingCount;

    /// <summary>
    /// Checks the star and queues it for the batch kernel; returns false with the final summary when the star needs no
    /// likelihood (bad photometry, colour outside the domain or in an excluded interval).
    /// </summary>
    public bool TryBegin(int star, long key, double x0, double c0, double vx, double vc, double cov, out StarSummary early)
    {
        early = default;
        if (!(double.IsFinite(x0) && double.IsFinite(c0) && double.IsFinite(cov) && vx >= 0 && vc >= 0 && double.IsFinite(vx) && double.IsFinite(vc)))
        { early = StarSummary.Without(MetallicityStatus.BadPhotometry); return false; }
        if (_domain.IsNonMonotonic(c0)) { early = StarSummary.Without(MetallicityStatus.NonMonotonic); return false; }
        if (_domain.FehRangeAt(c0) is not { } range) { early = StarSummary.Without(MetallicityStatus.ColourOutsideCalibration); return false; }
        int first = _g.FehFirst;
        int j0 = Math.Max(0, (int)Math.Ceiling((range.FehLo - _gridMin) / _gridStep - 1e-9) - first);
        int j1 = Math.Min(_g.FehCount - 1, (int)Math.Floor((range.FehHi - _gridMin) / _gridStep + 1e-9) - first);
        if (j1 - j0 < 1) { early = StarSummary.Without(MetallicityStatus.ColourOutsideCalibration); return false; }

        var (k, t) = _g.Locate(c0);
        var (fLo, sLo) = BestAt(k, t, j0, vx, vc, cov);
        var (fHi, sHi) = BestAt(k, t, j1, vx, vc, cov);
        bool rising = fHi >= fLo;
        ref var p = ref _pending[_pendingCount++];
        p.Star = star;
        p.J0 = j0;
        p.J1 = j1;
        p.Rising = rising;
        p.Colour = c0;
        p.ZAbove = rising ? (x0 - fHi) / sHi : (x0 - fLo) / sLo;
        p.ZBelow = rising ? (fLo - x0) / sLo : (fHi - x0) / sHi;
        int q = _kernel.Queued;
        p.Queue = _kernel.Queue(key, k, t, x0, vx, vc, cov, j0, j1, _o.WindowSigmas, out p.A, out p.B) ? q : -1;
        return true;
    }

    /// <summary>Runs the kernel on the queued stars and hands each summary to <paramref name="done"/> in queue order.</summary>
    public void FinishBatch(LikelihoodBuffer? store, Action<int, StarSummary, StoredWindow> done)
    {
        _kernel.AccumulateBatch();
        for (int i = 0; i < _pendingCount; i++)
        {
            var s = Finish(in _pending[i], store, out var stored);
            done(_pending[i].Star, s, stored);
        }
        _kernel.Clear();
        _pendingCount = 0;
    }

    /// <summary>One star alone, without storing its likelihood.</summary>
    public StarSummary Solve(double x0, double c0, double vx, double vc, double cov)
    {
        if (!TryBegin(0, 0, x0, c0, vx, vc, cov, out var early)) return early;
        StarSummary r = default;
        FinishBatch(null, (_, s, _) => r = s);
        return r;
    }

    private StarSummary Finish(in Pending p, LikelihoodBuffer? store, out StoredWindow stored)
    {
        stored = default;
        int a = p.A, b = p.B;
        double total = 0;
        ReadOnlySpan<float> like = default;
        if (p.Queue >= 0)
        {
            like = _kernel.Result(p.Queue);
            for (int j = 0; j < like.Length; j++) total += _post[j] = like[j] * _prior[a + j];
        }
        double zAbove = p.ZAbove, zBelow = p.ZBelow;
        bool limit = Math.Max(zAbove, zBelow) > _o.LimitSigmas;
        if (limit || !(total > 0))
        {
            bool above = zAbove >= zBelow;
            bool highEdge = above == p.Rising; // the edge the index points beyond is the high-[Fe/H] one
            var side = highEdge ? FehLimitSide.Lower : FehLimitSide.Upper;
            double lim = total > 0 ? Percentile(a, b - a, highEdge ? 0.16 : 0.84) : FehAt(highEdge ? p.J1 : p.J0);
            var status = above ? MetallicityStatus.IndexAboveRange : MetallicityStatus.IndexBelowRange;
            // A limit star still keeps its likelihood inside the domain (rising to the edge it points beyond), so
            // that the metallicity-distribution fit is not biased by dropping the stars nearest an edge.
            if (store is not null && total > 0) stored = Store(a, like, store);
            return new StarSummary(status, double.NaN, highEdge ? lim : double.NaN, highEdge ? double.NaN : lim, lim, side);
        }
        double med = Percentile(a, b - a, 0.5);
        double p16 = Percentile(a, b - a, 0.16);
        double p84 = Percentile(a, b - a, 0.84);
        var st = Math.Max(zAbove, zBelow) > _truncZ ? MetallicityStatus.PosteriorTruncated
            : _extrapolation is { } e && !e.Inside(p.Colour, med) ? MetallicityStatus.Extrapolated
            : MetallicityStatus.Ok;
        if (store is not null) stored = Store(a, like, store);
        return new StarSummary(st, med, p16, p84, double.NaN, FehLimitSide.None);
    }

    private (double F, double Sigma) BestAt(int k, float t, int j, double vx, double vc, double cov)
    {
        int s = _g.RowStride;
        double f = _g.BestValue[k * s + j] + t * (_g.BestValue[(k + 1) * s + j] - _g.BestValue[k * s + j]);
        double g = _g.BestSlope[k * s + j] + t * (_g.BestSlope[(k + 1) * s + j] - _g.BestSlope[k * s + j]);
        var ext = _g.ModelFormVariance[0];
        double e = ext[k * s + j] + t * (ext[(k + 1) * s + j] - ext[k * s + j]);
        return (f, Math.Sqrt(Math.Max(vx + g * g * vc - 2 * g * cov + _sint2Best + e, 1e-30)));
    }

    /// <summary>The q-quantile of the posterior held in _post[0 .. n-1] (tabulated points a ..), trapezoid CDF, linear interpolation.</summary>
    private double Percentile(int a, int n, double q)
    {
        if (n == 1) return FehAt(a);
        double cdfTotal = 0;
        for (int j = 1; j < n; j++) cdfTotal += 0.5 * (_post[j - 1] + _post[j]);
        double target = q * cdfTotal, cum = 0;
        for (int j = 1; j < n; j++)
        {
            double step = 0.5 * (_post[j - 1] + _post[j]);
            if (cum + step >= target && step > 0) return FehAt(a + j - 1 + (target - cum) / step);
            cum += step;
        }
        return FehAt(a + n - 1);
    }

    /// <summary>Stored samples per standard deviation of a star's likelihood (see <see cref="FehLikelihoods"/>).</summary>
    internal const double StoredPointsPerSigma = 3;

    /// <summary>
    /// Stores the likelihood (no prior) over the span where it is at least 1e-6 of its peak, sampled every k grid points
    /// (k = round(sd / (3 GridStep)), at least 1, sd the standard deviation of the likelihood over that span, and at most
    /// 1 / max |ln L(j+1) - ln L(j)| over the points above 1% of the peak, for likelihoods with steep flanks) as
    /// half-precision values normalised to sum x k x GridStep = 1, so that a consumer's midpoint sum at spacing k GridStep
    /// stands for the sum over every grid point of the span.
    /// The samples start at the span's low end, or end at its high end when that end is hard (cut by the calibration's
    /// domain at a sizeable value; a soft end is where the likelihood fell below the cut) and the low end soft or lower; with
    /// two hard ends a stride down to 2/3 of the target that divides the span puts samples on both. The samples carry the
    /// end-corrected weights of <see cref="EndCorrectedWeights"/> (folded into the stored values), so that a hard edge stays
    /// where the full grid has it instead of moving (k - 1)/2 points outwards, as equal weights would make it.
    /// </summary>
    private StoredWindow Store(int a, ReadOnlySpan<float> like, LikelihoodBuffer store)
    {
        float peak = 0;
        foreach (float v in like) peak = Math.Max(peak, v);
        float cut = peak * 1e-6f;
        int lo = 0, hi = like.Length - 1;
        while (like[lo] < cut) lo++;
        while (like[hi] < cut) hi--;
        // The kernel evaluates out to several sigma beyond the cut, so an end that reaches the evaluated range is the domain's.
        bool hardLo = lo == 0, hardHi = hi == like.Length - 1;
        double s0 = 0, s1 = 0, s2 = 0;
        for (int j = lo; j <= hi; j++)
        {
            double v = like[j], x = j - lo;
            s0 += v; s1 += v * x; s2 += v * x * x;
        }
        double mean = s1 / s0, sd = Math.Sqrt(Math.Max(s2 / s0 - mean * mean, 0));
        int span = hi - lo + 1;
        int k = (int)Math.Clamp(Math.Round(sd / StoredPointsPerSigma, MidpointRounding.AwayFromZero), 1, byte.MaxValue);
        // The sd alone misjudges a likelihood with two peaks (rising to both ends of the domain, with a deep valley between):
        // its steep flanks would fall between samples. So the stride also keeps the likelihood from changing by more than a
        // factor e between neighbouring samples wherever it is at least 1% of its peak.
        float significant = peak * 1e-2f;
        double maxStep = 0;
        for (int j = lo; j < hi; j++)
        {
            float u = like[j], v = like[j + 1];
            if (Math.Max(u, v) < significant) continue;
            maxStep = u > 0 && v > 0 ? Math.Max(maxStep, Math.Abs(Math.Log((double)v / u))) : double.PositiveInfinity;
        }
        if (maxStep > 0) k = Math.Max(1, Math.Min(k, (int)Math.Min(byte.MaxValue, Math.Floor(1.0 / maxStep))));
        if (_o.StoreEveryGridPoint) k = 1;
        k = Math.Min(k, Math.Max(1, span - 1));
        if (hardLo && hardHi)
        {
            // Both ends sampled when a stride down to 2/3 of the target divides the span; else the remainder goes to the lower end.
            for (int kk = k; 3 * kk >= 2 * k; kk--)
                if ((span - 1) % kk == 0) { k = kk; break; }
        }
        int count = (span - 1) / k + 1;
        bool anchorHigh = hardHi && (!hardLo || like[hi] > like[lo]);
        int first = anchorHigh ? hi - (count - 1) * k : lo;
        int last = first + (count - 1) * k;
        Span<double> w = count <= 512 ? stackalloc double[count] : new double[count];
        EndCorrectedWeights(w, k, span, first - lo, hi - last);
        double sum = 0;
        for (int m = 0; m < count; m++) sum += like[first + m * k] * w[m];
        double scale = 1.0 / (sum * _gridStep);
        var dst = store.Reserve(count);
        for (int m = 0; m < count; m++) dst[m] = (Half)(like[first + m * k] * w[m] / k * scale);
        return new StoredWindow(_g.FehFirst + a + first, count, (byte)k);
    }

    /// <summary>
    /// Weights (in grid points) of samples every k points that make sum_m w_m f(s_m) stand for the sum of f over all L points
    /// of a span whose first and last samples lie rLo and rHi points inside its ends. Euler-Maclaurin summation (Abramowitz &amp;
    /// Stegun 1964, eq. 23.1.30; recalled from memory) for the points and for the samples gives
    /// sum_j f(j) = k sum_m f(m k) - (k - 1)/2 (f_first + f_last) - (k^2 - 1)/12 (f'_last - f'_first) + O(k^4 f'''):
    /// interior weight k, end weight (k + 1)/2, and the derivative term with f' from the end pair of samples ((k^2 - 1)/(12 k)
    /// moved from each end sample to its neighbour). The rLo / rHi points beyond an end sample are taken at the line through
    /// the end pair. The weights add up to L (exact for a constant or a straight line).
    /// </summary>
    internal static void EndCorrectedWeights(Span<double> w, int k, int span, int rLo, int rHi)
    {
        int n = w.Length;
        if (n == 1) { w[0] = span; return; }
        w.Fill(k);
        w[0] = w[n - 1] = (k + 1) / 2.0;
        if (n >= 3 && k > 1)
        {
            double c = (k * (double)k - 1) / (12.0 * k);
            w[0] -= c; w[1] += c; w[n - 1] -= c; w[n - 2] += c;
        }
        if (rLo > 0) { double e = rLo * (rLo + 1) / (2.0 * k); w[0] += rLo + e; w[1] -= e; }
        if (rHi > 0) { double e = rHi * (rHi + 1) / (2.0 * k); w[n - 1] += rHi + e; w[n - 2] -= e; }
    }
}

/// <summary>Where a star's stored likelihood went: first grid index, number of stored values, grid points between them.</summary>
internal readonly record struct StoredWindow(int Start, int Length, byte Stride);

/// <summary>A growable half-precision buffer for the likelihood windows of one chunk of stars.</summary>
internal sealed class LikelihoodBuffer
{
    private Half[] _data = new Half[4096];
    public int Count { get; private set; }
    public ReadOnlySpan<Half> Data => _data.AsSpan(0, Count);

    public Span<Half> Reserve(int n)
    {
        if (Count + n > _data.Length) Array.Resize(ref _data, Math.Max(_data.Length * 2, Count + n));
        var s = _data.AsSpan(Count, n);
        Count += n;
        return s;
    }
}
