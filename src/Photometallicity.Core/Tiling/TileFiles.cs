namespace Photometallicity.Tiling;

/// <summary>File and column names inside a split survey's work directory.</summary>
public static class TileFiles
{
    public const string Broadband = "broadband.fits";
    public const string Narrowband = "narrowband.fits";
    public const string Calibration = "calibration.json";
    public const string DwarfCalibration = "calibration_dwarf.json";

    /// <summary>Whole-field row number (0-based) of each row of a tile's input table.</summary>
    public const string RowColumn = "pm_tile_row";

    /// <summary>Ring of each row (0: the tile owns it, 1 and 2: margin), see <see cref="TilePartition"/>.</summary>
    public const string RingColumn = "pm_tile_ring";
}
