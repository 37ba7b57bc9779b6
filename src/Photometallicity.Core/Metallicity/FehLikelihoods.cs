namespace Photometallicity.Metallicity;

/// <summary>
/// Each star's likelihood of [Fe/H] on a common grid, stored compactly: for star i the values of grid points
/// Start[i] .. Start[i] + Length[i] - 1 are Values[Offset[i] .. Offset[i] + Length[i] - 1]; outside that window the
/// likelihood is negligible (below 1e-6 of its peak). Length[i] = 0 for stars without a usable likelihood.
/// Values are normalised so that the sum over the window times GridStep is 1 (a density in dex^-1).
/// Grid point j sits at GridMin + j * GridStep.
/// </summary>
public sealed class FehLikelihoods
{
    public required double GridMin { get; init; }
    public required double GridStep { get; init; }
    public required int GridCount { get; init; }
    public required long[] Offset { get; init; }
    public required int[] Start { get; init; }
    public required int[] Length { get; init; }
    public required float[] Values { get; init; }

    public int StarCount => Start.Length;

    public double GridValue(int j) => GridMin + j * GridStep;

    public bool Has(int star) => Length[star] > 0;

    /// <summary>The stored window of star <paramref name="star"/>.</summary>
    public ReadOnlySpan<float> Window(int star) => Values.AsSpan((int)Offset[star], Length[star]);
}
