using System.Runtime.CompilerServices;
using System.Diagnostics;
using Microsoft.Extensions.Logging;
using Photometallicity.Errors;
using Photometallicity.Units;

namespace Photometallicity.CrossMatch;

/// <summary>
/// The cross-match stage: pairs every left (broadband) source with at most one right (narrow-band) source.
/// Steps: unit vectors and a tangent plane about the left field's centre; the astrometric offset (optionally
/// rotation and scale) solved from secure pairs and applied to the right catalogue; the radius (given, or
/// chosen from the separation distribution); one-to-one matching within it; the expected and measured
/// false-match rates. Works on in-memory columns only; parallel parts use fixed chunks, so the result is the
/// same for any number of threads.
/// </summary>
public static class CrossMatcher
{
    private const double RadToArcsec = 180.0 * 3600.0 / Math.PI;
    // Offsets are solved in a tangent plane; beyond 45 deg from the centre it no longer describes one field (program's choice).
    private const double MaxFieldRadiusDeg = 45.0;

    public static CrossMatchResult Run(double[] leftRaDeg, double[] leftDecDeg, double[] rightRaDeg, double[] rightDecDeg,
        CrossMatchOptions options, ILogger? logger = null)
    {
        options.Validate();
        CheckPositions(leftRaDeg, leftDecDeg, "left");
        CheckPositions(rightRaDeg, rightDecDeg, "right");
        var clock = Stopwatch.StartNew();
        int nLeft = leftRaDeg.Length, nRight = rightRaDeg.Length;
        var left = UnitVectors.FromDegrees(leftRaDeg, leftDecDeg);
        var rightRaw = UnitVectors.FromDegrees(rightRaDeg, rightDecDeg);
        var plane = TangentPlane.AboutMean(left);

        Angle radius = options.AutoRadius && options.Radius.Radians <= 0 ? Angle.FromArcseconds(1.0) : options.Radius;
        string radiusReason = options.AutoRadius ? "" : "fixed by the caller, not chosen from the data";
        var transform = AstrometricTransform.Identity;
        OffsetSolver.Outcome? outcome = null;
        string offsetReason;
        int iterations = 0;
        UnitVectors right = rightRaw;
        OffsetSolver.Correction? correction = null;
        SkyKdTree? rawTree = null;

        bool canSolve = options.SolveOffset && plane is not null && plane.RadiusDeg <= MaxFieldRadiusDeg && nLeft > 0 && nRight > 0;
        if (!options.SolveOffset) offsetReason = "offset not solved (switched off)";
        else if (nLeft == 0 || nRight == 0) offsetReason = "offset not solved (a catalogue is empty)";
        else if (!canSolve) offsetReason = $"offset not solved: the left catalogue spans more than {MaxFieldRadiusDeg} deg from its centre, too wide for one tangent plane";
        else offsetReason = "";

        Phase(logger, "unit vectors", clock);
        if (canSolve)
        {
            // The left visiting order (a sequential sort) is made while the right tree is built; both only read
            // their inputs, so the overlap changes nothing but the wall time.
            var leftOrder = Task.Run(() => left.Order);
            rawTree = SkyKdTree.Build(rightRaw);
            leftOrder.Wait();
            Phase(logger, "tree of the right catalogue", clock);
            var solver = new OffsetSolver(plane!, rawTree, left, rightRaw);
            Phase(logger, "spatial order", clock);
            double search = (options.OffsetSearchRadius ?? Angle.FromArcseconds(Math.Max(3.0 * radius.Arcseconds, 3.0))).Radians;
            var start = solver.InitialEstimate(search);
            logger?.LogDebug("crossmatch: first offset estimate {Est} from the pair-offset histogram within {Search:0.##} arcsec",
                start is { } s0 ? $"{s0.DXi * RadToArcsec:+0.000;-0.000}, {s0.DEta * RadToArcsec:+0.000;-0.000} arcsec" : "none (no peak)", search * RadToArcsec);
            Phase(logger, "first estimate done", clock);
            double fieldRad = plane!.RadiusDeg * Math.PI / 180.0;
            outcome = solver.Iterate(start ?? AstrometricTransform.Identity, radius.Radians, options.MaxIterations,
                options.SolveRotationScale, options.ConvergenceTolerance.Radians, options.MinSecurePairs, fieldRad);
            iterations = outcome.Iterations;
            if (options.AutoRadius && outcome.Fit is not null)
            {
                var choice = ChooseRadius(rawTree, solver.MapSample(outcome.Transform), radius);
                radius = choice.Radius;
                radiusReason = choice.Reason;
                outcome = solver.Iterate(outcome.Transform, radius.Radians, options.MaxIterations,
                    options.SolveRotationScale, options.ConvergenceTolerance.Radians, options.MinSecurePairs, fieldRad);
                iterations += outcome.Iterations;
            }
            if (outcome.Fit is null)
            {
                offsetReason = $"offset not solved: {outcome.SecurePairs} secure pairs within {radius.Arcseconds:0.###} arcsec, fewer than the {options.MinSecurePairs} needed";
                outcome = null;
            }
            else
            {
                transform = outcome.Transform;
                Phase(logger, "iterations", clock);
                correction = solver.CorrectionOf(transform, rightRaw);
            }
        }

        Phase(logger, "offset iterations done", clock);
        // The corrected catalogue is the observed one moved by the (small) offset: the observed tree is re-used with
        // widened searches, which finds exactly the pairs a new tree would.
        // Each corrected position is computed where it is needed (in the tree, and for the matched rows below).
        var tree = rawTree is null ? SkyKdTree.Build(right) : correction is { } cr ? rawTree.WithMovedPoints(cr) : rawTree;
        Phase(logger, "tree of the corrected catalogue", clock);
        if (options.AutoRadius && outcome is null)
        {
            var choice = ChooseRadius(tree, SampleOf(left), radius);
            radius = choice.Radius;
            radiusReason = choice.Reason + " (no offset correction was applied)";
        }

        var finalRadius = radius;
        var core = Pair(tree, left, leftRaDeg, leftDecDeg, right, correction, nRight, radius,
            () => (FalseMatchRate.Expected(tree, left, finalRadius), FalseMatchRate.Measured(tree, left, finalRadius)), logger, clock);
        var (expected, measured) = core.FalseMatch;
        var rightIndex = core.RightIndex;
        var sep = core.Separation;
        var blend = core.Blend;
        int matched = core.Matched, blends = core.Blends, lost = core.Lost;
        Phase(logger, "false-match rates", clock);

        var fit = outcome?.Fit;
        bool solved = fit is not null;
        var offset = solved ? (transform.DXi * RadToArcsec, transform.DEta * RadToArcsec) : (0.0, 0.0);
        var offErr = solved ? (fit!.ErrorXiRad * RadToArcsec, fit.ErrorEtaRad * RadToArcsec) : (double.NaN, double.NaN);
        var scatter = solved ? (fit!.ScatterXiRad * RadToArcsec, fit.ScatterEtaRad * RadToArcsec) : (double.NaN, double.NaN);
        bool rotScale = solved && options.SolveRotationScale && (transform.A != 1.0 || transform.B != 0.0);
        if (solved)
        {
            offsetReason = $"offset {offset.Item1:+0.0000;-0.0000} +/- {offErr.Item1:0.0000}, {offset.Item2:+0.0000;-0.0000} +/- {offErr.Item2:0.0000} arcsec "
                           + $"from {fit!.Used} secure pairs ({fit.Clipped} clipped) after {iterations} iterations"
                           + (outcome!.Converged ? "" : " (not converged)")
                           + (rotScale ? $"; rotation {transform.RotationRadians * RadToArcsec:+0.000;-0.000} arcsec, scale {transform.Scale:0.0000000}" : "");
        }
        var result = new CrossMatchResult
        {
            RightIndex = rightIndex,
            SeparationArcsec = sep,
            Blend = blend,
            LeftCount = nLeft,
            RightCount = nRight,
            Matched = matched,
            BlendCount = blends,
            LostContention = lost,
            RadiusUsed = radius,
            RadiusReason = radiusReason,
            FieldCentre = plane is null ? null : SkyPosition.FromDegrees(plane.CentreRaDeg, plane.CentreDecDeg),
            OffsetSolved = solved,
            OffsetReason = offsetReason,
            Offset = offset,
            OffsetError = offErr,
            OffsetScatter = scatter,
            SecurePairs = outcome?.SecurePairs ?? 0,
            SecurePairsUsed = fit?.Used ?? 0,
            RotationArcsec = rotScale ? transform.RotationRadians * RadToArcsec : null,
            Scale = rotScale ? transform.Scale : null,
            ExpectedFalseMatchRate = expected,
            MeasuredFalseMatchRate = measured.Rate,
            MeasuredFalseMatchRateError = measured.Error,
            Iterations = iterations,
            Converged = outcome?.Converged ?? !options.SolveOffset,
            Solution = correction.HasValue
                ? new AstrometricSolution(true, plane!.CentreVector.X, plane.CentreVector.Y, plane.CentreVector.Z, transform, radius)
                : new AstrometricSolution(false, 0, 0, 0, AstrometricTransform.Identity, radius),
        };
        logger?.LogInformation("crossmatch: {Reason}", offsetReason);
        logger?.LogInformation("crossmatch: radius {Reason}", radiusReason);
        logger?.LogInformation("crossmatch: matched {Matched} of {Left} left sources ({Blends} possible blends, {Lost} lost to closer pairs); false-match rate expected {Exp:0.0000}, measured {Meas:0.0000} +/- {Err:0.0000} ({Ms} ms)",
            matched, nLeft, blends, lost, expected, measured.Rate, measured.Error, clock.ElapsedMilliseconds);
        return result;
    }

