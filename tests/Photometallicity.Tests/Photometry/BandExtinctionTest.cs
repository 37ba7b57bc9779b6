using Photometallicity.Errors;
using Photometallicity.Photometry.Extinction;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Photometry;

public class BandExtinctionTest
{
    private static FilterCurve Boxcar(double lo, double hi, double step)
    {
        int n = (int)Math.Round((hi - lo) / step) + 1;
        var w = Enumerable.Range(0, n).Select(i => lo + i * step).ToArray();
        return FilterCurve.FromArrays("box", w, Enumerable.Repeat(1.0, n).ToArray());
    }

    [Fact]
    public void Compute_NarrowBandTendsToTheLawAtItsCentre()
    {
        // Limit of the definition: a 2 A wide band measures A/A_V at its centre.
        var law = new CardelliClaytonMathis1989();
        var r = BandExtinction.Compute(Boxcar(4999, 5001, 0.5), law, 3.1);
        Assert.Equal(law.AOverAV(5000, 3.1), r.AOverAv, 6);
        Assert.Equal(3.1 * r.AOverAv, r.AOverEbv, 12);
        Assert.Equal(5000, r.LambdaEffAngstrom, 3);
    }

    [Fact]
    public void Compute_BoxcarEffectiveWavelengthIsAnalytic()
    {
        // Flat S and F_lambda: lambda_eff = Int l^2 dl / Int l dl = (2/3)(b^3 - a^3)/(b^2 - a^2) (closed form).
        double a = 4000, b = 6000;
        var r = BandExtinction.Compute(Boxcar(a, b, 1), new ODonnell1994(), 3.1);
        Assert.Equal(2.0 / 3.0 * (b * b * b - a * a * a) / (b * b - a * a), r.LambdaEffAngstrom, 2);
    }

    [Fact]
    public void Compute_HotBlackBodyApproachesRayleighJeans()
    {
        // Rayleigh-Jeans limit of Planck's law: B_lambda ~ lambda^-4 when h c / (lambda k T) << 1, so
        // lambda_eff = Int l^-2 dl / Int l^-3 dl for a boxcar (closed form), to 0.1% at T = 10^6 K.
        double a = 4000, b = 6000;
        var r = BandExtinction.Compute(Boxcar(a, b, 1), new ODonnell1994(), 3.1, teffK: 1.0e6);
        double expected = (1 / a - 1 / b) / (0.5 * (1 / (a * a) - 1 / (b * b)));
        Assert.InRange(r.LambdaEffAngstrom / expected - 1, -1e-3, 1e-3);
    }

    [Fact]
    public void Compute_CoolerSourceShiftsRedBandRedward()
    {
        var curve = FilterCurve.Load(RepoPaths.Calibration("filters", "invented_blue_b480.csv"));
        var law = new Fitzpatrick1999();
        var flat = BandExtinction.Compute(curve, law, 3.1);
        var cool = BandExtinction.Compute(curve, law, 3.1, 3500);
        Assert.True(cool.LambdaEffAngstrom > flat.LambdaEffAngstrom);
        Assert.True(cool.AOverEbv < flat.AOverEbv);
    }

    [Fact]
    public void Compute_RejectsCurveOutsideLawDomainAndBadOptions()
    {
        var curve = Boxcar(800, 1200, 10);
        var e = Assert.Throws<InputException>(() => BandExtinction.Compute(curve, new CardelliClaytonMathis1989(), 3.1));
        Assert.Contains("ccm89", e.Message);
        Assert.Throws<InputException>(() => BandExtinction.Compute(Boxcar(4000, 5000, 10), new CardelliClaytonMathis1989(), -1));
        Assert.Throws<InputException>(() => BandExtinction.Compute(Boxcar(4000, 5000, 10), new CardelliClaytonMathis1989(), 3.1, 10));
    }

    [Fact]
    public void FromFile_EqualsLoadAndCompute()
    {
        string path = RepoPaths.Calibration("filters", "invented_red_r770.csv");
        var a = BandExtinction.FromFile(path, "odonnell94", 3.3, 4000);
        var b = BandExtinction.Compute(FilterCurve.Load(path), new ODonnell1994(), 3.3, 4000);
        Assert.Equal(b, a);
        Assert.Throws<InputException>(() => BandExtinction.FromFile(path, "nope"));
    }
}
