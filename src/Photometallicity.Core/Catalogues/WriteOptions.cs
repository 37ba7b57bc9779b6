namespace Photometallicity.Catalogues;

/// <summary>How to write a catalogue file.</summary>
public sealed record WriteOptions
{
    public static WriteOptions Default { get; } = new();

    /// <summary>FITS only: EXTNAME of the table extension written.</summary>
    public string ExtensionName { get; init; } = "CATALOGUE";
}
