using System.Globalization;
using Microsoft.Extensions.Logging.Abstractions;
using Photometallicity.Catalogues;
using Photometallicity.Configuration;
using Photometallicity.Pipeline;
using Photometallicity.Tests.Support;
using Photometallicity.Tiling;

namespace Photometallicity.Tests.Tiling;

/// <summary>
/// The committed invented field rotated rigidly on the sphere so that its centre sits 0.3 deg from the north
/// celestial pole (every RA from 0 to 360 occurs, across the RA = 0 seam and several HEALPix base faces), then run
/// whole and tiled: every per-star value equal bit for bit.
/// </summary>
public class TiledPoleRunTest
{
    private static readonly (double Ra, double Dec) From = (137.62, -38.47), To = (30.0, 89.7);

    [Fact]
    public void TiledRun_NearThePole_EqualsTheWholeFieldRunBitForBit()
    {
        using var dir = new TempDir();
        var rotate = Rotation(From, To);
        foreach (var (name, ra, dec) in new[] { ("broad.csv", "ra", "dec"), ("narrow.csv", "ra", "dec"), ("standards.csv", "ra", "dec") })
        {
            var t = CatalogueIO.Read(RepoPaths.Samples(name), new ReadOptions { TextColumns = new HashSet<string> { "src", "nid", "star", "truth_note" } });
            double[] a = t.RequireDoubles(ra), d = t.RequireDoubles(dec);
            var cols = t.Columns.Where(c => c.Name != ra && c.Name != dec).ToList();
            var (a2, d2) = (new double[a.Length], new double[a.Length]);
            for (int i = 0; i < a.Length; i++) (a2[i], d2[i]) = rotate(a[i], d[i]);
            var outTable = new Table([cols[0], new Column<double>(ra, a2), new Column<double>(dec, d2), .. cols.Skip(1)]);
            CatalogueIO.Write(outTable, dir.File(name));
        }
        Directory.CreateDirectory(dir.File("filters"));
        foreach (var f in Directory.GetFiles(RepoPaths.Samples("filters"))) File.Copy(f, Path.Combine(dir.File("filters"), Path.GetFileName(f)));
        string config = File.ReadAllText(RepoPaths.Samples("config.json"))
            .Replace("\"ra\": 137.62, \"dec\": -38.47", string.Create(CultureInfo.InvariantCulture, $"\"ra\": {To.Ra}, \"dec\": {To.Dec}"));
        Assert.Contains("89.7", config);
        File.WriteAllText(dir.File("config.json"), config);

        var cfg = ConfigLoader.Load(dir.File("config.json"));
        var log = NullLogger.Instance;
        var whole = PipelineRunner.Run(cfg, log);
        var plan = SurveySplitter.Split(cfg, new SplitOptions(6), dir.File("work"), log);
        Assert.True(plan.Tiles.Count >= 3, $"{plan.Tiles.Count} tiles");
        foreach (var t in plan.Tiles) TileRunner.Run(plan, t.Index, log);
        var merged = PipelineRunner.Run(cfg, log, scope: new RunScope { Precomputed = TileMerger.Gather(plan, log) });

        var a0 = whole.Stars!;
        var b0 = merged.Stars!;
        Assert.True(whole.Match.Matched > 3000, $"{whole.Match.Matched} matched");
        Assert.Equal(Strings(a0.NarrowId), Strings(b0.NarrowId));
        Assert.Equal(a0.Status, b0.Status);
        foreach (var (x, y, name) in new[] { (a0.Feh, b0.Feh, "feh"), (a0.PMember, b0.PMember, "p_member"), (a0.MatchSepArcsec, b0.MatchSepArcsec, "match_sep") })
            Assert.True(x.Select(BitConverter.DoubleToInt64Bits).SequenceEqual(y.Select(BitConverter.DoubleToInt64Bits)), name);
    }

    /// <summary>The rotation about the axis perpendicular to both unit vectors that carries <paramref name="from"/> onto <paramref name="to"/> (Rodrigues' formula).</summary>
    private static Func<double, double, (double, double)> Rotation((double Ra, double Dec) from, (double Ra, double Dec) to)
    {
        static (double, double, double) V(double ra, double dec)
        {
            double a = ra * Math.PI / 180, d = dec * Math.PI / 180;
            return (Math.Cos(d) * Math.Cos(a), Math.Cos(d) * Math.Sin(a), Math.Sin(d));
        }
        var (ax, ay, az) = V(from.Ra, from.Dec);
        var (bx, by, bz) = V(to.Ra, to.Dec);
        double kx = ay * bz - az * by, ky = az * bx - ax * bz, kz = ax * by - ay * bx;
        double s = Math.Sqrt(kx * kx + ky * ky + kz * kz), c = ax * bx + ay * by + az * bz;
        kx /= s; ky /= s; kz /= s;
        return (ra, dec) =>
        {
            var (x, y, z) = V(ra, dec);
            double kdv = kx * x + ky * y + kz * z;
            double cx = ky * z - kz * y, cy = kz * x - kx * z, cz = kx * y - ky * x;
            double rx = x * c + cx * s + kx * kdv * (1 - c), ry = y * c + cy * s + ky * kdv * (1 - c), rz = z * c + cz * s + kz * kdv * (1 - c);
            double r = Math.Atan2(ry, rx) * 180 / Math.PI;
            return (r < 0 ? r + 360 : r, Math.Asin(Math.Clamp(rz, -1, 1)) * 180 / Math.PI);
        };
    }

    private static string?[] Strings(Photometallicity.Catalogues.Column c) => Enumerable.Range(0, c.Length).Select(c.GetString).ToArray();
}
