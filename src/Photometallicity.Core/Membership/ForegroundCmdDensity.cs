namespace Photometallicity.Membership;

/// <summary>
/// The foreground's colour-magnitude density, estimated non-parametrically from stars of the outer region:
/// a weighted 2-D histogram on the <see cref="CmdWindow"/>, smoothed by a Gaussian kernel of fixed width
/// (<see cref="CmdWindow.KernelBins"/> bins, i.e. the Scott's-rule bandwidth, in each axis), plus a floor of 1% of the mean density so that no
/// part of the window has zero foreground probability, and normalised to unit integral over the window.
/// Stars outside the window get the floor density.
/// </summary>
internal sealed class ForegroundCmdDensity
{
    public const double FloorFraction = 0.01;

    private readonly double[] _density;

    private ForegroundCmdDensity(CmdWindow window, double[] density, double floor)
    {
        Window = window; _density = density; Floor = floor;
    }

    public CmdWindow Window { get; }
    public double Floor { get; }

    public double Density(int bin) => bin < 0 ? Floor : _density[bin];

    /// <summary>Builds the density from binned stars (bin index per row, -1 outside) and weights.</summary>
    public static ForegroundCmdDensity Build(CmdWindow window, int[] bin, int[] rows, Func<int, double> weight)
    {
        int nc = window.Nc, nm = window.Nm;
        var h = new double[nc * nm];
        foreach (int i in rows)
        {
            int b = bin[i];
            if (b >= 0) h[b] += weight(i);
        }
        var sm = Smooth(h, nc, nm, CmdWindow.KernelBins);
        double total = sm.Sum();
        double area = window.DC * window.DM;
        double windowArea = area * nc * nm;
        var d = new double[nc * nm];
        double mean = 1.0 / windowArea;
        double floor = FloorFraction * mean;
        if (!(total > 0))
        {
            Array.Fill(d, mean);
            return new ForegroundCmdDensity(window, d, mean);
        }
        for (int k = 0; k < d.Length; k++) d[k] = sm[k] / (total * area);
        // add the floor and renormalise
        double scale = 1.0 / (1.0 + FloorFraction);
        for (int k = 0; k < d.Length; k++) d[k] = (d[k] + floor) * scale;
        return new ForegroundCmdDensity(window, d, floor * scale);
    }

    /// <summary>Separable Gaussian smoothing with truncation at 3 sigma; mass leaving the grid is dropped (renormalised later).</summary>
    internal static double[] Smooth(double[] h, int nc, int nm, double sigma)
    {
        int r = (int)Math.Ceiling(3 * sigma);
        var k = new double[2 * r + 1];
        for (int j = -r; j <= r; j++) k[j + r] = Math.Exp(-0.5 * j * j / (sigma * sigma));
        double ks = k.Sum();
        for (int j = 0; j < k.Length; j++) k[j] /= ks;
        var tmp = new double[h.Length];
        for (int im = 0; im < nm; im++)
            for (int ic = 0; ic < nc; ic++)
            {
                double s = 0;
                for (int j = -r; j <= r; j++)
                {
                    int c = ic + j;
                    if (c >= 0 && c < nc) s += k[j + r] * h[im * nc + c];
                }
                tmp[im * nc + ic] = s;
            }
        var outp = new double[h.Length];
        for (int im = 0; im < nm; im++)
            for (int ic = 0; ic < nc; ic++)
            {
                double s = 0;
                for (int j = -r; j <= r; j++)
                {
                    int m = im + j;
                    if (m >= 0 && m < nm) s += k[j + r] * tmp[m * nc + ic];
                }
                outp[im * nc + ic] = s;
            }
        return outp;
    }
}
