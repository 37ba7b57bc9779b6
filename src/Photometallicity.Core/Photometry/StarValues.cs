namespace Photometallicity.Photometry;

/// <summary>A per-star quantity given either as one value for every star or as an array (one entry per row).</summary>
public sealed class StarValues
{
    private readonly double[]? _values;
    private readonly double _constant;

    private StarValues(double[]? values, double constant)
    {
        _values = values;
        _constant = constant;
    }

    public static StarValues Constant(double value) => new(null, value);

    public static StarValues PerStar(double[] values) => new(values ?? throw new ArgumentNullException(nameof(values)), double.NaN);

    /// <summary>True for <see cref="Constant"/>.</summary>
    public bool IsConstant => _values is null;

    /// <summary>Number of entries for <see cref="PerStar"/>; null for a constant.</summary>
    public int? Length => _values?.Length;

    public double this[int i] => _values is null ? _constant : _values[i];
}
