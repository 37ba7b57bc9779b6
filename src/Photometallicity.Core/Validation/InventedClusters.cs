using System.Globalization;
using Photometallicity.Catalogues;
using Photometallicity.Demo;
using Photometallicity.Numerics;

namespace Photometallicity.Validation;

/// <summary>
/// Invented star-cluster fields used as standards by the "cluster" validation fields. Members lie on the demo's
/// invented red-giant branch (<see cref="DemoTruth.GiantColour"/>) and on the field's invented index law at the
/// cluster's [Fe/H]; foreground stars are spread over the field with random colours, off the giant law by the demo's
/// invented dwarf offset. Member ids start with "CM", foreground ids with "CF" (so the truth of every star that
/// enters the calibration is known). EVERY CLUSTER, POSITION AND NUMBER HERE IS INVENTED.
/// </summary>
public static class InventedClusters
{
    public sealed record Cluster(string Name, double RaDeg, double DecDeg, double Feh, double FehErr, double Ebv, double DistanceModulus);

    /// <summary>Five invented clusters spanning [Fe/H] -2.45 to -0.70.</summary>
    public static IReadOnlyList<Cluster> All { get; } =
    [
        new("Quartz Cluster (invented)", 12.35, -31.40, -2.45, 0.08, 0.04, 14.9),
        new("Rutile Cluster (invented)", 75.80, 11.25, -2.00, 0.06, 0.07, 15.3),
        new("Spinel Cluster (invented)", 133.10, -58.05, -1.55, 0.06, 0.05, 14.6),
        new("Topaz Cluster (invented)", 199.45, 27.60, -1.10, 0.07, 0.03, 15.1),
        new("Umber Cluster (invented)", 305.20, -8.90, -0.70, 0.08, 0.06, 14.8),
    ];

    public const double MemberRadiusArcmin = 3.0;  // members lie within this radius (invented)
    public const double ConfigRadiusArcmin = 4.0;  // the config's search radius

    /// <summary>File stem of cluster <paramref name="k"/>.</summary>
    public static string Stem(int k) => $"cluster{k + 1}";

    /// <summary>Writes clusterK_broad.csv and clusterK_narrow.csv for every cluster in the field's column layout.</summary>
    public static void WriteAll(string dir, Func<double, double, double> law, ColumnScheme cols, ulong seed, int members = 160, int foreground = 120)
    {
        double[] a = DemoFilters.ExtinctionCoefficients();
        for (int k = 0; k < All.Count; k++) Write(dir, k, All[k], law, cols, a, Seeds.For(seed, "validation-cluster", k), members, foreground);
    }

