namespace Photometallicity.Catalogues.Csv;

/// <summary>
/// The numeric "no measurement" sentinels of <see cref="ReadOptions.MissingSentinels"/> (99.999, -99, ...).
/// A value matches a sentinel s when |x - s| &lt;= 1e-9 * max(1, |s|): a small relative tolerance, so that a
/// sentinel written as 99.999 matches 99.99900000000001 after a round trip through another program
/// (the tolerance is common practice, not from a published source). Used by the CSV and Parquet readers.
/// </summary>
internal sealed class SentinelSet
{
    private const double RelativeTolerance = 1e-9;
    private readonly double[] _values;
    private readonly double[] _tolerances;

    public SentinelSet(IReadOnlyList<double> sentinels)
    {
        _values = sentinels.Where(s => !double.IsNaN(s)).ToArray();
        _tolerances = _values.Select(s => RelativeTolerance * Math.Max(1.0, Math.Abs(s))).ToArray();
    }

    public bool IsEmpty => _values.Length == 0;

    public bool Matches(double x)
    {
        for (int i = 0; i < _values.Length; i++)
            if (Math.Abs(x - _values[i]) <= _tolerances[i]) return true;
        return false;
    }
}
