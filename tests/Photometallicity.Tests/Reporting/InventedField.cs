using Photometallicity.Numerics;
using Photometallicity.Reporting;

namespace Photometallicity.Tests.Reporting;

/// <summary>
/// Invented data for the figure tests (no real object): a red-giant branch of members inside an elliptical
/// body, uniform foreground, invented calibration curves and standards.
/// </summary>
internal static class InventedField
{
    public static CmdPlotData Cmd(int n, ulong seed = 11)
    {
        var (colour, mag, p, _, _) = Stars(n, seed);
        double[] lm = Enumerable.Range(0, 31).Select(k => 19 + 0.2 * k).ToArray();
        return new CmdPlotData(colour, mag, p, lm.Select(m => 1 + 0.25 * (24.5 - m)).ToArray(), lm);
    }

    public static SkyMapPlotData Sky(int n, ulong seed = 12)
    {
        var (_, _, p, xi, eta) = Stars(n, seed);
        return new SkyMapPlotData(xi, eta, p, new HalfLightEllipse(0.2, -0.1, 4, 0.3, 35));
    }

    public static (double[] Colour, double[] Mag, double[] P, double[] Xi, double[] Eta) Stars(int n, ulong seed)
    {
        var rng = new Rng(seed);
        var colour = new double[n]; var mag = new double[n]; var p = new double[n]; var xi = new double[n]; var eta = new double[n];
        for (int i = 0; i < n; i++)
        {
            bool member = rng.NextDouble() < 0.3;
            mag[i] = 19 + 6 * Math.Sqrt(rng.NextDouble());
            if (member)
            {
                colour[i] = 1 + 0.25 * (24.5 - mag[i]) + rng.NextGaussian(0, 0.05);
                p[i] = Math.Clamp(rng.NextGaussian(0.8, 0.1), 0, 1);
                xi[i] = rng.NextGaussian(0, 3); eta[i] = rng.NextGaussian(0, 4);
            }
            else
            {
                colour[i] = 0.5 + 1.5 * rng.NextDouble();
                p[i] = Math.Clamp(rng.NextGaussian(0.1, 0.1), 0, 1);
                xi[i] = 30 * (rng.NextDouble() - 0.5); eta[i] = 30 * (rng.NextDouble() - 0.5);
            }
            if (i % 97 == 0) p[i] = double.NaN;
        }
        return (colour, mag, p, xi, eta);
    }

    public static double Index(double colour, double feh) => 0.3 + 0.9 * colour + (0.35 + 0.12 * feh) * colour * colour;

    public static ColourIndexPlotData ColourIndex(int fieldStars, ulong seed = 13)
    {
        var rng = new Rng(seed);
        var curves = new List<IsoMetallicityCurve>();
        foreach (double feh in new[] { -2.5, -2.0, -1.5, -1.0, -0.5, 0.0 })
        {
            double[] c = Enumerable.Range(0, 40).Select(k => 0.6 + 0.035 * k).ToArray();
            curves.Add(new IsoMetallicityCurve(feh, c, c.Select(x => Index(x, feh)).ToArray()));
        }
        int ns = 50;
        var sc = new double[ns]; var si = new double[ns]; var sa = new bool[ns];
        for (int i = 0; i < ns; i++)
        {
            double feh = -2.4 + 2.2 * rng.NextDouble();
            sc[i] = 0.7 + 1.1 * rng.NextDouble();
            sa[i] = i % 10 != 3;
            si[i] = Index(sc[i], feh) + rng.NextGaussian(0, 0.03) + (sa[i] ? 0 : 0.3);
        }
        var fc = new double[fieldStars]; var fi = new double[fieldStars];
        for (int i = 0; i < fieldStars; i++) { fc[i] = 0.6 + 1.3 * rng.NextDouble(); fi[i] = Index(fc[i], rng.NextGaussian(-1.5, 0.4)); }
        return new ColourIndexPlotData(sc, si, sa, curves, fieldStars > 0 ? fc : null, fieldStars > 0 ? fi : null);
    }

    public static CalibrationResidualsPlotData Residuals(ulong seed = 14)
    {
        var rng = new Rng(seed);
        int n = 50;
        var c = new double[n]; var f = new double[n]; var r = new double[n]; var a = new bool[n]; var e = new double[n];
        for (int i = 0; i < n; i++)
        {
            c[i] = 0.7 + 1.1 * rng.NextDouble(); f[i] = -2.4 + 2.2 * rng.NextDouble(); e[i] = 0.05 + 0.1 * rng.NextDouble();
            a[i] = i % 10 != 3; r[i] = rng.NextGaussian(0, e[i]) + (a[i] ? 0 : 0.6);
        }
        return new CalibrationResidualsPlotData(c, f, r, a, e, 0.1);
    }

    public static MdfPlotData Mdf(ulong seed = 15)
    {
        var rng = new Rng(seed);
        int n = 2000;
        var feh = new double[n]; var w = new double[n]; var e = new double[n];
        for (int i = 0; i < n; i++) { e[i] = 0.1 + 0.2 * rng.NextDouble(); feh[i] = rng.NextGaussian(-1.5, 0.3) + rng.NextGaussian(0, e[i]); w[i] = rng.NextDouble(); }
        return new MdfPlotData(feh, w, e, -1.5, 0.012, 0.3, 0.016);
    }

    public static ForecastPlotData Forecast()
    {
        var curves = new List<ForecastCurve>();
        foreach (double c in new[] { 0.8, 1.2, 1.6 })
        {
            double[] m = Enumerable.Range(0, 25).Select(k => 19 + 0.25 * k).ToArray();
            curves.Add(new ForecastCurve($"C₀ = {c:0.0} mag", m, m.Select(x => 0.08 + 0.02 * Math.Exp((x - 21) * (0.9 - 0.2 * c))).ToArray()));
        }
        return new ForecastPlotData(curves, 0.2);
    }
}