    /// <summary>The pairing of a run, with the false-match rates run alongside the sequential assignment.</summary>
    private readonly record struct PairingCore(int[] RightIndex, double[] Separation, bool[] Blend, CandidatePairs Pairs, int Matched, int Blends, int Lost,
        (double Expected, (double Rate, double Error, int Trials) Measured) FalseMatch);

    /// <summary>
    /// Candidate pairs within the radius of the corrected right catalogue, the one-to-one assignment, separations and
    /// blend flags. The same code serves a whole-field run and a run on a tile with a fixed solution, so both give the
    /// same answer for every source whose candidates all lie in the tile.
    /// </summary>
    private static PairingCore Pair(SkyKdTree tree, UnitVectors left, double[] leftRaDeg, double[] leftDecDeg, UnitVectors right,
        OffsetSolver.Correction? correction, int nRight, Angle radius, Func<(double, (double Rate, double Error, int Trials))>? falseMatchRates, ILogger? logger, Stopwatch clock)
    {
        int nLeft = left.Count;
        double chord = SkySeparation.Chord(radius);
        var pairs = CandidatePairs.Find(tree, left, chord * chord);
        // The false-match tests read only the tree and the left positions: they run alongside the (sequential)
        // one-to-one assignment.
        var falseMatch = falseMatchRates is null ? null : Task.Run(falseMatchRates);
        Phase(logger, "candidate pairs", clock);
        var (rightIndex, _) = OneToOneMatcher.Assign(pairs, nRight);
        Phase(logger, "assignment", clock);
        var sep = new double[nLeft];
        var blend = new bool[nLeft];
        bool corrected = correction.HasValue;
        var corr = correction.GetValueOrDefault();
        Chunks.For(nLeft, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (_, lo, hi) =>
        {
            for (int i = lo; i < hi; i++)
            {
                int r = rightIndex[i];
                blend[i] = pairs.CountOf(i) >= 2;
                if (r < 0)
                {
                    sep[i] = double.NaN;
                    continue;
                }
                var (px, py, pz) = corrected ? corr.Map(r) : (right.X[r], right.Y[r], right.Z[r]);
                var (ra, dec) = UnitVectors.ToDegrees(px, py, pz);
                sep[i] = SkySeparation.Arcseconds(leftRaDeg[i], leftDecDeg[i], ra, dec);
            }
        });
        int matched = 0, blends = 0, lost = 0;
        for (int i = 0; i < nLeft; i++)
        {
            if (rightIndex[i] < 0)
            {
                if (pairs.CountOf(i) > 0) lost++;
                continue;
            }
            matched++;
            if (blend[i]) blends++;
        }
        Phase(logger, "one-to-one match done", clock);
        var rates = falseMatch is null ? (double.NaN, (double.NaN, double.NaN, 0)) : falseMatch.GetAwaiter().GetResult();
        return new PairingCore(rightIndex, sep, blend, pairs, matched, blends, lost, rates);
    }

