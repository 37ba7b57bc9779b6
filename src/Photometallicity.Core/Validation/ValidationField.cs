namespace Photometallicity.Validation;

/// <summary>Where a validation field's standards come from.</summary>
public enum StandardsSource
{
    /// <summary>Members in the brightest 2 mag of the giant branch (the reddest giants), at random.</summary>
    Bright,
    /// <summary>Members spread evenly in magnitude over the whole branch.</summary>
    Spread,
    /// <summary>Invented cluster fields, each with one literature [Fe/H]; no individual standards.</summary>
    Cluster,
}

/// <summary>Narrow-band depth of a validation field.</summary>
public enum NarrowDepth
{
    /// <summary>Members at red0 = mu + 1 (at the MDF mean) have narrow-band S/N about 7.</summary>
    Shallow,
    /// <summary>1.5 mag deeper than shallow (S/N about 28 there).</summary>
    Deep,
}

/// <summary>One field of the validation grid. Every name, position and number is invented.</summary>
public sealed record ValidationField
{
    public required string Name { get; init; }
    /// <summary>The invented target's name.</summary>
    public required string Galaxy { get; init; }
    public required IndexLawKind Law { get; init; }
    public required StandardsSource Standards { get; init; }
    /// <summary>Share of bad individual standards (0 for cluster fields).</summary>
    public double BadShare { get; init; }
    public required NarrowDepth Depth { get; init; }
    public required double RaDeg { get; init; }
    public required double DecDeg { get; init; }
    public double DistanceModulus { get; init; } = 21.2;
    public double MeanFeh { get; init; } = -1.65;
    public double SigmaFeh { get; init; } = 0.38;
    public int Stars { get; init; } = 20000;
    public int StandardsCount { get; init; } = 200;
    public int Bootstrap { get; init; } = 200;
    public required ColumnScheme Columns { get; init; }

    public string DepthName => Depth == NarrowDepth.Shallow ? "shallow" : "deep";
    public string StandardsName => Standards.ToString().ToLowerInvariant();
}
