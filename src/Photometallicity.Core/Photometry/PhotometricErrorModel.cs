namespace Photometallicity.Photometry;

/// <summary>
/// Magnitude error against magnitude for one band: sigma(m) = sqrt((1.0857 / SNR(m))^2 + Floor^2) with
/// SNR(m) = 5 * 10^(-0.4 (m - Depth5Sigma)), i.e. background-limited noise reaching S/N = 5 at the 5-sigma depth.
/// 1.0857 = 2.5 / ln 10 converts a fractional flux error to magnitudes (common practice). The floor stands for
/// flat-fielding and calibration errors.
/// </summary>
public sealed record PhotometricErrorModel(string Band, double Depth5Sigma, double Floor)
{
    public const double MagPerFractionalFlux = 1.0857362047581294; // 2.5 / ln(10)

    public double SignalToNoise(double mag) => 5.0 * Math.Pow(10.0, -0.4 * (mag - Depth5Sigma));

    public double Sigma(double mag)
    {
        double s = MagPerFractionalFlux / SignalToNoise(mag);
        return Math.Sqrt(s * s + Floor * Floor);
    }

    /// <summary>The magnitude at which the error (without the floor) reaches <paramref name="sigma"/>.</summary>
    public double MagnitudeAtSigma(double sigma)
    {
        if (sigma <= Floor) return double.NegativeInfinity;
        double noise = Math.Sqrt(sigma * sigma - Floor * Floor);
        double snr = MagPerFractionalFlux / noise;
        return Depth5Sigma - 2.5 * Math.Log10(snr / 5.0);
    }
}
