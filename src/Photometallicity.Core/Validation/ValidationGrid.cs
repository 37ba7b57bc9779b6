namespace Photometallicity.Validation;

/// <summary>
/// The fixed grid of validation fields (documented in README, "Validation"). The full grid crosses the three invented
/// index laws with the three sources of standards, bad-standard shares of 0 to 15%, shallow and deep narrow bands, the
/// three column layouts and positions including two fields straddling RA = 0/360. The quick grid is three small fields
/// for CI. All galaxies, positions and numbers are invented.
/// </summary>
public static class ValidationGrid
{
    public static IReadOnlyList<ValidationField> Full { get; } =
    [
        F("lin-bright-deep", "Arbor Dwarf (invented)", IndexLawKind.Linear, StandardsSource.Bright, 0.05, NarrowDepth.Deep, 52.41, -27.83, -1.50, 0.35, ColumnScheme.Demo),
        F("lin-spread-shallow-ra0", "Birch Dwarf (invented)", IndexLawKind.Linear, StandardsSource.Spread, 0.10, NarrowDepth.Shallow, 0.06, 14.20, -1.30, 0.30, ColumnScheme.Alpha),
        F("sat-bright-deep", "Cedar Dwarf (invented)", IndexLawKind.Saturating, StandardsSource.Bright, 0.10, NarrowDepth.Deep, 211.90, 8.35, -1.90, 0.45, ColumnScheme.Beta),
        F("sat-bright-shallow", "Dogwood Dwarf (invented)", IndexLawKind.Saturating, StandardsSource.Bright, 0.15, NarrowDepth.Shallow, 318.20, -51.60, -1.65, 0.38, ColumnScheme.Demo),
        F("sat-spread-deep-ra0", "Elder Dwarf (invented)", IndexLawKind.Saturating, StandardsSource.Spread, 0.05, NarrowDepth.Deep, 359.95, -3.10, -2.20, 0.40, ColumnScheme.Alpha),
        F("curv-bright-deep", "Fir Dwarf (invented)", IndexLawKind.Curved, StandardsSource.Bright, 0.05, NarrowDepth.Deep, 96.30, 62.70, -1.40, 0.40, ColumnScheme.Beta),
        F("curv-spread-shallow", "Gorse Dwarf (invented)", IndexLawKind.Curved, StandardsSource.Spread, 0.0, NarrowDepth.Shallow, 171.05, -19.90, -1.70, 0.35, ColumnScheme.Demo),
        F("curv-spread-deep", "Hazel Dwarf (invented)", IndexLawKind.Curved, StandardsSource.Spread, 0.15, NarrowDepth.Deep, 244.60, 33.10, -1.55, 0.40, ColumnScheme.Alpha),
        F("sat-cluster-deep", "Ivy Dwarf (invented)", IndexLawKind.Saturating, StandardsSource.Cluster, 0.0, NarrowDepth.Deep, 23.70, -44.20, -1.80, 0.40, ColumnScheme.Beta),
        F("lin-cluster-shallow", "Juniper Dwarf (invented)", IndexLawKind.Linear, StandardsSource.Cluster, 0.0, NarrowDepth.Shallow, 288.40, 5.50, -1.50, 0.35, ColumnScheme.Demo),
    ];

    public static IReadOnlyList<ValidationField> Quick { get; } =
    [
        F("q-sat-bright-deep-ra0", "Kale Dwarf (invented)", IndexLawKind.Saturating, StandardsSource.Bright, 0.10, NarrowDepth.Deep, 0.04, -21.30, -1.75, 0.40, ColumnScheme.Alpha) with { Stars = 11000, StandardsCount = 160, Bootstrap = 80 },
        F("q-lin-spread-shallow", "Laurel Dwarf (invented)", IndexLawKind.Linear, StandardsSource.Spread, 0.05, NarrowDepth.Shallow, 148.80, 21.60, -1.45, 0.35, ColumnScheme.Beta) with { Stars = 11000, StandardsCount = 160, Bootstrap = 80 },
        F("q-curv-bright-deep", "Maple Dwarf (invented)", IndexLawKind.Curved, StandardsSource.Bright, 0.05, NarrowDepth.Deep, 276.10, -60.40, -1.60, 0.38, ColumnScheme.Demo) with { Stars = 11000, StandardsCount = 160, Bootstrap = 80 },
    ];

    /// <summary>Every field of both grids by name.</summary>
    public static ValidationField? ByName(string name) =>
        Full.Concat(Quick).FirstOrDefault(f => string.Equals(f.Name, name, StringComparison.Ordinal));

    private static ValidationField F(string name, string galaxy, IndexLawKind law, StandardsSource std, double bad, NarrowDepth depth,
        double ra, double dec, double meanFeh, double sigmaFeh, ColumnScheme cols) => new()
    {
        Name = name, Galaxy = galaxy, Law = law, Standards = std, BadShare = bad, Depth = depth, RaDeg = ra, DecDeg = dec,
        MeanFeh = meanFeh, SigmaFeh = sigmaFeh, Columns = cols,
    };
}
