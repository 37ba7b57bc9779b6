using Photometallicity.Errors;
using Photometallicity.Numerics;
using Photometallicity.Photometry;

namespace Photometallicity.Tests.Photometry;

public class PhotometryPreparerTest
{
    private static readonly BandValues R = new(3.6, 1.9, 4.5);

    private static PhotometryOptions Options(double k = 1.1) => new() { ExtinctionCoefficients = R, ColourCoefficient = k };

    private static PhotometryInputs One(double b, double sb, double r, double sr, double n, double sn, bool match, double ebv, double sE) => new()
    {
        BlueMag = [b], BlueErr = [sb], RedMag = [r], RedErr = [sr], NarrowMag = [n], NarrowErr = [sn], HasNarrowMatch = [match],
        Ebv = StarValues.Constant(ebv), EbvErr = StarValues.Constant(sE),
    };

    [Fact]
    public void Run_DereddensAndFormsColourAndIndex()
    {
        // Hand calculation from the definitions m0 = m + zp - R E, C0 = b0 - r0, X0 = (n0 - b0) - k C0.
        var opt = Options() with { ZeroPoints = new BandValues(0.02, -0.01, 0.05) };
        var p = PhotometryPreparer.Run(One(20.0, 0.02, 18.8, 0.02, 21.5, 0.05, true, 0.1, 0.0), opt).Photometry;
        double b0 = 20.02 - 0.36, r0 = 18.79 - 0.19, n0 = 21.55 - 0.45;
        Assert.Equal(b0, p.Blue0[0], 12);
        Assert.Equal(r0, p.Red0[0], 12);
        Assert.Equal(n0, p.Narrow0[0], 12);
        Assert.Equal(b0 - r0, p.Colour0[0], 12);
        Assert.Equal(n0 - b0 - 1.1 * (b0 - r0), p.Index0[0], 12);
        Assert.Equal(PhotometryStatus.Ok, p.Status[0]);
        Assert.True(p.IsUsable(0));
    }

    [Fact]
    public void Run_CovarianceMatchesMonteCarlo()
    {
        // Independent check: 10^6 Monte Carlo draws of the three magnitudes and E(B-V) (Photometallicity.Numerics.Rng),
        // each pushed through the preparer; sample variances and covariance of (X0, C0) against the analytic ones
        // (first-order propagation, exact for this linear map), within 1%.
        const int n = 1_000_000;
        double k = 1.1, sb = 0.03, sr = 0.02, sn = 0.06, sE = 0.04;
        var rng = Seeds.For(12345, "photometry-covariance-test");
        double[] b = new double[n], r = new double[n], nb = new double[n], ebv = new double[n];
        for (int i = 0; i < n; i++)
        {
            b[i] = 21.0 + sb * rng.NextGaussian();
            r[i] = 19.8 + sr * rng.NextGaussian();
            nb[i] = 22.6 + sn * rng.NextGaussian();
            ebv[i] = 0.08 + sE * rng.NextGaussian();
        }
        var inputs = new PhotometryInputs
        {
            BlueMag = b, BlueErr = Filled(n, sb), RedMag = r, RedErr = Filled(n, sr), NarrowMag = nb, NarrowErr = Filled(n, sn),
            HasNarrowMatch = Enumerable.Repeat(true, n).ToArray(), Ebv = StarValues.PerStar(ebv), EbvErr = StarValues.Constant(sE),
        };
        var p = PhotometryPreparer.Run(inputs, Options(k)).Photometry;
        double mc = 0, mx = 0;
        for (int i = 0; i < n; i++) { mc += p.Colour0[i]; mx += p.Index0[i]; }
        mc /= n; mx /= n;
        double vcc = 0, vxx = 0, vxc = 0;
        for (int i = 0; i < n; i++)
        {
            double dc = p.Colour0[i] - mc, dx = p.Index0[i] - mx;
            vcc += dc * dc; vxx += dx * dx; vxc += dx * dc;
        }
        vcc /= n - 1; vxx /= n - 1; vxc /= n - 1;
        Assert.InRange(vcc / p.VarColour[0], 0.99, 1.01);
        Assert.InRange(vxx / p.VarIndex[0], 0.99, 1.01);
        Assert.InRange(vxc / p.CovIndexColour[0], 0.99, 1.01);

        // And the closed forms written out (the expressions), so the analytic side is checked too.
        double dC = -(R.Blue - R.Red), dX = -(R.Narrow - R.Blue) + k * (R.Blue - R.Red);
        Assert.Equal(sb * sb + sr * sr + dC * dC * sE * sE, p.VarColour[0], 14);
        Assert.Equal(sn * sn + (1 + k) * (1 + k) * sb * sb + k * k * sr * sr + dX * dX * sE * sE, p.VarIndex[0], 14);
        Assert.Equal(-(1 + k) * sb * sb - k * sr * sr + dX * dC * sE * sE, p.CovIndexColour[0], 14);
    }

