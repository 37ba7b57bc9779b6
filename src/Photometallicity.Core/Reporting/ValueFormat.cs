using System.Globalization;

namespace Photometallicity.Reporting;

/// <summary>Text for numbers on figures and the summary page (invariant culture, typographic minus sign U+2212).</summary>
internal static class ValueFormat
{
    /// <summary>The value and uncertainty as strings; see <see cref="KeyNumber"/> for the rounding.</summary>
    public static (string Value, string Uncertainty) Format(KeyNumber k)
    {
        if (!double.IsFinite(k.Value)) return ("n/a", k.Uncertainty is null ? "" : "n/a");
        if (k.Format is not null)
            return (Num(k.Value, k.Format), k.Uncertainty is double u0 ? (double.IsFinite(u0) ? Num(u0, k.Format) : "n/a") : "");
        if (k.Uncertainty is not double u || !double.IsFinite(u) || u <= 0)
            return (Num(k.Value, "G6"), k.Uncertainty is null ? "" : (k.Uncertainty is double z && z == 0 ? "0" : "n/a"));
        int decimals = Math.Clamp(1 - (int)Math.Floor(Math.Log10(u)), 0, 12);
        string f = "F" + decimals.ToString(CultureInfo.InvariantCulture);
        return (Num(k.Value, f), Num(u, f));
    }

    public static string Num(double v, string format) => v.ToString(format, CultureInfo.InvariantCulture).Replace('-', '−');

    public static string Rows(long? rows) => rows is long r ? r.ToString("N0", CultureInfo.InvariantCulture) : "";
}
