using Photometallicity.Forecast;
using Photometallicity.Metallicity;
using Photometallicity.Tests.Metallicity;

namespace Photometallicity.Tests.Forecast;

/// <summary>
/// The forecast on the invented model of <see cref="SyntheticCalibration"/> (all ensemble members equal to the best fit, so the
/// calibration adds no error): against the small-error limit sigma_FeH = sigma_eff / |df/dFeH| (first-order error
/// propagation, common practice), the covariance formulas against a Monte Carlo of the band errors, and the searches against
/// the precision they promise. Depths and floors are invented.
/// </summary>
public class PrecisionForecasterTest
{
    private static readonly Lazy<PrecisionForecaster> Forecaster = new(() => new PrecisionForecaster(
        SyntheticCalibration.Build(8, 0.01, 3, exactEnsemble: true),
        BandErrorModels.FromDepths(25.0, 24.5, 23.5, 0.005),
        new ForecastOptions { Metallicity = new MetallicityOptions { GridStep = 0.002 } }));

    [Theory]
    [InlineData(18.0, 1.4, -1.0)]
    [InlineData(19.0, 1.0, -0.7)]
    [InlineData(18.5, 1.8, -1.5)]
    public void Precision_SmallErrors_MatchesFirstOrderPropagation(double blue, double colour, double feh)
    {
        var p = Forecaster.Value.Precision(blue, colour, feh);
        Assert.Equal(MetallicityStatus.Ok, p.Status);
        // The analytic slope is the model's own: check it against the invented analytic form.
        Assert.Equal(SyntheticCalibration.SlopeFeh(SyntheticCalibration.Parameters, colour, feh), p.DIndexDFeh, 9);
        Assert.InRange(p.SigmaFehAnalytic, 0.02, 0.2);
        Assert.Equal(1.0, p.SigmaFeh / p.SigmaFehAnalytic, 0.03);
        Assert.Equal(feh, p.FehMedian, 0.01);
        Assert.Equal(p.SigmaFehAnalytic, p.SigmaFehAnalyticCalibration, 9); // identical members: no calibration spread
    }

    [Fact]
    public void Precision_IndexCovariance_MatchesMonteCarloOfBandErrors()
    {
        var p = Forecaster.Value.Precision(19.0, 1.4, -1.0); // bright: index and colour errors well correlated, so the MC is precise
        var rng = new Photometallicity.Numerics.Rng(99);
        double k = SyntheticCalibration.K;
        int n = 200_000;
        double sx = 0, sc = 0, sxc = 0;
        for (int i = 0; i < n; i++)
        {
            double db = p.SigmaBlue * rng.NextGaussian(), dr = p.SigmaRed * rng.NextGaussian(), dn = p.SigmaNarrow * rng.NextGaussian();
            double dc = db - dr, dx = (dn - db) - k * dc; // X = (narrow - blue) - k (blue - red)
            sx += dx * dx; sc += dc * dc; sxc += dx * dc;
        }
        Assert.Equal(1.0, Math.Sqrt(sx / n) / p.SigmaIndex, 0.01);
        Assert.Equal(1.0, Math.Sqrt(sc / n) / p.SigmaColour, 0.01);
        Assert.Equal(1.0, sxc / n / p.CovIndexColour, 0.02);
    }

    [Fact]
    public void Precision_GrowsWithMagnitude()
    {
        var rows = Forecaster.Value.PrecisionGrid([19.0, 21.0, 23.0], [1.4], [-1.0]);
        Assert.True(rows[0].SigmaFeh < rows[1].SigmaFeh && rows[1].SigmaFeh < rows[2].SigmaFeh);
    }

    [Fact]
    public void FaintestMagnitude_ReachesPrecisionThereAndNotFainter()
    {
        var f = Forecaster.Value;
        var r = f.FaintestMagnitude(22.0, 1.4, -1.0, 0.15);
        Assert.Equal(ForecastStatus.Ok, r.Status);
        Assert.Equal(r.BlueApparent - 22.0, r.BlueAbsolute, 12);
        Assert.True(f.Precision(r.BlueApparent - 0.02, 1.4, -1.0).SigmaFeh <= 0.15);
        Assert.True(f.Precision(r.BlueApparent + 0.02, 1.4, -1.0).SigmaFeh > 0.15);
        // Floors and intrinsic scatter bound the precision from below: 0.01 dex is out of reach at any magnitude.
        Assert.Equal(ForecastStatus.NotReachable, f.FaintestMagnitude(22.0, 1.4, -1.0, 0.01).Status);
        Assert.Equal(ForecastStatus.OutsideCalibration, f.FaintestMagnitude(22.0, 2.5, -1.0, 0.15).Status);
    }

    [Fact]
    public void RequiredDepth_NarrowBand_BoundaryAndUnreachable()
    {
        var f = Forecaster.Value;
        var r = f.RequiredDepth(ForecastBand.Narrow, 21.5, 1.4, -1.0, 0.1);
        Assert.Equal(ForecastStatus.Ok, r.Status);
        Assert.Equal(23.5, r.CurrentDepth5Sigma);
        var deeper = new PrecisionForecaster(SyntheticCalibration.Build(8, 0.01, 3, exactEnsemble: true),
            BandErrorModels.FromDepths(25.0, 24.5, r.RequiredDepth5Sigma + 0.02, 0.005),
            new ForecastOptions { Metallicity = new MetallicityOptions { GridStep = 0.002 } });
        Assert.True(deeper.Precision(21.5, 1.4, -1.0).SigmaFeh <= 0.1);
        var shallower = new PrecisionForecaster(SyntheticCalibration.Build(8, 0.01, 3, exactEnsemble: true),
            BandErrorModels.FromDepths(25.0, 24.5, r.RequiredDepth5Sigma - 0.02, 0.005),
            new ForecastOptions { Metallicity = new MetallicityOptions { GridStep = 0.002 } });
        Assert.True(shallower.Precision(21.5, 1.4, -1.0).SigmaFeh > 0.1);
        // At blue = 21.5 the blue error (0.010 mag, entering the index as (1 + k) sb = 0.021 mag) and sigma_int = 0.01 keep
        // sigma_eff above ~0.025 mag: at 0.286 mag/dex, 0.05 dex cannot be reached by deepening the narrow band alone.
        Assert.Equal(ForecastStatus.NotReachable, f.RequiredDepth(ForecastBand.Narrow, 21.5, 1.4, -1.0, 0.05).Status);
    }

    [Fact]
    public void ToTable_ColumnsCarryUnits()
    {
        var f = Forecaster.Value;
        var t = ForecastTable.ToTable(f.PrecisionGrid([20.0, 21.0], [1.4], [-1.0]));
        Assert.Equal(2, t.RowCount);
        Assert.Equal("dex", t["sigma_feh"].Unit);
        Assert.Equal("mag", t["blue_mag"].Unit);
        var l = ForecastTable.ToTable([f.FaintestMagnitude(22.0, 1.4, -1.0, 0.15)]);
        Assert.Equal("mag", l["blue_absolute"].Unit);
        Assert.Equal("Ok", l["status"].GetString(0));
        var d = ForecastTable.ToTable([f.RequiredDepth(ForecastBand.Red, 21.0, 1.4, -1.0, 0.1)]);
        Assert.Equal("red", d["band"].GetString(0));
    }
}
