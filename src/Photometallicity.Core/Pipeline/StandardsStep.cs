using Microsoft.Extensions.Logging;
using Photometallicity.Calibration;
using Photometallicity.Catalogues;
using Photometallicity.Configuration;
using Photometallicity.CrossMatch;
using Photometallicity.Photometry;
using Photometallicity.Units;

namespace Photometallicity.Pipeline;

/// <summary>A standard that could not enter the fit at all (no photometric counterpart, unusable photometry).</summary>
public sealed record ExcludedStandard(string Set, string Id, string Reason);

/// <summary>
/// The standards of a run, matched to the field's photometry, with those left out before the fit.
/// <see cref="BroadbandRow"/> is the main field's broadband row of each standard, -1 for cluster-field members
/// (their rows are in the cluster's own catalogue). <see cref="Clusters"/>: one summary per cluster field.
/// </summary>
public sealed record StandardsProducts(CalibrationStandards Standards, int[] BroadbandRow, IReadOnlyList<ExcludedStandard> Excluded, int Total)
{
    public IReadOnlyList<ClusterBlockSummary> Clusters { get; init; } = [];
}

/// <summary>
/// Matches each standard set by position to the broadband catalogue (nearest partner within the set's radius,
/// one to one, no offset solved: the spectroscopic positions are taken to be on the broadband frame) and takes the
/// prepared photometry of the matched rows. Standards without a partner or with unusable photometry are listed
/// with the reason, never silently dropped. Cluster fields ("kind": "cluster") are cross-matched and prepared
/// like the main field (same options, bands and extinction coefficients), their red-giant members chosen by
/// <see cref="ClusterMemberSelector"/> and added as one block per cluster (see <see cref="ClusterBlock"/>).
/// </summary>
public static class StandardsStep
{
    /// <summary>As the overload taking the products, with the extinction coefficients resolved from the config.</summary>
    public static StandardsProducts Build(PipelineConfig config, InputCatalogues inputs, double[] broadRa, double[] broadDec, IndexPhotometry phot, ILogger log) =>
        Build(config, inputs, broadRa, broadDec, phot,
            config.ClusterStandards.Count == 0 ? new BandValues(0, 0, 0) : PhotometryStep.Filters(config, log).Coefficients, log);

    public static StandardsProducts Build(PipelineConfig config, InputCatalogues inputs, double[] broadRa, double[] broadDec, PhotometryProducts photometry, ILogger log) =>
        Build(config, inputs, broadRa, broadDec, photometry.Index, photometry.ExtinctionCoefficients, log);

    private static StandardsProducts Build(PipelineConfig config, InputCatalogues inputs, double[] broadRa, double[] broadDec, IndexPhotometry phot,
        BandValues coefficients, ILogger log)
    {
        var id = new List<string>();
        var rows = new List<int>();
        var feh = new List<double>();
        var fehErr = new List<double>();
        var logg = new List<double>();
        bool anyLogg = config.Standards.Any(s => s.LogGColumn is not null);
        var excluded = new List<ExcludedStandard>();
        int total = 0;
        for (int si = 0; si < config.Standards.Count; si++)
        {
            var set = config.Standards[si];
            var t = inputs.Standards[si];
            total += t.RowCount;
            double[] ra = t.RequireDoubles(set.RaColumn), dec = t.RequireDoubles(set.DecColumn);
            double[] f = t.RequireDoubles(set.FehColumn), fe = t.RequireDoubles(set.FehErrColumn);
            double[]? lg = set.LogGColumn is null ? null : t.RequireDoubles(set.LogGColumn);
            var ids = set.IdColumn is null ? null : t.Require(set.IdColumn);
            var m = CrossMatcher.Run(ra, dec, broadRa, broadDec, new CrossMatchOptions
            {
                Radius = Angle.FromArcseconds(set.MatchRadiusArcsec),
                SolveOffset = false,
            });
            for (int i = 0; i < t.RowCount; i++)
            {
                string sid = ids?.GetString(i) ?? $"{set.Name}:{i + 1}";
                int row = m.RightIndex[i];
                if (!double.IsFinite(f[i]) || !double.IsFinite(fe[i]) || fe[i] < 0)
                    excluded.Add(new ExcludedStandard(set.Name, sid, "spectroscopic [Fe/H] or its error missing or invalid"));
                else if (row < 0)
                    excluded.Add(new ExcludedStandard(set.Name, sid, $"no broadband source within {set.MatchRadiusArcsec} arcsec"));
                else if (!phot.IsUsable(row))
                    excluded.Add(new ExcludedStandard(set.Name, sid, $"photometry not usable ({StatusCodes.Photometry(phot.Status[row])})"));
                else
                {
                    id.Add(sid);
                    rows.Add(row);
                    feh.Add(f[i]);
                    fehErr.Add(fe[i]);
                    logg.Add(lg?[i] ?? double.NaN);
                }
            }
        }
        log.LogInformation("standards: {Used} of {Total} matched to usable photometry, {Excluded} left out before the fit", id.Count, total, excluded.Count);
        int[] r = rows.ToArray();
        var stars = new CalibrationStandards
        {
            Id = id.ToArray(),
            Colour0 = r.Select(k => phot.Colour0[k]).ToArray(),
            Index0 = r.Select(k => phot.Index0[k]).ToArray(),
            VarColour = r.Select(k => phot.VarColour[k]).ToArray(),
            VarIndex = r.Select(k => phot.VarIndex[k]).ToArray(),
            CovIndexColour = r.Select(k => phot.CovIndexColour[k]).ToArray(),
            Feh = feh.ToArray(),
            FehErr = fehErr.ToArray(),
            LogG = anyLogg ? logg.ToArray() : null,
            Group = Enumerable.Repeat(-1, id.Count).ToArray(),
            GroupName = [],
        };
        if (config.ClusterStandards.Count == 0) return new StandardsProducts(stars, r, excluded, total);

        var blocks = new List<ClusterBlock>();
        for (int k = 0; k < config.ClusterStandards.Count; k++)
            blocks.Add(ClusterField(config, config.ClusterStandards[k], inputs.ClusterFields[k], coefficients, log));
        var all = ClusterBlock.Append(stars, blocks);
        int entered = blocks.Sum(b => b.Standards.Count);
        var allRows = r.Concat(Enumerable.Repeat(-1, entered)).ToArray();
        return new StandardsProducts(all, allRows, excluded, total + entered) { Clusters = blocks.Select(b => b.Summary).ToArray() };
    }

