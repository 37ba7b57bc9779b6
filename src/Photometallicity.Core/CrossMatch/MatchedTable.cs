using System.Globalization;
using Photometallicity.Catalogues;
using Photometallicity.Errors;

namespace Photometallicity.CrossMatch;

/// <summary>
/// The matched catalogue: every left row exactly once, in input order, with all left columns; then every right
/// column under a prefix (missing where the row has no partner); then <c>sep_arcsec</c> and <c>match_flag</c>.
/// match_flag: 0 = no partner, 1 = matched, 2 = matched and a possible blend (two or more right sources
/// inside the radius). The solution is recorded in the header metadata.
/// </summary>
public static class MatchedTable
{
    public const string SeparationColumn = "sep_arcsec";
    public const string FlagColumn = "match_flag";
    public const int FlagNone = 0, FlagMatched = 1, FlagBlend = 2;

    public static Table Join(Table left, Table right, CrossMatchResult result, string rightPrefix)
    {
        if (result.RightIndex.Length != left.RowCount)
            throw new ArgumentException($"The match has {result.RightIndex.Length} rows but the left table {left.RowCount}.");
        var names = new HashSet<string>(left.Columns.Select(c => c.Name), StringComparer.Ordinal);
        var table = new Table(left.RowCount, left.Source);
        foreach (var c in left.Columns) table.Add(c);
        foreach (var c in right.Columns)
        {
            string name = rightPrefix + c.Name;
            if (!names.Add(name))
                throw new InputException($"the right column '{c.Name}' would become '{name}', which the left table already has; choose another right prefix", right.Source, column: c.Name);
            table.Add(Gather(c, result.RightIndex, name));
        }
        foreach (string reserved in new[] { SeparationColumn, FlagColumn })
        {
            if (names.Contains(reserved))
                throw new InputException($"the output column '{reserved}' already exists in the input; rename that column or choose another right prefix", left.Contains(reserved) ? left.Source : right.Source, column: reserved);
        }
        var flag = new int[left.RowCount];
        for (int i = 0; i < flag.Length; i++)
            flag[i] = result.RightIndex[i] < 0 ? FlagNone : result.Blend[i] ? FlagBlend : FlagMatched;
        table.Add(new Column<double>(SeparationColumn, (double[])result.SeparationArcsec.Clone(), unit: "arcsec",
            description: "separation from the offset-corrected narrow-band position"));
        table.Add(new Column<int>(FlagColumn, flag, description: "0 no partner, 1 matched, 2 matched and possible blend"));
        table.Metadata.AddRange(left.Metadata);
        AddKeywords(table.Metadata, result);
        return table;
    }

    private static void AddKeywords(List<(string Key, string Value, string? Comment)> m, CrossMatchResult r)
    {
        static string F(double v) => v.ToString("R", CultureInfo.InvariantCulture);
        m.Add(("XMRADIUS", F(r.RadiusUsed.Arcseconds), "cross-match radius [arcsec]"));
        m.Add(("XMNMATCH", r.Matched.ToString(CultureInfo.InvariantCulture), "left rows with a partner"));
        m.Add(("XMDRA", F(r.Offset.DRaCosDecArcsec), "offset narrow - broad, dRA cos Dec [arcsec]"));
        m.Add(("XMDDEC", F(r.Offset.DDecArcsec), "offset narrow - broad, dDec [arcsec]"));
        m.Add(("XMDRAERR", F(r.OffsetError.DRaCosDecArcsec), "standard error of XMDRA [arcsec]"));
        m.Add(("XMDDCERR", F(r.OffsetError.DDecArcsec), "standard error of XMDDEC [arcsec]"));
        m.Add(("XMNSECUR", r.SecurePairs.ToString(CultureInfo.InvariantCulture), "secure pairs in the offset solution"));
        m.Add(("XMFALEXP", F(r.ExpectedFalseMatchRate), "expected false-match rate"));
        m.Add(("XMFALMEA", F(r.MeasuredFalseMatchRate), "measured false-match rate (shifted positions)"));
    }

    private static Column Gather(Column c, int[] rows, string name) => c switch
    {
        Column<double> t => Gather(t, rows, name, double.NaN),
        Column<float> t => Gather(t, rows, name, float.NaN),
        Column<long> t => Gather(t, rows, name, 0L),
        Column<int> t => Gather(t, rows, name, 0),
        Column<short> t => Gather(t, rows, name, (short)0),
        Column<byte> t => Gather(t, rows, name, (byte)0),
        Column<bool> t => Gather(t, rows, name, false),
        Column<string> t => Gather(t, rows, name, null!),
        _ => throw new NotSupportedException($"Column '{c.Name}' of type {c.Type} cannot be joined."),
    };

    /// <summary>The partner's value per left row (parallel over fixed chunks; each row written by index).</summary>
    private static Column<T> Gather<T>(Column<T> c, int[] rows, string name, T empty)
    {
        var v = new T[rows.Length];
        var missing = new bool[rows.Length];
        var anyMissing = new bool[Chunks.Count(rows.Length)];
        var values = c.Values;
        Chunks.For(rows.Length, (chunk, lo, hi) =>
        {
            bool any = false;
            for (int i = lo; i < hi; i++)
            {
                int r = rows[i];
                if (r < 0 || c.IsMissing(r))
                {
                    v[i] = empty;
                    missing[i] = true;
                    any = true;
                }
                else
                {
                    v[i] = values[r];
                }
            }
            anyMissing[chunk] = any;
        });
        return new Column<T>(name, v, Array.IndexOf(anyMissing, true) >= 0 ? missing : null, c.Unit, c.Description);
    }
}
