using Photometallicity.Photometry;

namespace Photometallicity.Forecast;

/// <summary>The three bands of the index, as used by the forecast.</summary>
public enum ForecastBand
{
    Blue,
    Red,
    Narrow,
}

/// <summary>The photometric error model of each band (blue, red, narrow): fitted from a catalogue or given as 5-sigma depths.</summary>
public sealed record BandErrorModels(PhotometricErrorModel Blue, PhotometricErrorModel Red, PhotometricErrorModel Narrow)
{
    /// <summary>Error models from 5-sigma depths (mag) and one floor (mag) for all bands.</summary>
    public static BandErrorModels FromDepths(double blueDepth, double redDepth, double narrowDepth, double floor) =>
        new(new PhotometricErrorModel("blue", blueDepth, floor), new PhotometricErrorModel("red", redDepth, floor),
            new PhotometricErrorModel("narrow", narrowDepth, floor));

    public PhotometricErrorModel this[ForecastBand band] => band switch
    {
        ForecastBand.Blue => Blue,
        ForecastBand.Red => Red,
        _ => Narrow,
    };

    /// <summary>A copy with one band's model replaced.</summary>
    public BandErrorModels With(ForecastBand band, PhotometricErrorModel model) => band switch
    {
        ForecastBand.Blue => this with { Blue = model },
        ForecastBand.Red => this with { Red = model },
        _ => this with { Narrow = model },
    };
}
