using Photometallicity.Metallicity;

namespace Photometallicity.Tiling;

/// <summary>
/// What one tile computed for the broadband rows it owns (in ascending row order): the cross-match (narrow-band rows
/// are whole-field row numbers) and the [Fe/H] results, main and dwarf calibration, restricted to those rows.
/// </summary>
public sealed record TileResult
{
    public required int TileIndex { get; init; }

    /// <summary>Whole-field broadband row of each owned row.</summary>
    public required int[] Rows { get; init; }
    public required int[] RightIndex { get; init; }
    public required double[] SeparationArcsec { get; init; }
    public required bool[] Blend { get; init; }
    public required MetallicityResult Metallicity { get; init; }
    public MetallicityResult? Dwarf { get; init; }

    public int Count => Rows.Length;
}
