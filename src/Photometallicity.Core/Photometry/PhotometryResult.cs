namespace Photometallicity.Photometry;

/// <summary>The prepared photometry and the counts that describe it.</summary>
public sealed record PhotometryResult(IndexPhotometry Photometry, PhotometryDiagnostics Diagnostics);

/// <summary>
/// Counts over all rows: <see cref="Usable"/> have status Ok; <see cref="UsableColour"/> have a usable colour;
/// <see cref="FlagCounts"/> gives, for each single flag, how many rows carry it (a row may count under several).
/// </summary>
public sealed record PhotometryDiagnostics(int Rows, int Usable, int UsableColour, IReadOnlyDictionary<PhotometryStatus, int> FlagCounts)
{
    public override string ToString() =>
        $"{Rows} rows, {Usable} usable for the index, {UsableColour} with a usable colour; " +
        string.Join(", ", FlagCounts.Where(kv => kv.Value > 0).Select(kv => $"{kv.Key} {kv.Value}"));
}
