using System.Globalization;
using Photometallicity.Errors;
using ScottPlot;

namespace Photometallicity.Reporting;

/// <summary>
/// A fitted elliptical half-light contour on the tangent plane: centre (arcmin), semi-major axis r_h (arcmin),
/// ellipticity e = 1 - b/a, position angle of the major axis in degrees east of north.
/// </summary>
public sealed record HalfLightEllipse(double CentreXiArcmin, double CentreEtaArcmin, double RhArcmin, double Ellipticity, double PositionAngleDeg)
{
    /// <summary>
    /// Points (xi, eta) around the ellipse: centre + a cos t (sin PA, cos PA) + b sin t (cos PA, -sin PA), with
    /// a = r_h and b = (1 - e) a; (sin PA, cos PA) is the major axis turned from north (+eta) towards east (+xi).
    /// </summary>
    public (double[] Xi, double[] Eta) Outline(int points = 241)
    {
        double pa = PositionAngleDeg * Math.PI / 180, a = RhArcmin, b = (1 - Ellipticity) * RhArcmin;
        var xi = new double[points];
        var eta = new double[points];
        for (int k = 0; k < points; k++)
        {
            double t = 2 * Math.PI * k / (points - 1);
            xi[k] = CentreXiArcmin + a * Math.Cos(t) * Math.Sin(pa) + b * Math.Sin(t) * Math.Cos(pa);
            eta[k] = CentreEtaArcmin + a * Math.Cos(t) * Math.Cos(pa) - b * Math.Sin(t) * Math.Sin(pa);
        }
        return (xi, eta);
    }
}

/// <summary>Input of <see cref="SkyMapPlot"/>: one entry per star; NaN where a value does not exist.</summary>
/// <param name="XiArcmin">Standard coordinate xi (towards east) of each star, arcmin.</param>
/// <param name="EtaArcmin">Standard coordinate eta (towards north) of each star, arcmin.</param>
/// <param name="PMember">Membership probability in [0, 1] (NaN: drawn faint as "no p_member").</param>
/// <param name="Ellipse">The fitted half-light ellipse, or null.</param>
public sealed record SkyMapPlotData(double[] XiArcmin, double[] EtaArcmin, double[] PMember, HalfLightEllipse? Ellipse = null)
{
    public string? Title { get; init; } = "Sky map (tangent plane)";
}

/// <summary>
/// The sky map on the tangent plane: east to the left (xi axis inverted), north up, equal scales on both axes,
/// stars coloured and sized by membership probability, the fitted half-light ellipse and its centre.
/// </summary>
public static class SkyMapPlot
{
    public static FigureFiles Write(SkyMapPlotData data, string pathWithoutExtension, FigureOptions? options = null)
    {
        Validate(data);
        return FigureRenderer.Write(pathWithoutExtension, options, cap => FigureRenderer.Single(Build(data, cap)));
    }

    internal static void Validate(SkyMapPlotData d)
    {
        ArgumentNullException.ThrowIfNull(d);
        Guard.SameLength(d.XiArcmin.Length, d.EtaArcmin.Length, nameof(d.XiArcmin), nameof(d.EtaArcmin));
        Guard.SameLength(d.XiArcmin.Length, d.PMember.Length, nameof(d.XiArcmin), nameof(d.PMember));
        if (d.Ellipse is { } e)
        {
            if (!double.IsFinite(e.CentreXiArcmin) || !double.IsFinite(e.CentreEtaArcmin) || !double.IsFinite(e.PositionAngleDeg))
                throw new ArgumentException("The half-light ellipse centre and position angle must be finite.");
            Guard.InRange(e.RhArcmin, double.Epsilon, double.MaxValue, "r_h (arcmin)");
            Guard.InRange(e.Ellipticity, 0, 0.999, "ellipticity");
        }
    }

    internal static Plot Build(SkyMapPlotData d, int? maxPoints)
    {
        var plot = FigureStyle.NewPlot();
        int[] finite = PointThinning.Finite(d.XiArcmin.Length, d.XiArcmin, d.EtaArcmin);
        int[] rows = PointThinning.Thin(finite, maxPoints);
        ColourScale.AddScatter(plot, d.XiArcmin, d.EtaArcmin, d.PMember, rows, "membership probability p_member",
            minSize: 2.5f, maxSize: 7f, unknownLegend: "no p_member");
        FigureStyle.AddThinningNote(plot, rows.Length, finite.Length);

        var xs = finite.Select(i => d.XiArcmin[i]).ToList();
        var ys = finite.Select(i => d.EtaArcmin[i]).ToList();
        if (d.Ellipse is { } e)
        {
            var (exi, eeta) = e.Outline();
            var line = plot.Add.ScatterLine(exi, eeta, Palette.Vermillion);
            line.LineWidth = 3;
            line.LegendText = string.Create(CultureInfo.InvariantCulture,
                $"half-light ellipse: r_h = {e.RhArcmin:0.00}′, e = {e.Ellipticity:0.00}, PA = {e.PositionAngleDeg:0}°");
            var centre = plot.Add.Marker(e.CentreXiArcmin, e.CentreEtaArcmin, MarkerShape.Cross, 18, Palette.Vermillion);
            centre.MarkerLineWidth = 3;
            centre.LegendText = "centre";
            xs.AddRange(exi);
            ys.AddRange(eeta);
        }
        var (xMin, xMax) = FigureStyle.PaddedRange(xs);
        var (yMin, yMax) = FigureStyle.PaddedRange(ys);
        plot.XLabel("ξ (arcmin), east to the left");
        plot.YLabel("η (arcmin), north up");
        plot.Axes.SetLimits(xMax, xMin, yMin, yMax); // left = east = larger xi
        plot.Axes.SquareUnits();
        plot.ShowLegend(Alignment.UpperRight);
        FigureStyle.Finish(plot, d.Title);
        return plot;
    }
}
