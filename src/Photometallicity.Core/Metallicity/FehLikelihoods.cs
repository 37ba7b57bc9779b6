namespace Photometallicity.Metallicity;

/// <summary>
/// Each star's likelihood of [Fe/H] on a common grid (grid point j at GridMin + j * GridStep), stored compactly as samples
/// every <see cref="StrideOf"/> grid points: star i's m-th stored value, Values[Offset[i] + m] for m = 0 .. Length[i] - 1,
/// belongs to grid point Start[i] + m * k_i (k_i = Stride[i], 1 when Stride is null). Outside the stored span the
/// likelihood is negligible (below 1e-6 of its peak) or zero (beyond the calibration's domain). Length[i] = 0 for stars
/// without a usable likelihood. Values are in dex^-1, normalised so that sum_m Values * k_i * GridStep = 1: a consumer
/// sums value x integrand x <see cref="Spacing"/> over the stored values, which stands for the sum over every grid point.
/// <para>
/// Storage: the stride is chosen per star so that about three samples fall per standard deviation of the star's
/// likelihood (k_i = round(sd_i / (3 GridStep)), at least 1; smaller where the likelihood changes by more than a factor e
/// between samples above 1% of its peak, as for one rising steeply to both ends of the domain), which leaves ~32 stored
/// values for a Gaussian likelihood cut
/// at 1e-6 of its peak (+/- 5.3 sd) whatever its width, instead of up to the whole grid. Interior values are the
/// likelihood itself; the two end values carry end-corrected quadrature weights (Euler-Maclaurin, see
/// StarSolver.EndCorrectedWeights), so that a likelihood cut sharply by the domain keeps its edge where the full grid has
/// it. For a smooth integrand the sum at spacing h errs by about 2 exp(-2 pi^2 s^2 / h^2) relative (Poisson summation;
/// s the width of the product of the likelihood and the integrated Gaussian): below 1e-7 for h = sd/3 unless the Gaussian
/// is much narrower than the likelihood (s &lt; h / 2), and then that star carries little information about it anyway.
/// On the committed samples/ field the membership step's MDF moves by 2.6e-5 dex in mean and 3.7e-5 dex in sigma from the
/// every-grid-point storage, and no membership probability by more than 0.003 (FehLikelihoodCompactionTest); on the
/// 3 x 10^6-star demo field by 1.4e-5 / 1.8e-5 dex, with 174 of 2.6 million probabilities moving by more than 0.005
/// (at most 0.019), for 43 M stored values instead of 255 M.
/// Values are IEEE half precision (11-bit significand: relative rounding 2^-11 = 5e-4 per value, independent between
/// neighbours; the densities lie between ~1e-7 and 1/GridStep, inside the half range). Per stored star: 2 bytes per
/// value (~60 bytes) plus 4 + 4 + 4 + 1 bytes of Offset, Start, Length and Stride, against up to 4 bytes per grid point
/// (~1 kB per star on a faint field) when every grid point was kept as a float.
/// </para>
/// </summary>
public sealed class FehLikelihoods
{
    public required double GridMin { get; init; }
    public required double GridStep { get; init; }
    public required int GridCount { get; init; }

    /// <summary>Index into <see cref="Values"/> of each star's first stored value (an array never holds more than int.MaxValue).</summary>
    public required int[] Offset { get; init; }

    /// <summary>Grid index of each star's first stored value.</summary>
    public required int[] Start { get; init; }

    /// <summary>Number of stored values of each star (0: no likelihood).</summary>
    public required int[] Length { get; init; }

    /// <summary>Grid points between a star's consecutive stored values; null when every star is stored at every grid point.</summary>
    public byte[]? Stride { get; init; }

    public required Half[] Values { get; init; }

    public int StarCount => Start.Length;

    public double GridValue(int j) => GridMin + j * GridStep;

    public bool Has(int star) => Length[star] > 0;

    /// <summary>Grid points between consecutive stored values of <paramref name="star"/> (at least 1).</summary>
    public int StrideOf(int star) => Stride is null ? 1 : Stride[star];

    /// <summary>[Fe/H] spacing of the stored values of <paramref name="star"/> (dex): the midpoint rule's step.</summary>
    public double Spacing(int star) => StrideOf(star) * GridStep;

    /// <summary>Grid index of the m-th stored value of <paramref name="star"/>.</summary>
    public int GridIndex(int star, int m) => Start[star] + m * StrideOf(star);

    /// <summary>The stored values of star <paramref name="star"/>.</summary>
    public ReadOnlySpan<Half> Window(int star) => Values.AsSpan(Offset[star], Length[star]);
}
