using Photometallicity.Numerics;

namespace Photometallicity.Tests.Numerics;

public class RngTest
{
    [Fact]
    public void SameSeed_SameStream()
    {
        var a = new Rng(42);
        var b = new Rng(42);
        for (int i = 0; i < 100; i++) Assert.Equal(a.NextUInt64(), b.NextUInt64());
    }

    [Fact]
    public void Gaussian_HasUnitMomentsAndNextIntIsUniform()
    {
        var r = new Rng(7);
        int n = 200_000;
        double s = 0, s2 = 0;
        for (int i = 0; i < n; i++) { double g = r.NextGaussian(); s += g; s2 += g * g; }
        Assert.InRange(s / n, -0.01, 0.01);
        Assert.InRange(s2 / n, 0.98, 1.02);
        var counts = new int[5];
        for (int i = 0; i < 50_000; i++) counts[r.NextInt(5)]++;
        Assert.All(counts, c => Assert.InRange(c, 9_500, 10_500));
    }

    [Fact]
    public void Seeds_DependOnName()
    {
        Assert.NotEqual(Seeds.Derive(1, "bootstrap"), Seeds.Derive(1, "membership"));
        Assert.Equal(Seeds.Derive(1, "bootstrap"), Seeds.Derive(1, "bootstrap"));
    }
}
