using Photometallicity.Metallicity;

namespace Photometallicity.Tests.Metallicity;

/// <summary>Checks of the test's own model and of the fast colour slice against the basis (PolynomialBasis2D.Value/Gradient).</summary>
public class ColourSliceTest
{
    [Fact]
    public void Project_ReproducesAnalyticModel()
    {
        var coef = SyntheticCalibration.Project(SyntheticCalibration.Parameters);
        foreach (var (c, f) in new[] { (0.9, -3.4), (1.5, -1.0), (1.9, 0.0) })
            Assert.Equal(SyntheticCalibration.Model(SyntheticCalibration.Parameters, c, f), SyntheticCalibration.Basis.Value(coef, c, f), 10);
    }

    [Fact]
    public void At_MatchesBasisValueAndGradient()
    {
        var basis = SyntheticCalibration.Basis;
        double[] coef = [0.3, -0.2, 0.5, 0.11, -0.07, 0.05, 0.02, -0.03, 0.04, 0.01];
        foreach (var (c, f) in new[] { (0.9, -3.4), (1.5, -1.0), (2.3, 0.4) })
        {
            var (v, dc) = new ColourSlice(basis, coef, c).At(f);
            Assert.Equal(basis.Value(coef, c, f), v, 12);
            Assert.Equal(basis.Gradient(coef, c, f).DColour, dc, 12);
            double h = 1e-4;
            double num = (basis.Value(coef, c + h, f) - 2 * basis.Value(coef, c, f) + basis.Value(coef, c - h, f)) / (h * h);
            Assert.Equal(num, new ColourSlice(basis, coef, c).SecondColourDerivative(f), 5);
        }
    }
}
