using Photometallicity.Errors;
using Photometallicity.Metallicity;

namespace Photometallicity.Forecast;

/// <summary>
/// Options of the precision forecast. The posterior is computed exactly as in the assignment (<see cref="Metallicity"/>
/// options, default grid 0.01 dex; a finer grid resolves very small widths better). Reddening E(B-V) makes the observed bands
/// fainter by A = R E(B-V) with the calibration's extinction coefficients R (default 0: ignored). Magnitude searches run over
/// [<see cref="BrightestMag"/>, <see cref="FaintestMag"/>]; bisections stop at <see cref="MagTolerance"/>.
/// </summary>
public sealed record ForecastOptions
{
    public MetallicityOptions Metallicity { get; init; } = new();
    public double Reddening { get; init; }
    public double BrightestMag { get; init; } = 10.0;
    public double FaintestMag { get; init; } = 32.0;
    public double MagTolerance { get; init; } = 0.005;

    public void Validate()
    {
        Metallicity.Validate();
        if (!(Reddening >= 0 && Reddening < 10)) throw new InputException($"config key 'forecast.reddening': E(B-V) = {Reddening} is outside [0, 10) mag");
        if (!(FaintestMag > BrightestMag)) throw new InputException($"config key 'forecast.faintest_mag': {FaintestMag} must exceed brightest_mag = {BrightestMag}");
        if (!(MagTolerance > 0 && MagTolerance <= 0.5)) throw new InputException($"config key 'forecast.mag_tolerance': {MagTolerance} is outside (0, 0.5] mag");
    }
}