    private static double[] Filled(int n, double v)
    {
        var a = new double[n];
        Array.Fill(a, v);
        return a;
    }

    [Fact]
    public void Run_StatusCodes()
    {
        double nan = double.NaN;
        var inputs = new PhotometryInputs
        {
            //            ok     nomatch nbmiss  bbmiss  bigerr  nbbig   flag    colour  redd
            BlueMag =   [20.0,  20.0,  20.0,  nan,   20.0,  20.0,  20.0,  20.0,  20.0],
            BlueErr =   [0.02,  0.02,  0.02,  0.02,  0.5,   0.02,  0.02,  0.02,  0.02],
            RedMag =    [18.8,  18.8,  18.8,  18.8,  18.8,  18.8,  18.8,  16.0,  18.8],
            RedErr =    [0.02,  0.02,  0.02,  0.02,  0.02,  0.02,  0.02,  0.02,  0.02],
            NarrowMag = [21.5,  nan,   nan,   21.5,  21.5,  21.5,  21.5,  21.5,  21.5],
            NarrowErr = [0.05,  nan,   0.05,  0.05,  0.05,  0.4,   0.05,  0.05,  0.05],
            HasNarrowMatch = [true, false, true, true, true, true, true, true, true],
            Ebv = StarValues.PerStar([0.05, 0.05, 0.05, 0.05, 0.05, 0.05, 0.05, 0.05, nan]),
            CatalogueFlagged = PhotometryInputs.FlagsFromCodes([0, 0, 0, 0, 0, 0, 4, 0, 0]),
        };
        var opt = Options() with { ColourMin = 0.5, ColourMax = 2.5 };
        var result = PhotometryPreparer.Run(inputs, opt);
        var p = result.Photometry;
        Assert.Equal(
            [PhotometryStatus.Ok, PhotometryStatus.NoNarrowMatch, PhotometryStatus.NarrowMissing, PhotometryStatus.BroadbandMissing,
             PhotometryStatus.ErrorTooLarge, PhotometryStatus.NarrowErrorTooLarge, PhotometryStatus.CatalogueFlag,
             PhotometryStatus.ColourOutOfRange, PhotometryStatus.ReddeningMissing],
            p.Status);
        Assert.True(double.IsNaN(p.Index0[1]) && double.IsFinite(p.Colour0[1]) && p.HasUsableColour(1));
        Assert.True(p.HasUsableColour(5) && !p.IsUsable(5) && double.IsFinite(p.Index0[5]));
        Assert.True(double.IsNaN(p.Colour0[3]) && !p.HasUsableColour(3));
        Assert.True(double.IsNaN(p.Blue0[8]) && double.IsNaN(p.Colour0[8]));
        Assert.Equal(1, result.Diagnostics.Usable);
        Assert.Equal(4, result.Diagnostics.UsableColour);
        Assert.Equal(1, result.Diagnostics.FlagCounts[PhotometryStatus.ColourOutOfRange]);
    }

    [Fact]
    public void Run_NegativeReddeningErrorIsReddeningMissing()
    {
        var p = PhotometryPreparer.Run(One(20, 0.02, 19, 0.02, 21, 0.05, true, 0.05, -0.01), Options()).Photometry;
        Assert.Equal(PhotometryStatus.ReddeningMissing, p.Status[0]);
        Assert.True(double.IsNaN(p.Index0[0]) && double.IsNaN(p.VarColour[0]));
    }

    [Fact]
    public void Run_RejectsBadOptionsAndShapes()
    {
        var input = One(20, 0.02, 19, 0.02, 21, 0.05, true, 0.05, 0.0);
        Assert.Throws<InputException>(() => PhotometryPreparer.Run(input, Options() with { MaxError = BandValues.All(0) }));
        Assert.Throws<InputException>(() => PhotometryPreparer.Run(input, Options() with { ColourMin = 2, ColourMax = 1 }));
        var bad = new PhotometryInputs
        {
            BlueMag = [1, 2], BlueErr = [1], RedMag = [1, 2], RedErr = [1, 2], NarrowMag = [1, 2], NarrowErr = [1, 2],
            HasNarrowMatch = [true, true], Ebv = StarValues.Constant(0),
        };
        Assert.Throws<ArgumentException>(() => PhotometryPreparer.Run(bad, Options()));
    }
}
