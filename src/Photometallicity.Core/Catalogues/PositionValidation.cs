using System.Globalization;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues;

/// <summary>
/// Checks a catalogue's positions and ids once, when it is read, so that the stages can trust them: RA in
/// [0, 360) deg, Dec in [-90, 90] deg (ICRS degrees, the project's convention), no missing or NaN position,
/// numeric position columns, and (when an id column is named) every row with an id that no other row has.
/// Each failure is an <see cref="InputException"/> naming the file (<see cref="Table.Source"/>), the 1-based row,
/// the column and the bad value.
/// </summary>
public static class PositionValidation
{
    public static void Validate(Table table, string raColumn, string decColumn, string? idColumn)
    {
        var ra = RequireNumeric(table, raColumn);
        var dec = RequireNumeric(table, decColumn);
        for (int i = 0; i < ra.Length; i++)
        {
            double a = ra[i], d = dec[i];
            if (double.IsNaN(a)) throw new InputException(PositionMessages.Missing("RA"), table.Source, i + 1, raColumn);
            if (double.IsNaN(d)) throw new InputException(PositionMessages.Missing("Dec"), table.Source, i + 1, decColumn);
            if (!(a >= 0.0 && a < 360.0)) throw new InputException(PositionMessages.RaOutOfRange(a), table.Source, i + 1, raColumn);
            if (!(d >= -90.0 && d <= 90.0)) throw new InputException(PositionMessages.DecOutOfRange(d), table.Source, i + 1, decColumn);
        }
        if (idColumn is not null) RequireUniqueIds(table, idColumn);
    }

    /// <summary>
    /// The named column as doubles (NaN where missing). A text column whose every value parses as a number is
    /// accepted; a cell that does not, or a boolean column, is an error naming the row and the value.
    /// </summary>
    public static double[] RequireNumeric(Table table, string column, string? configKey = null)
    {
        var c = table.Require(column, configKey);
        if (c.Type == ColumnType.Boolean)
            throw new InputException(PositionMessages.BooleanNotNumeric, table.Source, column: column);
        var values = c.ToDoubleArray();
        if (c.Type == ColumnType.String)
            for (int i = 0; i < values.Length; i++)
                if (double.IsNaN(values[i]) && c.GetString(i) is { } text && !IsNaNText(text))
                    throw new InputException(PositionMessages.NotNumeric(text), table.Source, i + 1, column);
        return values;
    }

    /// <summary>Every row has an id, and no two rows the same one (compared as invariant text, or as integers).</summary>
    public static void RequireUniqueIds(Table table, string idColumn)
    {
        var c = table.Require(idColumn);
        if (c is Column<long> longs)
        {
            var seen = new Dictionary<long, int>(c.Length);
            for (int i = 0; i < c.Length; i++)
            {
                if (c.IsMissing(i)) throw new InputException(PositionMessages.MissingId, table.Source, i + 1, idColumn);
                if (!seen.TryAdd(longs.Values[i], i))
                    throw new InputException(PositionMessages.DuplicateId(c.GetString(i)!, seen[longs.Values[i]] + 1, i + 1), table.Source, i + 1, idColumn);
            }
            return;
        }
        if (c is Utf8Column utf8)
        {
            RequireUniqueUtf8(table, idColumn, utf8);
            return;
        }
        var seenText = new Dictionary<string, int>(c.Length, StringComparer.Ordinal);
        for (int i = 0; i < c.Length; i++)
        {
            string? id = c.GetString(i);
            if (id is null) throw new InputException(PositionMessages.MissingId, table.Source, i + 1, idColumn);
            if (!seenText.TryAdd(id, i))
                throw new InputException(PositionMessages.DuplicateId(id, seenText[id] + 1, i + 1), table.Source, i + 1, idColumn);
        }
    }

    /// <summary>
    /// The same check and the same first error (rows taken in order) for a <see cref="Utf8Column"/>, without a string per
    /// row: an open-addressing table of row numbers (linear probing, at most half full) keyed by a hash of the bytes.
    /// </summary>
    private static void RequireUniqueUtf8(Table table, string idColumn, Utf8Column c)
    {
        int n = c.Length;
        int size = (int)Math.Min(Array.MaxLength, Math.Max(16, System.Numerics.BitOperations.RoundUpToPowerOf2((uint)Math.Max(1, 2 * n))));
        var slots = new int[size];
        Array.Fill(slots, -1);
        int mask = size - 1;
        for (int i = 0; i < n; i++)
        {
            if (c.IsMissing(i)) throw new InputException(PositionMessages.MissingId, table.Source, i + 1, idColumn);
            var id = c.Utf8(i);
            var h = new HashCode();
            h.AddBytes(id);
            int s = h.ToHashCode() & mask;
            while (slots[s] >= 0)
            {
                int j = slots[s];
                if (c.Utf8(j).SequenceEqual(id))
                    throw new InputException(PositionMessages.DuplicateId(c.GetString(i)!, j + 1, i + 1), table.Source, i + 1, idColumn);
                s = (s + 1) & mask;
            }
            slots[s] = i;
        }
    }

    private static bool IsNaNText(string s) => double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out var x) && double.IsNaN(x);
}

/// <summary>The messages of <see cref="PositionValidation"/>, in one place so that tests can assert the text.</summary>
internal static class PositionMessages
{
    public const string MissingId = "the id is missing; every row needs one";
    public const string BooleanNotNumeric = "the column holds true/false values, not numbers";

    public static string Missing(string coordinate) => $"{coordinate} is missing (empty or NaN); every row needs a position";

    public static string RaOutOfRange(double ra) => $"RA = {Format(ra)} deg is outside [0, 360)";

    public static string DecOutOfRange(double dec) => $"Dec = {Format(dec)} deg is outside [-90, 90]";

    public static string NotNumeric(string value) => $"'{value}' is not a number";

    public static string DuplicateId(string id, int firstRow, int row) => $"id '{id}' is repeated: rows {firstRow} and {row} both have it";

    private static string Format(double x) => x.ToString("R", CultureInfo.InvariantCulture);
}
