using System.Text;

namespace Photometallicity.Errors;

/// <summary>
/// Bad user input: a file, row, column, config key or value that is wrong. Exit code 2.
/// The message always says where (file, row, column or key) and what is wrong.
/// </summary>
public sealed class InputException : PhotometallicityException
{
    public InputException(string message, string? file = null, long? row = null, string? column = null, Exception? inner = null)
        : base(Compose(message, file, row, column), inner)
    {
        File = file;
        Row = row;
        Column = column;
    }

    /// <summary>The file concerned, if any.</summary>
    public string? File { get; }

    /// <summary>1-based data row number (header excluded), if any.</summary>
    public long? Row { get; }

    /// <summary>The column concerned, if any.</summary>
    public string? Column { get; }

    public override int ExitCode => 2;

    private static string Compose(string message, string? file, long? row, string? column)
    {
        var where = new StringBuilder();
        if (file is not null) where.Append(file);
        if (row is not null) where.Append(where.Length > 0 ? ", " : "").Append("row ").Append(row.Value);
        if (column is not null) where.Append(where.Length > 0 ? ", " : "").Append("column '").Append(column).Append('\'');
        return where.Length == 0 ? message : $"{where}: {message}";
    }
}
