using Photometallicity.Photometry;
using Photometallicity.Units;

namespace Photometallicity.Calibration;

/// <summary>
/// What happened to one cluster field's stars: catalogue rows, rows with a narrow-band partner, stars within the
/// radius that have a usable colour (the ridge-line candidates), members on the red-giant ridge, members entering
/// the calibration (those with a usable index), candidates off the ridge, members without a usable index, the ridge
/// scatter (mag), the shared literature [Fe/H] and its error (dex), and where centre, [Fe/H] and E(B-V) came from.
/// </summary>
public sealed record ClusterBlockSummary(string Name, int Rows, int Matched, int InsideRadius, int Members, int Entered, int OffRidge,
    int MembersWithoutIndex, double RidgeSigmaMag, double Feh, double FehErr, string Source);

/// <summary>
/// The red-giant members of one cluster field as a block of calibration standards: every member carries the
/// cluster's literature [Fe/H] and error and one group id, so the bootstrap resamples the cluster as a unit and
/// cross-validation keeps it in one fold (members share one [Fe/H]; they are not independent standards).
/// Members are chosen by <see cref="ClusterMemberSelector"/> from the stars with a usable colour; a member
/// enters only with a usable index.
/// </summary>
public sealed class ClusterBlock
{
    private ClusterBlock(CalibrationStandards standards, ClusterMembership selection, ClusterBlockSummary summary)
    {
        Standards = standards;
        Selection = selection;
        Summary = summary;
    }

    /// <summary>The entering members, all in group 0 named after the cluster (renumbered by <see cref="Append"/>).</summary>
    public CalibrationStandards Standards { get; }
    public ClusterMembership Selection { get; }
    public ClusterBlockSummary Summary { get; }

    /// <summary>
    /// Selects the members among the prepared photometry <paramref name="phot"/> of the field (positions in degrees)
    /// and builds the block. <paramref name="rowIds"/>: identifier of every catalogue row (a standard's id is
    /// "name:rowId"); <paramref name="matched"/>: rows with a narrow-band partner (for the summary).
    /// </summary>
    public static ClusterBlock Build(string name, double feh, double fehErr, double[] raDeg, double[] decDeg, IndexPhotometry phot,
        string[] rowIds, int matched, SkyPosition centre, Angle radius, ClusterSelectionOptions options, string source)
    {
        int n = phot.Count;
        var colour = new double[n];
        var blue = new double[n];
        for (int i = 0; i < n; i++)
        {
            bool ok = phot.HasUsableColour(i);
            colour[i] = ok ? phot.Colour0[i] : double.NaN;
            blue[i] = ok ? phot.Blue0[i] : double.NaN;
        }
        var sel = ClusterMemberSelector.Select(raDeg, decDeg, colour, blue, centre, radius, options);
        var rows = sel.Members.Where(phot.IsUsable).ToArray();
        int inside = sel.PerStar.Count(v => double.IsFinite(v.OffsetSigma));
        var standards = new CalibrationStandards
        {
            Id = rows.Select(k => $"{name}:{rowIds[k]}").ToArray(),
            Colour0 = rows.Select(k => phot.Colour0[k]).ToArray(),
            Index0 = rows.Select(k => phot.Index0[k]).ToArray(),
            VarColour = rows.Select(k => phot.VarColour[k]).ToArray(),
            VarIndex = rows.Select(k => phot.VarIndex[k]).ToArray(),
            CovIndexColour = rows.Select(k => phot.CovIndexColour[k]).ToArray(),
            Feh = Enumerable.Repeat(feh, rows.Length).ToArray(),
            FehErr = Enumerable.Repeat(fehErr, rows.Length).ToArray(),
            Group = new int[rows.Length],
            GroupName = [name],
        };
        var summary = new ClusterBlockSummary(name, n, matched, inside, sel.Members.Length, rows.Length, inside - sel.Members.Length,
            sel.Members.Length - rows.Length, sel.RidgeSigma, feh, fehErr, source);
        return new ClusterBlock(standards, sel, summary);
    }

    /// <summary>
    /// The standards followed by each block's members; block k gets group id (existing group count + k) and its
    /// cluster's name. log g is NaN (unknown) for cluster members when the standards carry it: members are red giants
    /// by selection, and a standard of unknown log g stays in the giant calibration and out of the dwarf one.
    /// </summary>
    public static CalibrationStandards Append(CalibrationStandards standards, IReadOnlyList<ClusterBlock> blocks)
    {
        int g0 = standards.GroupName.Length;
        var parts = new List<CalibrationStandards> { standards };
        parts.AddRange(blocks.Select(b => b.Standards));
        double[] Cat(Func<CalibrationStandards, double[]> f) => parts.SelectMany(f).ToArray();
        var group = standards.Group.Concat(blocks.SelectMany((b, k) => Enumerable.Repeat(g0 + k, b.Standards.Count))).ToArray();
        return new CalibrationStandards
        {
            Id = parts.SelectMany(p => p.Id).ToArray(),
            Colour0 = Cat(p => p.Colour0),
            Index0 = Cat(p => p.Index0),
            VarColour = Cat(p => p.VarColour),
            VarIndex = Cat(p => p.VarIndex),
            CovIndexColour = Cat(p => p.CovIndexColour),
            Feh = Cat(p => p.Feh),
            FehErr = Cat(p => p.FehErr),
            LogG = standards.LogG is null ? null : standards.LogG.Concat(Enumerable.Repeat(double.NaN, group.Length - standards.Count)).ToArray(),
            Group = group,
            GroupName = [.. standards.GroupName, .. blocks.Select(b => b.Summary.Name)],
        };
    }
}