    /// <summary>
    /// The pairing alone with a solution fixed beforehand (by a whole-field run): no offset is solved, no radius
    /// chosen and no false-match rate measured (those fields are NaN or zero). Used on survey tiles; every left
    /// source whose candidates, and their competitors' candidates, all lie in the given rows is paired exactly as
    /// in the whole-field run. <paramref name="pairs"/> gives the candidate pairs for such completeness checks.
    /// </summary>
    public static CrossMatchResult RunWith(double[] leftRaDeg, double[] leftDecDeg, double[] rightRaDeg, double[] rightDecDeg,
        AstrometricSolution solution, out CandidatePairs pairs, ILogger? logger = null)
    {
        CheckPositions(leftRaDeg, leftDecDeg, "left");
        CheckPositions(rightRaDeg, rightDecDeg, "right");
        var clock = Stopwatch.StartNew();
        var left = UnitVectors.FromDegrees(leftRaDeg, leftDecDeg);
        var rightRaw = UnitVectors.FromDegrees(rightRaDeg, rightDecDeg);
        var leftOrder = Task.Run(() => left.Order);
        var rawTree = SkyKdTree.Build(rightRaw);
        leftOrder.Wait();
        OffsetSolver.Correction? correction = null;
        if (solution.Plane is { } plane)
        {
            correction = new OffsetSolver.Correction(plane, solution.Transform, rightRaw);
        }
        var tree = correction is { } cr ? rawTree.WithMovedPoints(cr) : rawTree;
        var core = Pair(tree, left, leftRaDeg, leftDecDeg, rightRaw, correction, rightRaDeg.Length, solution.Radius, null, logger, clock);
        pairs = core.Pairs;
        return new CrossMatchResult
        {
            RightIndex = core.RightIndex,
            SeparationArcsec = core.Separation,
            Blend = core.Blend,
            LeftCount = leftRaDeg.Length,
            RightCount = rightRaDeg.Length,
            Matched = core.Matched,
            BlendCount = core.Blends,
            LostContention = core.Lost,
            RadiusUsed = solution.Radius,
            RadiusReason = "fixed by a whole-field solution",
            OffsetSolved = solution.Corrected,
            OffsetReason = "fixed by a whole-field solution",
            ExpectedFalseMatchRate = double.NaN,
            MeasuredFalseMatchRate = double.NaN,
            MeasuredFalseMatchRateError = double.NaN,
            Converged = true,
            Solution = solution,
        };
    }

