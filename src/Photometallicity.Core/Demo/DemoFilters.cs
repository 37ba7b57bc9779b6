using System.Reflection;
using Photometallicity.Catalogues;
using Photometallicity.Photometry.Extinction;

namespace Photometallicity.Demo;

/// <summary>
/// The invented demo filter set (transmission curves shipped in calibration/filters/ and embedded in the program):
/// blue "b480", red "r770" and the Ca II H&amp;K narrow band "n395". All invented.
/// </summary>
public static class DemoFilters
{
    public static readonly string[] Files = ["invented_blue_b480.csv", "invented_red_r770.csv", "invented_narrow_n395.csv"];

    public static string Text(string file)
    {
        using var s = typeof(DemoFilters).Assembly.GetManifestResourceStream("filters/" + file)
            ?? throw new InvalidOperationException($"embedded filter curve {file} not found");
        using var r = new StreamReader(s);
        return r.ReadToEnd();
    }

    /// <summary>Writes the three curves into DIR/filters/ and returns their paths (blue, red, narrow).</summary>
    public static string[] WriteTo(string directory)
    {
        return Files.Select(f =>
        {
            string p = Path.Combine(directory, "filters", f);
            AtomicFile.WriteAllText(p, Text(f));
            return p;
        }).ToArray();
    }

    /// <summary>A/E(B-V) of each demo band (blue, red, narrow) for Fitzpatrick (1999) with R_V = 3.1, flat F_lambda source.</summary>
    public static double[] ExtinctionCoefficients()
    {
        var law = ExtinctionLaws.FromName("fitzpatrick99");
        string tmp = Path.Combine(Path.GetTempPath(), "pm-demo-filters-" + Guid.NewGuid().ToString("N"));
        try
        {
            var paths = WriteTo(tmp);
            return paths.Select(p => BandExtinction.Compute(FilterCurve.Load(p), law, 3.1).AOverEbv).ToArray();
        }
        finally
        {
            try { Directory.Delete(tmp, true); } catch (IOException) { }
        }
    }
}
