using System.Globalization;
using Photometallicity.Healpix;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Healpix;

/// <summary>Checks against Debian's python3-healpy (fixtures made by tests/reference/make_healpix_fixtures.py).</summary>
public class HealpixNestedTest
{
    private static IEnumerable<string[]> Rows(string name) =>
        File.ReadLines(RepoPaths.Fixture("healpix", name)).Where(l => !l.StartsWith('#')).Skip(1).Select(l => l.Split(','));

    private static double D(string s) => double.Parse(s, CultureInfo.InvariantCulture);

    [Fact]
    public void FromRaDec_EqualsHealpy_AtRandomAndEdgePositions()
    {
        int n = 0;
        foreach (var r in Rows("ang2pix.csv"))
        {
            var h = new HealpixNested(int.Parse(r[0]));
            Assert.True(long.Parse(r[3]) == h.FromRaDec(D(r[1]), D(r[2])), $"order {r[0]} ra {r[1]} dec {r[2]}: healpy {r[3]}, ours {h.FromRaDec(D(r[1]), D(r[2]))}");
            n++;
        }
        Assert.True(n > 3000);
    }

    [Fact]
    public void ToRaDec_EqualsHealpyPixelCentres()
    {
        foreach (var r in Rows("pix2ang_neighbours.csv"))
        {
            var h = new HealpixNested(int.Parse(r[0]));
            var (ra, dec) = h.ToRaDec(long.Parse(r[1]));
            double dra = Math.Abs(ra - D(r[2])) % 360;
            Assert.True(Math.Min(dra, 360 - dra) * Math.Cos(dec * Math.PI / 180) < 1e-9 && Math.Abs(dec - D(r[3])) < 1e-9, $"order {r[0]} pixel {r[1]}");
        }
    }

    [Fact]
    public void Neighbours_EqualHealpy()
    {
        foreach (var r in Rows("pix2ang_neighbours.csv"))
        {
            var h = new HealpixNested(int.Parse(r[0]));
            long[] expected = r[4..12].Select(long.Parse).ToArray();
            long[] ours = h.Neighbours(long.Parse(r[1]));
            Assert.True(expected.SequenceEqual(ours), $"order {r[0]} pixel {r[1]}: healpy [{string.Join(",", expected)}], ours [{string.Join(",", ours)}]");
        }
    }

    [Fact]
    public void PixelArea_IsFourPiOverNpix()
    {
        var h = new HealpixNested(3);
        Assert.Equal(768, h.PixelCount);
        Assert.Equal(4 * Math.PI / 768, h.PixelArea, 15);
    }
}
