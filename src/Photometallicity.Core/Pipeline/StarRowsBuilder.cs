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
        var flag = new int[n];
        var cerr = new double[n];
        var xerr = new double[n];
        var status = new string[n];
        for (int i = 0; i < n; i++)
        {
            int k = match.RightIndex[i];
            flag[i] = k < 0 ? 0 : match.Blend[i] ? 2 : 1;
            cerr[i] = Math.Sqrt(ip.VarColour[i]);
            xerr[i] = Math.Sqrt(ip.VarIndex[i]);
            status[i] = StatusCodes.Star(ip.Status[i], feh.Status[i]);
        }
        return new StarRows
        {
            Id = TextIds(idCol, n, null),
            Ra = b.ReadOnlyDoubles(config.Broadband.RaColumn), // the input's own arrays: the rows are only read from here on
            Dec = b.ReadOnlyDoubles(config.Broadband.DecColumn),
            NarrowId = TextIds(nidCol, n, match.RightIndex),
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

    /// <summary>
    /// Ids as text, per output row: the id column's value at row i (or at rows[i], missing where that is negative), or the
    /// 1-based row number when there is no id column. An input text column is shared as it is when rows is null.
    /// </summary>
    private static Catalogues.Column TextIds(Catalogues.Column? ids, int n, int[]? rows)
    {
        if (rows is null && ids is { Type: Catalogues.ColumnType.String }) return ids;
        var at = rows ?? Enumerable.Range(0, n).ToArray();
        if (ids is not null) return Catalogues.Utf8Column.Gather("id", ids, at);
        var b = new Catalogues.Utf8Column.Builder("id", n);
        Span<byte> buf = stackalloc byte[12];
        foreach (int k in at)
        {
            if (k < 0) { b.AddMissing(); continue; }
            (k + 1).TryFormat(buf, out int len, default, System.Globalization.CultureInfo.InvariantCulture);
            b.Add(buf[..len]);
        }
        return b.ToColumn();
    }
}
