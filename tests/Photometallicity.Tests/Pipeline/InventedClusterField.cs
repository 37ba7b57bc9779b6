using System.Globalization;
using Photometallicity.Catalogues;
using Photometallicity.Demo;
using Photometallicity.Numerics;

namespace Photometallicity.Tests.Pipeline;

/// <summary>
/// An INVENTED star cluster field for tests: "Quillon Cluster (invented)" at invented coordinates, invented distance,
/// reddening and [Fe/H]. Members lie on the demo's invented red-giant branch (<see cref="DemoTruth.GiantColour"/>)
/// and index relation (<see cref="DemoTruth.GiantIndex"/>) at the cluster's [Fe/H]; foreground stars are spread over
/// the field with random colours and the demo's invented dwarf index offset. Writes a broadband and a narrow-band
/// catalogue in the demo's column layout (b480, r770 / n395), reddened with the demo filters' coefficients.
/// Member ids start with "QM", foreground ids with "QF".
/// </summary>
public static class InventedClusterField
{
    public const string Name = "Quillon Cluster (invented)";
    public const double RaDeg = 201.35, DecDeg = -12.72;   // invented
    public const double Feh = -2.05, FehErr = 0.06;         // invented
    public const double Ebv = 0.06;                         // invented
    public const double DistanceModulus = 14.6;             // invented
    public const double MemberRadiusArcmin = 3.0;           // members lie within this radius (invented)

    /// <summary>Writes cluster_broad.csv and cluster_narrow.csv into <paramref name="dir"/>.</summary>
    public static void Write(string dir, int members = 160, int foreground = 120, ulong seed = 77)
    {
        var rng = new Rng(seed);
        double[] a = DemoFilters.ExtinctionCoefficients();
        int n = members + foreground;
        var id = new string[n]; var ra = new double[n]; var dec = new double[n];
        var b = new double[n]; var be = new double[n]; var r = new double[n]; var re = new double[n];
        var nb = new double[n]; var ne = new double[n];
        double cosDec = Math.Cos(DecDeg * Math.PI / 180);
        for (int i = 0; i < n; i++)
        {
            bool member = i < members;
            double xi, eta, blue0, c0, x0;
            if (member)
            {
                double rad = MemberRadiusArcmin * Math.Sqrt(rng.NextDouble()), ang = 2 * Math.PI * rng.NextDouble();
                (xi, eta) = (rad * Math.Cos(ang), rad * Math.Sin(ang));
                double absB = -2.5 + 4.0 * rng.NextDouble();
                blue0 = absB + DistanceModulus;
                c0 = DemoTruth.GiantColour(absB, Feh) + rng.NextGaussian(0, 0.012);
                x0 = DemoTruth.GiantIndex(c0, Feh) + rng.NextGaussian(0, 0.015);
                id[i] = $"QM{i + 1:D4}";
            }
            else
            {
                (xi, eta) = ((2 * rng.NextDouble() - 1) * 6, (2 * rng.NextDouble() - 1) * 6);
                blue0 = 12 + 5 * rng.NextDouble();
                c0 = 0.3 + 1.5 * rng.NextDouble();
                x0 = DemoTruth.GiantIndex(c0, -0.6) + 0.12 + rng.NextGaussian(0, 0.03);
                id[i] = $"QF{i + 1:D4}";
            }
            ra[i] = RaDeg + xi / 60.0 / cosDec;
            dec[i] = DecDeg + eta / 60.0;
            double err = 0.008 + 0.004 * rng.NextDouble();
            be[i] = re[i] = ne[i] = Math.Round(err, 4);
            b[i] = Math.Round(blue0 + a[0] * Ebv + rng.NextGaussian(0, err), 4);
            r[i] = Math.Round(blue0 - c0 + a[1] * Ebv + rng.NextGaussian(0, err), 4);
            nb[i] = Math.Round(blue0 + x0 + c0 + a[2] * Ebv + rng.NextGaussian(0, err), 4); // X = (n - b) - k (b - r), k = 1
        }
        var broad = new Table(n, "cluster_broad.csv");
        broad.Add(new Column<string>("src", id));
        broad.Add(new Column<double>("ra", ra, unit: "deg"));
        broad.Add(new Column<double>("dec", dec, unit: "deg"));
        broad.Add(new Column<double>("b480", b, unit: "mag"));
        broad.Add(new Column<double>("b480_err", be, unit: "mag"));
        broad.Add(new Column<double>("r770", r, unit: "mag"));
        broad.Add(new Column<double>("r770_err", re, unit: "mag"));
        CatalogueIO.Write(broad, Path.Combine(dir, "cluster_broad.csv"));
        // Narrow band: own ids, reversed order, positions 0.1 arcsec off (invented).
        var order = Enumerable.Range(0, n).Reverse().ToArray();
        var narrow = new Table(n, "cluster_narrow.csv");
        narrow.Add(new Column<string>("nid", order.Select(k => $"QN{k + 1:D4}").ToArray()));
        narrow.Add(new Column<double>("ra", order.Select(k => ra[k] + 0.1 / 3600 / cosDec).ToArray(), unit: "deg"));
        narrow.Add(new Column<double>("dec", order.Select(k => dec[k]).ToArray(), unit: "deg"));
        narrow.Add(new Column<double>("n395", order.Select(k => nb[k]).ToArray(), unit: "mag"));
        narrow.Add(new Column<double>("n395_err", order.Select(k => ne[k]).ToArray(), unit: "mag"));
        CatalogueIO.Write(narrow, Path.Combine(dir, "cluster_narrow.csv"));
    }

    /// <summary>The standards entry for this cluster, with every value given (no table lookup).</summary>
    public static string ConfigEntry(double radiusArcmin = 4.0) => string.Create(CultureInfo.InvariantCulture, $$"""
        { "kind": "cluster", "name": "{{Name}}",
          "broadband":  { "path": "cluster_broad.csv", "id": "src" },
          "narrowband": { "path": "cluster_narrow.csv", "id": "nid" },
          "centre": { "ra": {{RaDeg}}, "dec": {{DecDeg}} }, "radius_arcmin": {{radiusArcmin}},
          "feh": {{Feh}}, "feh_err": {{FehErr}}, "reddening": { "value": {{Ebv}} }, "ridge_degree": 3 }
        """);

    /// <summary>Writes the demo field, this cluster field and a config whose standards are the demo's stars plus the cluster.</summary>
    public static string WriteRun(string dir, int bootstrap = 60, double radiusArcmin = 4.0)
    {
        var field = DemoGenerator.Generate(1500, 5);
        string config = DemoWriter.Write(field, dir, 5);
        Write(dir);
        string text = File.ReadAllText(config);
        const string stars = "\"feh\": \"feh_spec\", \"feh_err\": \"feh_spec_err\" }";
        if (!text.Contains(stars, StringComparison.Ordinal)) throw new InvalidOperationException("demo config layout changed");
        text = text.Replace(stars, stars + ",\n" + ConfigEntry(radiusArcmin), StringComparison.Ordinal)
            .Replace("\"bootstrap\": 300", $"\"bootstrap\": {bootstrap}", StringComparison.Ordinal);
        File.WriteAllText(config, text);
        return config;
    }
}
