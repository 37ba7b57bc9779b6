using System.Text.Json;
using Photometallicity.Numerics;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.CrossMatch;

/// <summary>
/// A synthetic field of tests/fixtures/crossmatch/fields.json: the positions are drawn here with the same
/// generator and arithmetic as tests/reference/make_crossmatch_fixtures.py (so they are not stored), and the
/// answers astropy gave are read from the field's binary file. All positions are invented.
/// </summary>
public sealed class CrossMatchFixtureField
{
    public required string Name { get; init; }
    public required double[] LeftRa { get; init; }
    public required double[] LeftDec { get; init; }
    public required double[] RightRa { get; init; }
    public required double[] RightDec { get; init; }
    public required int[] AstropyNearest { get; init; }
    public required double[] AstropyNearestArcsec { get; init; }
    public required int[] ReferenceOneToOne { get; init; }
    public required double RadiusArcsec { get; init; }
    public required string[][] Probe { get; init; }

    public static string FixtureDir => RepoPaths.Fixture("crossmatch");

    public static CrossMatchFixtureField Load(string name)
    {
        using var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(FixtureDir, "fields.json")));
        var f = doc.RootElement.GetProperty("fields").EnumerateArray().First(e => e.GetProperty("name").GetString() == name);
        var (lra, ldec, rra, rdec) = Generate(f.GetProperty("seed").GetUInt64(), f.GetProperty("n").GetInt32(),
            f.GetProperty("ra0").GetDouble(), f.GetProperty("ra_width").GetDouble(), f.GetProperty("dec0").GetDouble(),
            f.GetProperty("dec_width").GetDouble(), f.GetProperty("keep").GetDouble(), f.GetProperty("jitter_ra").GetDouble(),
            f.GetProperty("jitter_dec").GetDouble(), f.GetProperty("spurious").GetInt32());
        var bytes = File.ReadAllBytes(Path.Combine(FixtureDir, f.GetProperty("file").GetString()!));
        int n = lra.Length;
        Assert.Equal(16 * n, bytes.Length);
        var nn = new int[n];
        var sep = new double[n];
        var one = new int[n];
        for (int i = 0; i < n; i++)
        {
            nn[i] = BitConverter.ToInt32(bytes, 16 * i);
            sep[i] = BitConverter.ToDouble(bytes, 16 * i + 4);
            one[i] = BitConverter.ToInt32(bytes, 16 * i + 12);
        }
        var probe = f.GetProperty("probe").EnumerateArray().Select(p => p.EnumerateArray().Select(x => x.GetString()!).ToArray()).ToArray();
        Assert.Equal(f.GetProperty("right_count").GetInt32(), rra.Length);
        return new CrossMatchFixtureField
        {
            Name = name, LeftRa = lra, LeftDec = ldec, RightRa = rra, RightDec = rdec, AstropyNearest = nn,
            AstropyNearestArcsec = sep, ReferenceOneToOne = one, RadiusArcsec = f.GetProperty("radius_arcsec").GetDouble(), Probe = probe,
        };
    }

    /// <summary>Same algorithm as generate_field in make_crossmatch_fixtures.py.</summary>
    public static (double[] LeftRa, double[] LeftDec, double[] RightRa, double[] RightDec) Generate(ulong seed, int n,
        double ra0, double raWidth, double dec0, double decWidth, double keep, double jitterRa, double jitterDec, int spurious)
    {
        var rng = new Rng(seed);
        var lra = new double[n];
        var ldec = new double[n];
        for (int i = 0; i < n; i++)
        {
            lra[i] = Wrap(ra0 + raWidth * rng.NextDouble());
            ldec[i] = dec0 + decWidth * rng.NextDouble();
        }
        var rra = new List<double>();
        var rdec = new List<double>();
        for (int i = 0; i < n; i++)
        {
            if (rng.NextDouble() < keep)
            {
                rra.Add(Wrap(lra[i] + (rng.NextDouble() - 0.5) * jitterRa));
                rdec.Add(Math.Min(90.0, ldec[i] + (rng.NextDouble() - 0.5) * jitterDec));
            }
        }
        for (int i = 0; i < spurious; i++)
        {
            rra.Add(Wrap(ra0 + raWidth * rng.NextDouble()));
            rdec.Add(dec0 + decWidth * rng.NextDouble());
        }
        return (lra, ldec, rra.ToArray(), rdec.ToArray());
    }

    private static double Wrap(double ra)
    {
        if (ra >= 360.0) ra -= 360.0;
        if (ra < 0.0) ra += 360.0;
        return ra;
    }
}
