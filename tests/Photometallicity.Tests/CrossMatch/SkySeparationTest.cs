using System.Globalization;
using Photometallicity.CrossMatch;
using Photometallicity.Units;

namespace Photometallicity.Tests.CrossMatch;

public class SkySeparationTest
{
    private static IEnumerable<double[]> FixtureRows() =>
        File.ReadLines(Path.Combine(CrossMatchFixtureField.FixtureDir, "separations.csv"))
            .Where(l => !l.StartsWith('#')).Skip(1)
            .Select(l => l.Split(',').Select(x => double.Parse(x, CultureInfo.InvariantCulture)).ToArray());

    // Source: astropy SkyCoord.separation (version recorded in separations.csv), on pairs across RA = 0/360,
    // at |Dec| > 89 deg and at the poles, 0.1-10 mas apart, arcsec to degrees apart, and near-antipodal.
    // Tolerance: 1e-9 relative or 1e-9 arcsec, whichever is larger.
    [Fact]
    public void Between_AgreesWithAstropySeparation()
    {
        int n = 0;
        foreach (var r in FixtureRows())
        {
            double got = SkySeparation.Between(r[0], r[1], r[2], r[3]).Arcseconds;
            Assert.True(Math.Abs(got - r[4]) <= Math.Max(1e-9, 1e-9 * r[4]),
                $"({r[0]}, {r[1]}) - ({r[2]}, {r[3]}): {got} arcsec, astropy {r[4]}");
            n++;
        }
        Assert.True(n > 100, $"only {n} fixture rows");
    }

    // Source: astropy SkyCoord.separation, as above; the array form must give the same numbers.
    [Fact]
    public void Arcseconds_ArrayFormMatchesScalarAndAstropy()
    {
        var rows = FixtureRows().ToArray();
        var got = SkySeparation.Arcseconds(rows.Select(r => r[0]).ToArray(), rows.Select(r => r[1]).ToArray(),
            rows.Select(r => r[2]).ToArray(), rows.Select(r => r[3]).ToArray());
        for (int i = 0; i < rows.Length; i++)
        {
            Assert.Equal(SkySeparation.Arcseconds(rows[i][0], rows[i][1], rows[i][2], rows[i][3]), got[i]);
            Assert.True(Math.Abs(got[i] - rows[i][4]) <= Math.Max(1e-9, 1e-9 * rows[i][4]));
        }
    }

    // Source: spherical geometry (a meridian arc of 1 mas is 1 mas; the pole-to-pole distance is 180 deg).
    [Fact]
    public void Between_ExactAtOneMasAndAtAntipodes()
    {
        double mas = 1.0 / 3.6e6;
        double d1 = -89.9, d2 = -89.9 + mas;
        // d2 - d1 is exact in doubles (Sterbenz); what remains is the rounding of degrees to radians (~5e-11 arcsec).
        Assert.Equal((d2 - d1) * 3600.0, SkySeparation.Between(123.4, d1, 123.4, d2).Arcseconds, 10);
        Assert.Equal(1e-3, SkySeparation.Between(123.4, d1, 123.4, d2).Arcseconds, 9);
        Assert.Equal(180.0, SkySeparation.Between(SkyPosition.FromDegrees(0, 90), SkyPosition.FromDegrees(0, -90)).Degrees, 12);
        Assert.Equal(2e-3, SkySeparation.Between(359.9999999, 0.0, 359.9999999 + 2 * mas - 360.0, 0.0).Arcseconds, 9);
    }
}