    /// <summary>A debug line with the time since the stage started (wall, and the whole process's CPU).</summary>
    private static void Phase(ILogger? logger, string what, Stopwatch clock)
    {
        if (logger is null || !logger.IsEnabled(LogLevel.Debug)) return;
        logger.LogDebug("crossmatch: {What} {Ms} ms wall, {Cpu:0} ms process CPU", what, clock.ElapsedMilliseconds,
            Process.GetCurrentProcess().TotalProcessorTime.TotalMilliseconds);
    }

    /// <summary>At most 200 000 of the vectors, evenly spread along their spatial order.</summary>
    private static UnitVectors SampleOf(UnitVectors v)
    {
        var rows = FalseMatchRate.Sample(v.Order, 200_000);
        var x = new double[rows.Length];
        var y = new double[rows.Length];
        var z = new double[rows.Length];
        var order = new int[rows.Length];
        for (int k = 0; k < rows.Length; k++)
        {
            x[k] = v.X[rows[k]];
            y[k] = v.Y[rows[k]];
            z[k] = v.Z[rows[k]];
            order[k] = k;
        }
        return new UnitVectors(x, y, z).WithOrder(order);
    }

    private static AutoRadiusChoice ChooseRadius(SkyKdTree tree, UnitVectors queries, Angle guess)
    {
        double max = Math.Max(4.0 * guess.Arcseconds, 4.0);
        var counts = PairHistograms.Separations(tree, queries, max, AutoRadius.Bins);
        return AutoRadius.Choose(counts, max / AutoRadius.Bins, guess);
    }

    private static void CheckPositions(double[] ra, double[] dec, string side)
    {
        if (ra.Length != dec.Length)
            throw new ArgumentException($"{side} catalogue: RA has {ra.Length} values but Dec has {dec.Length}.");
        for (int i = 0; i < ra.Length; i++)
        {
            if (!double.IsFinite(ra[i]))
                throw new InputException($"{side} catalogue: RA is {ra[i]}; every position must be finite", row: i + 1, column: "RA");
            if (!(dec[i] >= -90.0 && dec[i] <= 90.0))
                throw new InputException($"{side} catalogue: Dec = {dec[i]} deg is outside [-90, 90]", row: i + 1, column: "Dec");
        }
    }
}
