using Photometallicity.Tiling;

namespace Photometallicity.Tests.Tiling;

/// <summary>Small tile plans for the tiling tests.</summary>
internal static class TilePlanSamples
{
    /// <summary>A four-tile plan at order 6 in <paramref name="workDirectory"/>, with invented counts.</summary>
    public static TilePlan FourTiles(string workDirectory) => new()
    {
        WorkDirectory = Path.GetFullPath(workDirectory),
        ConfigPath = "/data/field one/config.json",
        OutputDirectory = "/data/field one/out",
        Order = 6,
        MarginArcsec = 0.1 + 0.2,
        BroadbandRows = 20000,
        NarrowbandRows = 16233,
        Tiles =
        [
            Tile(0, 38575, 182, 200, 150),
            Tile(1, 38586, 952, 1000, 800),
            Tile(2, 39941, 9531, 9700, 7000),
            Tile(3, 39952, 9335, 9400, 7900),
        ],
    };

    public static TileEntry Tile(int index, long pixel, long owned, long broad, long narrow) =>
        new() { Index = index, Pixel = pixel, OwnedRows = owned, BroadbandRows = broad, NarrowbandRows = narrow };
}
