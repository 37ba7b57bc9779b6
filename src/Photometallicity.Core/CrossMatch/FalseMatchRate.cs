using System.Runtime.CompilerServices;
using Photometallicity.Units;

namespace Photometallicity.CrossMatch;

/// <summary>
/// How often a left source finds an unrelated right source inside the match radius.
/// Expected: for right sources scattered at random with local surface density rho, the probability of at
/// least one inside radius r is P = 1 - exp(-pi rho r^2) (the Poisson probability that a circle of area
/// pi r^2 is not empty, for a uniform random point process; the standard chance-coincidence estimate).
/// rho is measured per left source from the right sources in an annulus around it that excludes its own
/// counterpart (inner radius 3 r, outer radius 10 r: common practice, chosen here), so it follows the local
/// crowding and the edges of the right catalogue.
/// Measured: the corrected left positions are displaced by 8 radii in four directions (east, west, north,
/// south) and the fraction of displaced positions with any right source within r is counted; a displaced
/// position has no true counterpart, so every hit is a chance coincidence.
/// Both use a deterministic stride subsample of the left rows when the catalogue is large.
/// </summary>
public static class FalseMatchRate
{
    public const double AnnulusInner = 3.0;
    public const double AnnulusOuter = 10.0;
    public const double ShiftRadii = 8.0;
    private const int ExpectedSample = 50_000;
    private const int MeasuredSample = 50_000;

    /// <summary>P = 1 - exp(-pi rho r^2) with rho in sources per square arcminute.</summary>
    public static double ChanceProbability(double densityPerSqArcmin, Angle radius)
    {
        double rArcmin = radius.Arcminutes;
        return 1.0 - Math.Exp(-Math.PI * densityPerSqArcmin * rArcmin * rArcmin);
    }

    /// <summary>Mean over (sampled) left rows of P from the local right density in the annulus [3 r, 10 r].</summary>
    public static double Expected(SkyKdTree right, UnitVectors left, Angle radius)
    {
        double inner = SkySeparation.Chord(radius * AnnulusInner);
        double outer = SkySeparation.Chord(radius * AnnulusOuter);
        // Area of a spherical cap of angular radius t: 2 pi (1 - cos t) = pi chord^2, in square arcmin.
        const double sqArcminPerSr = (180.0 * 60.0 / Math.PI) * (180.0 * 60.0 / Math.PI);
        double annulusSqArcmin = Math.PI * (outer * outer - inner * inner) * sqArcminPerSr;
        var rows = Sample(left.Order, ExpectedSample);
        var p = new double[rows.Length];
        Chunks.For(rows.Length, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (_, lo, hi) =>
        {
            for (int k = lo; k < hi; k++)
            {
                int i = rows[k];
                int n = right.CountWithin(left.X[i], left.Y[i], left.Z[i], outer * outer)
                        - right.CountWithin(left.X[i], left.Y[i], left.Z[i], inner * inner);
                p[k] = ChanceProbability(n / annulusSqArcmin, radius);
            }
        });
        double sum = 0;
        foreach (double v in p) sum += v;
        return rows.Length == 0 ? 0.0 : sum / rows.Length;
    }

    /// <summary>Fraction of displaced left positions with a right source within the radius, and its binomial error.</summary>
    public static (double Rate, double Error, int Trials) Measured(SkyKdTree right, UnitVectors left, Angle radius)
    {
        double r2 = SkySeparation.Chord(radius) * SkySeparation.Chord(radius);
        var (ss, cs) = Math.SinCos(Math.Min(radius.Radians * ShiftRadii, 0.5));
        var rows = Sample(left.Order, MeasuredSample);
        var hits = new int[rows.Length];
        Chunks.For(rows.Length, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (_, lo, hi) =>
        {
            for (int k = lo; k < hi; k++)
            {
                int i = rows[k];
                double px = left.X[i], py = left.Y[i], pz = left.Z[i];
                // Local east (z x p) and north (p x east); at a pole any perpendicular pair serves.
                double ex = -py, ey = px, ez = 0.0, en = Math.Sqrt(ex * ex + ey * ey);
                if (en < 1e-12) { ex = 0; ey = 1; en = 1; }
                ex /= en; ey /= en; ez /= en;
                double nx = py * ez - pz * ey, ny = pz * ex - px * ez, nz = px * ey - py * ex;
                int h = 0;
                for (int dir = 0; dir < 4; dir++)
                {
                    double tx = dir switch { 0 => ex, 1 => -ex, 2 => nx, _ => -nx };
                    double ty = dir switch { 0 => ey, 1 => -ey, 2 => ny, _ => -ny };
                    double tz = dir switch { 0 => ez, 1 => -ez, 2 => nz, _ => -nz };
                    if (right.AnyWithin(cs * px + ss * tx, cs * py + ss * ty, cs * pz + ss * tz, r2)) h++;
                }
                hits[k] = h;
            }
        });
        long total = 0;
        foreach (int h in hits) total += h;
        int trials = 4 * rows.Length;
        if (trials == 0) return (0.0, 0.0, 0);
        double rate = (double)total / trials;
        return (rate, Math.Sqrt(rate * (1 - rate) / trials), trials);
    }

    /// <summary>Every row when there are at most max, otherwise every k-th row along the spatial order (an even spread over the field).</summary>
    internal static int[] Sample(int[] order, int max)
    {
        int n = order.Length;
        int stride = Math.Max(1, (n + max - 1) / max);
        var rows = new int[(n + stride - 1) / stride];
        for (int k = 0; k < rows.Length; k++) rows[k] = order[k * stride];
        return rows;
    }
}
