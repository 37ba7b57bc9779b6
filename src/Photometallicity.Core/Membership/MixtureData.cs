using Photometallicity.Metallicity;

namespace Photometallicity.Membership;

/// <summary>
/// The per-star columns of the mixture, prepared once: tangent-plane positions (arcmin), the lists of rows that
/// carry each kind of information, CMD bin indices, and the star's [Fe/H] likelihood mean (for initial guesses).
/// </summary>
internal sealed class MixtureData
{
    public required int RowCount { get; init; }
    public required TangentPlane Plane { get; init; }
    public required double[] X { get; init; }
    public required double[] Y { get; init; }
    public required bool[] HasPosition { get; init; }

    /// <summary>Rows with a position (these take part in the fit), ascending.</summary>
    public required int[] Positioned { get; init; }
    public required bool[] HasCmd { get; init; }
    public required int[] CmdRows { get; init; }
    public required bool[] HasFeh { get; init; }
    public required int[] FehRows { get; init; }
    public required bool[] HasPm { get; init; }
    public required int[] PmRows { get; init; }
    public required bool[] HasPlx { get; init; }
    public required int[] PlxRows { get; init; }

    public required double[] Mag { get; init; }
    public required double[] Colour { get; init; }
    public required double[] VarColour { get; init; }
    public FehLikelihoods? Feh { get; init; }
    public required double[] PmRa { get; init; }
    public required double[] PmDec { get; init; }
    public required double[] VarPmRa { get; init; }
    public required double[] VarPmDec { get; init; }
    public required double[] Plx { get; init; }
    public required double[] VarPlx { get; init; }

    public required Footprint Footprint { get; init; }
    public required CmdWindow Window { get; init; }
    public required int[] CmdBin { get; init; }

    public static MixtureData Prepare(MembershipInputs inp, TangentPlane plane)
    {
        int n = inp.Count;
        var x = new double[n];
        var y = new double[n];
        var hasPos = new bool[n];
        for (int i = 0; i < n; i++)
            hasPos[i] = plane.TryProject(inp.RaDeg[i], inp.DecDeg[i], out x[i], out y[i]);
        var positioned = Rows(n, i => hasPos[i]);
        var hasCmd = new bool[n];
        for (int i = 0; i < n; i++)
            hasCmd[i] = hasPos[i] && inp.Usable[i] && double.IsFinite(inp.Mag[i]) && double.IsFinite(inp.Colour0[i])
                        && double.IsFinite(inp.VarColour[i]) && inp.VarColour[i] >= 0;
        var hasFeh = new bool[n];
        for (int i = 0; i < n; i++) hasFeh[i] = hasPos[i] && inp.HasFeh(i);
        var hasPm = new bool[n];
        // Without proper motions (or parallaxes) their columns stay empty: no row has them, so none is ever read.
        var pmRa = inp.PmRa ?? [];
        var pmDec = inp.PmDec ?? [];
        var vRa = inp.PmRa is null ? [] : new double[n];
        var vDec = inp.PmRa is null ? [] : new double[n];
        if (inp.PmRa is not null)
            for (int i = 0; i < n; i++)
            {
                double er = inp.PmRaErr![i], ed = inp.PmDecErr![i];
                hasPm[i] = hasPos[i] && double.IsFinite(pmRa[i]) && double.IsFinite(pmDec[i]) && er > 0 && ed > 0 && double.IsFinite(er) && double.IsFinite(ed);
                vRa[i] = er * er; vDec[i] = ed * ed;
            }
        var hasPlx = new bool[n];
        var plx = inp.Parallax ?? [];
        var vPlx = inp.Parallax is null ? [] : new double[n];
        if (inp.Parallax is not null)
            for (int i = 0; i < n; i++)
            {
                double e = inp.ParallaxErr![i];
                hasPlx[i] = hasPos[i] && double.IsFinite(plx[i]) && e > 0 && double.IsFinite(e);
                vPlx[i] = e * e;
            }
        var cmdRows = Rows(n, i => hasCmd[i]);
        if (cmdRows.Length < 20)
            throw new Errors.MethodException($"The membership fit needs stars with colour and magnitude; {cmdRows.Length} of {n} rows have them (at least 20 needed).");
        var fp = Footprint.FromPoints(x, y);
        var window = CmdWindow.FromData(inp.Colour0, inp.Mag, cmdRows);
        var bin = new int[n];
        for (int i = 0; i < n; i++) bin[i] = hasCmd[i] ? window.Bin(inp.Colour0[i], inp.Mag[i]) : -1;
        return new MixtureData
        {
            RowCount = n, Plane = plane, X = x, Y = y, HasPosition = hasPos, Positioned = positioned,
            HasCmd = hasCmd, CmdRows = cmdRows, HasFeh = hasFeh, FehRows = Rows(n, i => hasFeh[i]),
            HasPm = hasPm, PmRows = Rows(n, i => hasPm[i]), HasPlx = hasPlx, PlxRows = Rows(n, i => hasPlx[i]),
            Mag = inp.Mag, Colour = inp.Colour0, VarColour = inp.VarColour, Feh = inp.Feh,
            PmRa = pmRa, PmDec = pmDec, VarPmRa = vRa, VarPmDec = vDec, Plx = plx, VarPlx = vPlx,
            Footprint = fp, Window = window, CmdBin = bin,
        };
    }

    private static int[] Rows(int n, Func<int, bool> keep)
    {
        int count = 0;
        for (int i = 0; i < n; i++) if (keep(i)) count++;
        var rows = new int[count];
        for (int i = 0, k = 0; i < n; i++) if (keep(i)) rows[k++] = i;
        return rows;
    }

    /// <summary>Mean [Fe/H] of a star's stored likelihood (dex).</summary>
    public double FehMean(int i)
    {
        var w = Feh!.Window(i);
        double s = 0, sf = 0;
        for (int m = 0; m < w.Length; m++)
        {
            double v = (double)w[m];
            s += v; sf += v * Feh.GridValue(Feh.GridIndex(i, m));
        }
        return s > 0 ? sf / s : double.NaN;
    }
}
