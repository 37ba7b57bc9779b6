using Photometallicity.Reporting;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Reporting;

public class MdfPlotTest
{
    [Fact]
    public void Write_TitleCarriesMeanAndSigmaWithErrors()
    {
        using var dir = new TempDir();
        string[] texts = FigureChecks.Valid(MdfPlot.Write(InventedField.Mdf(), dir.File("mdf")));
        // Each number to the precision of its error (two significant digits of the error: 0.012 and 0.016).
        Assert.Contains(texts, t => t.Contains("⟨[Fe/H]⟩ = −1.500 ± 0.012 dex, σ = 0.300 ± 0.016 dex", StringComparison.Ordinal));
        Assert.Contains("[Fe/H] (dex)", texts);
        Assert.Contains(texts, t => t.StartsWith("median per-star error e = ±", StringComparison.Ordinal));
        Assert.Contains(texts, t => t.StartsWith("observed: √(σ² + e²) = ", StringComparison.Ordinal));
    }

    [Fact]
    public void WeightedMedian_EqualWeights_IsTheMiddleValue()
    {
        Assert.Equal(3.0, MdfPlot.WeightedMedian([0, 1, 2, 3, 4], [5, 1, 3, 2, 4], [1, 1, 1, 1, 1]));
    }

    [Fact]
    public void WeightedMedian_HeavyValue_Dominates()
    {
        // cumulative weights 0.1, 0.2, 1.2 of 1.2: half (0.6) is first reached at the heavy value 9.
        Assert.Equal(9.0, MdfPlot.WeightedMedian([0, 1, 2], [1, 2, 9], [0.1, 0.1, 1.0]));
    }

    [Fact]
    public void Write_NegativeSigma_Throws()
    {
        var d = InventedField.Mdf() with { SigmaDex = -0.1 };
        Assert.Throws<ArgumentOutOfRangeException>(() => MdfPlot.Write(d, Path.Combine(Path.GetTempPath(), "never")));
    }
}
