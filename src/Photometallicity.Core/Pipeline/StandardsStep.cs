using Microsoft.Extensions.Logging;
using Photometallicity.Calibration;
using Photometallicity.Configuration;
using Photometallicity.CrossMatch;
using Photometallicity.Photometry;
using Photometallicity.Units;

namespace Photometallicity.Pipeline;

/// <summary>A standard that could not enter the fit at all (no photometric counterpart, unusable photometry).</summary>
public sealed record ExcludedStandard(string Set, string Id, string Reason);

/// <summary>The standards of a run, matched to the field's photometry, with those left out before the fit.</summary>
public sealed record StandardsProducts(CalibrationStandards Standards, int[] BroadbandRow, IReadOnlyList<ExcludedStandard> Excluded, int Total);

/// <summary>
/// Matches each standard set by position to the broadband catalogue (nearest partner within the set's radius,
/// one to one, no offset solved: the spectroscopic positions are taken to be on the broadband frame) and takes the
/// prepared photometry of the matched rows. Standards without a partner or with unusable photometry are listed
/// with the reason, never silently dropped.
/// </summary>
public static class StandardsStep
{
    public static StandardsProducts Build(PipelineConfig config, InputCatalogues inputs, double[] broadRa, double[] broadDec, IndexPhotometry phot, ILogger log)
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
        var standards = new CalibrationStandards
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
        return new StandardsProducts(standards, r, excluded, total);
    }
}
