namespace Photometallicity.Membership;

/// <summary>
/// The field's coverage on the tangent plane, learned from the catalogue itself: a regular grid of square cells,
/// a cell counting as covered when it holds a star; empty cells enclosed by covered ones (gaps, masks around bright
/// stars, Poisson-empty cells) are filled, found as the empty cells not reachable from the grid border
/// (flood fill, common practice). The footprint's area is the number of covered cells times the cell area, and a
/// surface-density profile is integrated over the covered cells numerically with an adaptive product Gauss rule
/// (each cell is split into quarters until it is small against the profile's local scale).
/// </summary>
public sealed class Footprint
{
    private readonly bool[] _covered;
    private readonly int[] _coveredIndex; // flat indices of covered cells, ascending

    private Footprint(double xMin, double yMin, double cell, int nx, int ny, bool[] covered)
    {
        XMin = xMin; YMin = yMin; CellSize = cell; Nx = nx; Ny = ny;
        _covered = covered;
        var list = new List<int>();
        for (int k = 0; k < covered.Length; k++) if (covered[k]) list.Add(k);
        _coveredIndex = list.ToArray();
    }

    public double XMin { get; }
    public double YMin { get; }
    public double CellSize { get; }
    public int Nx { get; }
    public int Ny { get; }
    public int CoveredCells => _coveredIndex.Length;
    public double Area => _coveredIndex.Length * CellSize * CellSize;

    /// <summary>
    /// Builds the footprint of the points (NaN entries ignored). The cell side is chosen so that a covered cell holds
    /// about <paramref name="starsPerCell"/> stars on average, with at most <paramref name="maxCellsPerSide"/> cells on the longer side.
    /// </summary>
    public static Footprint FromPoints(double[] x, double[] y, double starsPerCell = 6.0, int maxCellsPerSide = 96)
    {
        double xMin = double.PositiveInfinity, xMax = double.NegativeInfinity, yMin = double.PositiveInfinity, yMax = double.NegativeInfinity;
        int n = 0;
        for (int i = 0; i < x.Length; i++)
        {
            if (!double.IsFinite(x[i]) || !double.IsFinite(y[i])) continue;
            n++;
            if (x[i] < xMin) xMin = x[i];
            if (x[i] > xMax) xMax = x[i];
            if (y[i] < yMin) yMin = y[i];
            if (y[i] > yMax) yMax = y[i];
        }
        if (n < 2) throw new Errors.MethodException($"The membership fit needs stars with positions; {n} found.");
        double w = Math.Max(xMax - xMin, 1e-6), h = Math.Max(yMax - yMin, 1e-6);
        // First guess from the bounding box, then refine once with the occupied fraction.
        double cell = Math.Sqrt(w * h * starsPerCell / n);
        cell = Math.Max(cell, Math.Max(w, h) / maxCellsPerSide);
        var fp = Build(x, y, xMin, yMin, w, h, cell);
        double occupied = fp.Area / (w * h);
        if (occupied < 0.8)
        {
            double refined = Math.Max(Math.Sqrt(fp.Area * starsPerCell / n), Math.Max(w, h) / maxCellsPerSide);
            fp = Build(x, y, xMin, yMin, w, h, refined);
        }
        return fp;
    }

    /// <summary>A footprint from an explicit cell mask (row-major, index = iy * nx + ix).</summary>
    public static Footprint FromMask(double xMin, double yMin, double cell, int nx, int ny, bool[] covered)
    {
        if (covered.Length != nx * ny) throw new ArgumentException($"mask has {covered.Length} cells, expected {nx * ny}.");
        return new Footprint(xMin, yMin, cell, nx, ny, (bool[])covered.Clone());
    }

