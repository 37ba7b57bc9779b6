namespace Photometallicity.Tiling;

/// <summary>
/// One tile of a split survey: the sources whose position falls in one nested HEALPix pixel (the tile owns them),
/// plus a margin of neighbouring sources so that the cross-match of every owned source is complete.
/// </summary>
public sealed record TileEntry
{
    /// <summary>Position of the tile in the plan, 0-based; the Slurm array task id.</summary>
    public required int Index { get; init; }

    /// <summary>Nested HEALPix pixel at <see cref="TilePlan.Order"/>.</summary>
    public required long Pixel { get; init; }

    /// <summary>Broadband rows the tile owns (written to the merged output from this tile only).</summary>
    public required long OwnedRows { get; init; }

    /// <summary>Broadband and narrow-band rows in the tile's inputs, owned plus margin.</summary>
    public required long BroadbandRows { get; init; }
    public required long NarrowbandRows { get; init; }
}

/// <summary>
/// The plan written by the 'split' verb into its work directory (plan.json) and read by 'tile', 'merge' and
/// 'batch'. Paths are absolute.
/// </summary>
public sealed record TilePlan
{
    public const string FileName = "plan.json";

    /// <summary>The work directory holding plan.json, global/ and tiles/.</summary>
    public required string WorkDirectory { get; init; }

    /// <summary>The run's config file (absolute path).</summary>
    public required string ConfigPath { get; init; }

    /// <summary>Where 'merge' writes the run's outputs by default (the config's output directory).</summary>
    public required string OutputDirectory { get; init; }

    /// <summary>HEALPix order of the tiles (Nside = 2^order).</summary>
    public required int Order { get; init; }

    /// <summary>Margin kept around every tile, arcsec.</summary>
    public required double MarginArcsec { get; init; }

    public required long BroadbandRows { get; init; }
    public required long NarrowbandRows { get; init; }

    /// <summary>SHA-256 of the config and of the broadband and narrow-band files at the split (path, checksum).</summary>
    public IReadOnlyList<(string Path, string Sha256)> Checksums { get; init; } = [];

    /// <summary>The non-empty tiles, in increasing pixel order.</summary>
    public required IReadOnlyList<TileEntry> Tiles { get; init; }

    /// <summary>Directory of tile <paramref name="index"/>'s inputs and results.</summary>
    public string TileDirectory(int index) => Path.Combine(WorkDirectory, "tiles", index.ToString("D5", System.Globalization.CultureInfo.InvariantCulture));

    /// <summary>Directory of the products fitted once for the whole field (calibration, astrometric solution).</summary>
    public string GlobalDirectory => Path.Combine(WorkDirectory, "global");
}
