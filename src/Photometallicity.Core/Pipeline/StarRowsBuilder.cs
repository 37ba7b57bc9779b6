using Photometallicity.Configuration;
using Photometallicity.CrossMatch;
using Photometallicity.Metallicity;

namespace Photometallicity.Pipeline;

/// <summary>Assembles the per-star output rows (one per broadband input row, input order) from the stage results.</summary>
public static class StarRowsBuilder
{
    public static StarRows Build(PipelineConfig config, InputCatalogues inputs, CrossMatchResult match, PhotometryProducts phot,
        MetallicityResult feh, double[] pMember, MetallicityResult? dwarf = null)
    {
        var b = inputs.Broadband;
        int n = b.RowCount;
        var ip = phot.Index;
        var idCol = config.Broadband.IdColumn is { } ic ? b.Require(ic) : null;
        var nidCol = config.Narrowband.IdColumn is { } nc ? inputs.Narrowband.Require(nc) : null;
        var ids = new string[n];
        var nids = new string?[n];
        var flag = new int[n];
        var cerr = new double[n];
        var xerr = new double[n];
        var status = new string[n];
        for (int i = 0; i < n; i++)
        {
            ids[i] = idCol?.GetString(i) ?? (i + 1).ToString(System.Globalization.CultureInfo.InvariantCulture);
            int k = match.RightIndex[i];
            nids[i] = k < 0 ? null : nidCol?.GetString(k) ?? (k + 1).ToString(System.Globalization.CultureInfo.InvariantCulture);
            flag[i] = k < 0 ? 0 : match.Blend[i] ? 2 : 1;
            cerr[i] = Math.Sqrt(ip.VarColour[i]);
            xerr[i] = Math.Sqrt(ip.VarIndex[i]);
            status[i] = StatusCodes.Star(ip.Status[i], feh.Status[i]);
        }
        return new StarRows
        {
            Id = ids,
            Ra = b.ReadOnlyDoubles(config.Broadband.RaColumn), // the input's own arrays: the rows are only read from here on
            Dec = b.ReadOnlyDoubles(config.Broadband.DecColumn),
            NarrowId = nids,
            MatchSepArcsec = match.SeparationArcsec,
            MatchFlag = flag,
            Blue0 = ip.Blue0,
            Red0 = ip.Red0,
            Narrow0 = ip.Narrow0,
            Colour0 = ip.Colour0,
            Colour0Err = cerr,
            Index0 = ip.Index0,
            Index0Err = xerr,
            CovIndexColour = ip.CovIndexColour,
            Feh = feh.Feh,
            FehLo = feh.FehLo,
            FehHi = feh.FehHi,
            PMember = pMember,
            Status = status,
            FehDwarf = dwarf?.Feh,
            FehDwarfLo = dwarf?.FehLo,
            FehDwarfHi = dwarf?.FehHi,
        };
    }
}