    /// <summary>Cross-match, photometry and member selection of one cluster field; its members as one block.</summary>
    private static ClusterBlock ClusterField(PipelineConfig config, ClusterStandardConfig c, (Table Broadband, Table Narrowband) tables,
        BandValues coefficients, ILogger log)
    {
        var (tb, tn) = tables;
        double[] ra = tb.RequireDoubles(c.Broadband.RaColumn), dec = tb.RequireDoubles(c.Broadband.DecColumn);
        var match = CrossMatcher.Run(ra, dec, tn.RequireDoubles(c.Narrowband.RaColumn), tn.RequireDoubles(c.Narrowband.DecColumn), new CrossMatchOptions
        {
            Radius = Angle.FromArcseconds(config.CrossMatch.RadiusArcsec ?? 1.0),
            AutoRadius = config.CrossMatch.AutoRadius,
            SolveOffset = config.CrossMatch.SolveOffset,
            SolveRotationScale = config.CrossMatch.SolveRotationScale,
        }, log);
        var phot = PhotometryStep.Prepare(config, tb, tn, c.Broadband, c.Reddening, match.RightIndex, coefficients, log).Photometry;
        var ids = c.Broadband.IdColumn is null ? null : tb.Require(c.Broadband.IdColumn);
        var rowIds = new string[tb.RowCount];
        for (int i = 0; i < rowIds.Length; i++) rowIds[i] = ids?.GetString(i) ?? $"row {i + 1}";
        try
        {
            var block = ClusterBlock.Build(c.Name, c.Feh, c.FehErr, ra, dec, phot, rowIds, match.Matched, c.Centre, Angle.FromArcminutes(c.RadiusArcmin),
                new ClusterSelectionOptions { RidgeDegree = c.RidgeDegree, KeepSigma = c.KeepSigma, BrightLimit = c.Blue0Bright, FaintLimit = c.Blue0Faint },
                c.Source);
            var s = block.Summary;
            log.LogInformation("cluster {Name}: {Rows} rows, {Matched} with a narrow-band partner, {Inside} within {R:F1} arcmin with colour; {Members} on the red-giant ridge (sigma {Sig:F3} mag), {Entered} with a usable index enter as one block at [Fe/H] = {Feh:F2} +/- {FehErr:F2}; not used: {Outside} outside the radius or without colour, {OffRidge} off the ridge, {NoIndex} members without a usable index ({Source})",
                c.Name, s.Rows, s.Matched, s.InsideRadius, c.RadiusArcmin, s.Members, s.RidgeSigmaMag, s.Entered, c.Feh, c.FehErr,
                s.Rows - s.InsideRadius, s.OffRidge, s.MembersWithoutIndex, c.Source);
            if (s.Entered == 0) log.LogWarning("cluster {Name}: no member has a usable index; the cluster adds nothing to the calibration", c.Name);
            return block;
        }
        catch (Errors.MethodException e)
        {
            throw new Errors.MethodException($"cluster '{c.Name}' ({c.Key}): {e.Message}", e);
        }
    }
}
