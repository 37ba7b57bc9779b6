namespace Photometallicity.Photometry;

/// <summary>One number per band of the index: blue and red broadband, narrow band (units given where used).</summary>
public readonly record struct BandValues(double Blue, double Red, double Narrow)
{
    public static BandValues All(double value) => new(value, value, value);
}