    private static void Write(string dir, int k, Cluster c, Func<double, double, double> law, ColumnScheme cols, double[] a, Rng rng, int members, int foreground)
    {
        int n = members + foreground;
        var id = new string[n]; var ra = new double[n]; var dec = new double[n];
        var b = new double[n]; var be = new double[n]; var r = new double[n]; var re = new double[n];
        var nb = new double[n]; var ne = new double[n];
        double cosDec = Math.Cos(c.DecDeg * Math.PI / 180);
        for (int i = 0; i < n; i++)
        {
            bool member = i < members;
            double xi, eta, blue0, c0, x0;
            if (member)
            {
                double rad = MemberRadiusArcmin * Math.Sqrt(rng.NextDouble()), ang = 2 * Math.PI * rng.NextDouble();
                (xi, eta) = (rad * Math.Cos(ang), rad * Math.Sin(ang));
                double absB = -2.5 + 5.0 * rng.NextDouble();
                blue0 = absB + c.DistanceModulus;
                c0 = DemoTruth.GiantColour(absB, c.Feh) + rng.NextGaussian(0, 0.012);
                x0 = law(c0, c.Feh) + rng.NextGaussian(0, 0.015);
                id[i] = $"CM{i + 1:D4}";
            }
            else
            {
                (xi, eta) = ((2 * rng.NextDouble() - 1) * 6, (2 * rng.NextDouble() - 1) * 6);
                blue0 = c.DistanceModulus - 2.5 + 5.5 * rng.NextDouble();
                c0 = 0.3 + 1.5 * rng.NextDouble();
                x0 = law(c0, -0.6) + 0.12 + rng.NextGaussian(0, 0.03);
                id[i] = $"CF{i + 1:D4}";
            }
            ra[i] = DemoGenerator.WrapRa(c.RaDeg + xi / 60.0 / cosDec);
            dec[i] = c.DecDeg + eta / 60.0;
            double err = 0.008 + 0.004 * rng.NextDouble();
            be[i] = re[i] = ne[i] = Math.Round(err, 4);
            b[i] = Math.Round(blue0 + a[0] * c.Ebv + rng.NextGaussian(0, err), 4);
            r[i] = Math.Round(blue0 - c0 + a[1] * c.Ebv + rng.NextGaussian(0, err), 4);
            nb[i] = Math.Round(blue0 + x0 + c0 + a[2] * c.Ebv + rng.NextGaussian(0, err), 4); // X = (n - b) - k (b - r), k = 1
        }
        var broad = new Table(n, Stem(k) + "_broad.csv");
        broad.Add(new Column<string>(cols.BroadId, id));
        broad.Add(new Column<double>(cols.BroadRa, ra, unit: "deg"));
        broad.Add(new Column<double>(cols.BroadDec, dec, unit: "deg"));
        broad.Add(new Column<double>(cols.Blue, b, unit: "mag"));
        broad.Add(new Column<double>(cols.BlueErr, be, unit: "mag"));
        broad.Add(new Column<double>(cols.Red, r, unit: "mag"));
        broad.Add(new Column<double>(cols.RedErr, re, unit: "mag"));
        broad.Add(new Column<double>(cols.Ebv, Enumerable.Repeat(c.Ebv, n).ToArray(), unit: "mag"));
        CatalogueIO.Write(broad, Path.Combine(dir, Stem(k) + "_broad.csv"));
        var order = Enumerable.Range(0, n).Reverse().ToArray(); // narrow band: own ids and order, 0.1 arcsec off (invented)
        var narrow = new Table(n, Stem(k) + "_narrow.csv");
        narrow.Add(new Column<string>(cols.NarrowId, order.Select(j => $"CN{j + 1:D4}").ToArray()));
        narrow.Add(new Column<double>(cols.NarrowRa, order.Select(j => DemoGenerator.WrapRa(ra[j] + 0.1 / 3600 / cosDec)).ToArray(), unit: "deg"));
        narrow.Add(new Column<double>(cols.NarrowDec, order.Select(j => dec[j]).ToArray(), unit: "deg"));
        narrow.Add(new Column<double>(cols.Narrow, order.Select(j => nb[j]).ToArray(), unit: "mag"));
        narrow.Add(new Column<double>(cols.NarrowErr, order.Select(j => ne[j]).ToArray(), unit: "mag"));
        CatalogueIO.Write(narrow, Path.Combine(dir, Stem(k) + "_narrow.csv"));
    }

    /// <summary>The config's standards entries for every cluster (every value given, no table lookup).</summary>
    public static string ConfigEntries(ColumnScheme cols)
    {
        var ci = CultureInfo.InvariantCulture;
        return string.Join(",\n", All.Select((c, k) => string.Create(ci, $$"""
                { "kind": "cluster", "name": "{{c.Name}}",
                  "broadband":  { "path": "{{Stem(k)}}_broad.csv", "id": "{{cols.BroadId}}", "ra": "{{cols.BroadRa}}", "dec": "{{cols.BroadDec}}" },
                  "narrowband": { "path": "{{Stem(k)}}_narrow.csv", "id": "{{cols.NarrowId}}", "ra": "{{cols.NarrowRa}}", "dec": "{{cols.NarrowDec}}" },
                  "centre": { "ra": {{c.RaDeg}}, "dec": {{c.DecDeg}} }, "radius_arcmin": {{ConfigRadiusArcmin}},
                  "feh": {{c.Feh}}, "feh_err": {{c.FehErr}}, "reddening": { "value": {{c.Ebv}} }, "ridge_degree": 3 }
            """)));
    }
}
