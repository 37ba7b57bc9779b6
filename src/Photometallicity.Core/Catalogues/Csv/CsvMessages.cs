namespace Photometallicity.Catalogues.Csv;

/// <summary>The user-facing messages of the CSV reader, in one place so that tests can assert the text.</summary>
internal static class CsvMessages
{
    public const string NoHeader = "no header row: the first line that is not a '#' comment must name the columns";

    public static string EmptyHeaderName(int column) => $"header: column {column} has an empty name";

    public static string DuplicateHeaderName(int column, string name, int firstColumn) =>
        $"header: column {column} repeats the name '{name}' of column {firstColumn}";

    public static string RaggedRow(int fields, int columns) =>
        $"the row has {fields} field{(fields == 1 ? "" : "s")} but the header has {columns} column{(columns == 1 ? "" : "s")}";

    public static string NotNumeric(string value) =>
        $"'{Shorten(value)}' is not a number, and this column must be numeric";

    /// <summary>
    /// CsvHelper's own reason, without its record number and byte offset (the row is named by the caller, and the
    /// offset would count from after the comment lines, which the reader skips before CsvHelper sees the file).
    /// </summary>
    public static string Malformed(string csvHelperMessage)
    {
        string reason = System.Text.RegularExpressions.Regex.Replace(csvHelperMessage, @"^Malformed CSV in record \d+: ", "");
        reason = System.Text.RegularExpressions.Regex.Replace(reason, @" \(byte offset \d+\)\.?$", "");
        return $"malformed CSV: {reason}";
    }

    public static string Unreadable(string detail) => $"cannot read the file: {detail}";

    /// <summary>Long cell values are cut in messages so that one bad cell cannot flood the terminal.</summary>
    public static string Shorten(string value) => value.Length <= 60 ? value : value[..57] + "...";
}
