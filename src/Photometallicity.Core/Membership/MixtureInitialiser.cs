namespace Photometallicity.Membership;

/// <summary>
/// Starting values. Centre: the peak of the star counts smoothed by a Gaussian of sigma = r_h / 2, searched within one
/// half-light radius of the configured centre (so a configured centre off by a fraction of r_h does not bias the
/// start). Red-giant ridge: from the background-subtracted Hess diagram (stars inside 1.5 r_h minus the outer
/// region's diagram scaled by area): in each magnitude bin the colour of the largest excess, fitted by a polynomial
/// weighted by that excess (common practice). Fraction: twice the excess counts inside r_h (half the light of the
/// profile lies inside r_h).
/// </summary>
internal static class MixtureInitialiser
{
    public static (double X, double Y) PeakNear(MixtureData d, double x0, double y0, double rh)
    {
        double cell = rh / 8.0;
        int half = 24; // box of +-3 r_h
        int nside = 2 * half;
        var h = new double[nside * nside];
        foreach (int i in d.Positioned)
        {
            int ix = (int)Math.Floor((d.X[i] - x0) / cell) + half, iy = (int)Math.Floor((d.Y[i] - y0) / cell) + half;
            if (ix >= 0 && iy >= 0 && ix < nside && iy < nside) h[iy * nside + ix] += 1;
        }
        var s = ForegroundCmdDensity.Smooth(h, nside, nside, 4.0);
        double best = double.NegativeInfinity;
        int bx = half, by = half;
        for (int iy = 0; iy < nside; iy++)
            for (int ix = 0; ix < nside; ix++)
            {
                double cx = (ix - half + 0.5) * cell, cy = (iy - half + 0.5) * cell;
                if (cx * cx + cy * cy > rh * rh) continue;
                // use the footprint to avoid a spurious "peak" produced by the edge of the field
                if (!d.Footprint.Contains(x0 + cx, y0 + cy)) continue;
                if (s[iy * nside + ix] > best) { best = s[iy * nside + ix]; bx = ix; by = iy; }
            }
        return (x0 + (bx - half + 0.5) * cell, y0 + (by - half + 0.5) * cell);
    }

    /// <summary>Area of the footprint within radius r of (x0, y0), by the cell centres.</summary>
    public static double FootprintAreaWithin(Footprint fp, double x0, double y0, double r)
    {
        double area = 0, cell = fp.CellSize;
        int sub = 4;
        double h = cell / sub;
        for (int iy = 0; iy < fp.Ny; iy++)
            for (int ix = 0; ix < fp.Nx; ix++)
            {
                double cx = fp.XMin + (ix + 0.5) * cell, cy = fp.YMin + (iy + 0.5) * cell;
                if (!fp.Contains(cx, cy)) continue;
                double dd = Math.Sqrt((cx - x0) * (cx - x0) + (cy - y0) * (cy - y0));
                if (dd > r + cell) continue;
                for (int a = 0; a < sub; a++)
                    for (int b = 0; b < sub; b++)
                    {
                        double px = cx - 0.5 * cell + (a + 0.5) * h - x0, py = cy - 0.5 * cell + (b + 0.5) * h - y0;
                        if (px * px + py * py <= r * r) area += h * h;
                    }
            }
        return area;
    }

    public static RidgeLine LearnedRidge(MixtureData d, int[] inner, int[] outer, double areaRatio, int degree, double sigmaFloor)
    {
        var w = d.Window;
        int nc = w.Nc, nm = w.Nm;
        var hin = new double[nc * nm];
        var hout = new double[nc * nm];
        foreach (int i in inner) if (d.CmdBin[i] >= 0) hin[d.CmdBin[i]] += 1;
        foreach (int i in outer) if (d.CmdBin[i] >= 0) hout[d.CmdBin[i]] += 1;
        var ex = new double[nc * nm];
        for (int k = 0; k < ex.Length; k++) ex[k] = hin[k] - areaRatio * hout[k];
        ex = ForegroundCmdDensity.Smooth(ex, nc, nm, 1.0);
        var mags = new List<double>();
        var cols = new List<double>();
        var wts = new List<double>();
        for (int im = 0; im < nm; im++)
        {
            int bc = -1;
            double bv = 0;
            for (int ic = 0; ic < nc; ic++)
                if (ex[im * nc + ic] > bv) { bv = ex[im * nc + ic]; bc = ic; }
            if (bc < 0) continue;
            mags.Add(w.MLo + (im + 0.5) * w.DM);
            cols.Add(w.CLo + (bc + 0.5) * w.DC);
            wts.Add(bv);
        }
        double pivot = mags.Count > 0 ? mags.Zip(wts, (m, q) => m * q).Sum() / wts.Sum() : 0.5 * (w.MLo + w.MHi);
        int deg = Math.Min(degree, Math.Max(0, mags.Count - 2));
        var coef = new double[deg + 1];
        if (mags.Count > 0) coef[0] = cols.Zip(wts, (c, q) => c * q).Sum() / wts.Sum();
        else coef[0] = 0.5 * (w.CLo + w.CHi);
        var ridge = new RidgeLine(deg, pivot, coef, Math.Max(2 * w.DC, 0.05), sigmaFloor);
        if (mags.Count >= deg + 2)
        {
            // reuse the ridge's weighted least squares on the excess points (tiny arrays)
            int m = mags.Count;
            var rows = Enumerable.Range(0, m).ToArray();
            var width = ridge.SigmaInt;
            var tmp = new RidgeLine(deg, pivot, coef, width, width);
            tmp.Update(mags.ToArray(), cols.ToArray(), new double[m], rows, wts.ToArray());
            ridge = new RidgeLine(deg, pivot, tmp.Coefficients, width, sigmaFloor);
        }
        if (deg < degree)
        {
            var full = new double[degree + 1];
            Array.Copy(ridge.Coefficients, full, ridge.Coefficients.Length);
            ridge = new RidgeLine(degree, pivot, full, ridge.SigmaInt, sigmaFloor);
        }
        return ridge;
    }
}
