using System.Globalization;
using Photometallicity.Catalogues;
using Photometallicity.Errors;

namespace Photometallicity.Calibration;

/// <summary>
/// The table of stars measured in both filter sets, for <see cref="FilterTransfer.Fit"/>: one row per star with
/// its dereddened colour and index in the old and the new filter set and their 1-sigma errors (all mag):
/// old_colour0, old_colour0_err, old_index0, old_index0_err, new_colour0, new_colour0_err, new_index0,
/// new_index0_err, and optionally new_index_colour_cov (covariance of the new index and colour, mag^2; the new
/// index contains the new colour through X = (narrow - blue) - k (blue - red)). Rows with a missing value are
/// skipped by the fit; a finite value with a missing or negative error is an error naming the row and column.
/// </summary>
public static class TransferCommonStars
{
    public static readonly string[] Columns =
        ["old_colour0", "old_colour0_err", "old_index0", "old_index0_err", "new_colour0", "new_colour0_err", "new_index0", "new_index0_err"];

    public const string CovarianceColumn = "new_index_colour_cov";

    /// <summary>The columns read as numbers (for <see cref="ReadOptions.NumericColumns"/>).</summary>
    public static IReadOnlySet<string> NumericColumns => new HashSet<string>([.. Columns, CovarianceColumn]);

    public static TransferStars FromTable(Table t, string file)
    {
        var missing = Columns.Where(c => !t.Contains(c)).ToArray();
        if (missing.Length > 0)
            throw new InputException(
                $"the table of common stars has no column{(missing.Length > 1 ? "s" : "")} {string.Join(", ", missing.Select(m => $"'{m}'"))}; it needs {string.Join(", ", Columns)} (and optionally {CovarianceColumn}); the columns found are: {string.Join(", ", t.Columns.Select(c => c.Name))}",
                file: file, column: missing[0]);
        double[] Get(string c) => t.RequireDoubles(c);
        double[] Variance(double[] value, string errColumn)
        {
            double[] e = Get(errColumn);
            var v = new double[e.Length];
            for (int i = 0; i < e.Length; i++)
            {
                if (double.IsFinite(value[i]) && !(double.IsFinite(e[i]) && e[i] >= 0))
                    throw new InputException($"error {e[i].ToString(CultureInfo.InvariantCulture)} is missing or negative where the value is given",
                        file: file, row: i + 1, column: errColumn);
                v[i] = e[i] * e[i];
            }
            return v;
        }
        double[] oc = Get("old_colour0"), ox = Get("old_index0"), nc = Get("new_colour0"), nx = Get("new_index0");
        return new TransferStars
        {
            OldColour0 = oc,
            OldIndex0 = ox,
            NewColour0 = nc,
            NewIndex0 = nx,
            VarOldColour = Variance(oc, "old_colour0_err"),
            VarOldIndex = Variance(ox, "old_index0_err"),
            VarNewColour = Variance(nc, "new_colour0_err"),
            VarNewIndex = Variance(nx, "new_index0_err"),
            CovNewIndexColour = t.Contains(CovarianceColumn) ? Get(CovarianceColumn).Select(v => double.IsFinite(v) ? v : 0.0).ToArray() : null,
        };
    }
}