    private static Footprint Build(double[] x, double[] y, double xMin, double yMin, double w, double h, double cell)
    {
        int nx = Math.Max(1, (int)Math.Ceiling(w / cell));
        int ny = Math.Max(1, (int)Math.Ceiling(h / cell));
        cell = Math.Max(w / nx, h / ny); // the longer side fits the grid exactly
        // Centre the grid on the bounding box so that edge cells straddle the data edges symmetrically.
        double x0 = xMin - 0.5 * (nx * cell - w), y0 = yMin - 0.5 * (ny * cell - h);
        var covered = new bool[nx * ny];
        for (int i = 0; i < x.Length; i++)
        {
            if (!double.IsFinite(x[i]) || !double.IsFinite(y[i])) continue;
            int ix = Math.Clamp((int)((x[i] - x0) / cell), 0, nx - 1);
            int iy = Math.Clamp((int)((y[i] - y0) / cell), 0, ny - 1);
            covered[iy * nx + ix] = true;
        }
        FillHoles(covered, nx, ny);
        return new Footprint(x0, y0, cell, nx, ny, covered);
    }

    private static void FillHoles(bool[] covered, int nx, int ny)
    {
        var outside = new bool[covered.Length];
        var stack = new Stack<int>();
        void Push(int k) { if (!covered[k] && !outside[k]) { outside[k] = true; stack.Push(k); } }
        for (int ix = 0; ix < nx; ix++) { Push(ix); Push((ny - 1) * nx + ix); }
        for (int iy = 0; iy < ny; iy++) { Push(iy * nx); Push(iy * nx + nx - 1); }
        while (stack.Count > 0)
        {
            int k = stack.Pop();
            int ix = k % nx, iy = k / nx;
            if (ix > 0) Push(k - 1);
            if (ix < nx - 1) Push(k + 1);
            if (iy > 0) Push(k - nx);
            if (iy < ny - 1) Push(k + nx);
        }
        for (int k = 0; k < covered.Length; k++) if (!outside[k]) covered[k] = true;
    }

    public bool Contains(double x, double y)
    {
        int ix = (int)Math.Floor((x - XMin) / CellSize), iy = (int)Math.Floor((y - YMin) / CellSize);
        return ix >= 0 && iy >= 0 && ix < Nx && iy < Ny && _covered[iy * Nx + ix];
    }

    /// <summary>Integral of a plane-normalised profile over the covered cells (the fraction of the target inside the field).</summary>
    public double Integrate(in SurfaceDensityProfile.Evaluator profile)
    {
        double sum = 0;
        double scale = profile.MinorScale;
        foreach (int k in _coveredIndex)
        {
            double cx = XMin + (k % Nx + 0.5) * CellSize, cy = YMin + (k / Nx + 0.5) * CellSize;
            sum += IntegrateCell(profile, cx, cy, CellSize, scale, 0);
        }
        return sum;
    }

    private static double IntegrateCell(in SurfaceDensityProfile.Evaluator p, double cx, double cy, double side, double scale, int depth)
    {
        double dx = cx - p.X0, dy = cy - p.Y0;
        double dist = Math.Sqrt(dx * dx + dy * dy) - 0.7072 * side;
        // Fine enough when the cell is small against the local scale of the profile (its core or the distance).
        if (depth >= 10 || side <= 0.25 * Math.Max(scale, dist))
        {
            // 2 x 2 Gauss-Legendre product rule (nodes at +-1/sqrt(3) of the half-side, weights 1; Abramowitz &amp; Stegun 1964, 25.4.29)
            double g = side * 0.28867513459481287; // side / (2 sqrt 3)
            return 0.25 * side * side * (p.Density(cx - g, cy - g) + p.Density(cx + g, cy - g) + p.Density(cx - g, cy + g) + p.Density(cx + g, cy + g));
        }
        double q = 0.25 * side, hs = 0.5 * side;
        return IntegrateCell(p, cx - q, cy - q, hs, scale, depth + 1) + IntegrateCell(p, cx + q, cy - q, hs, scale, depth + 1)
             + IntegrateCell(p, cx - q, cy + q, hs, scale, depth + 1) + IntegrateCell(p, cx + q, cy + q, hs, scale, depth + 1);
    }
}
