namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// Every user-facing message of the FITS reader and writer, in one place so that tests can assert the text.
/// Placeholders are filled with <see cref="string.Format(string, object?[])"/>-style positions.
/// </summary>
internal static class FitsMessages
{
    public const string NotFits = "not a FITS file: the first header card is not 'SIMPLE  =                    T' (FITS Standard 4.0, sect. 4.4.1.1)";
    public const string NoEndCard = "the header of HDU {0} has no END card before the end of the file (byte {1})";
    public const string HeaderTooLong = "the header of HDU {0} has more than {1} cards and no END card; the file is damaged or not FITS";
    public const string HduTruncated = "the file ends inside the data of HDU {0}: it needs {1} bytes of data from byte {2} but the file has {3} bytes";
    public const string BadNumber = "HDU {0}: keyword {1} has the value '{2}', which is not {3}";
    public const string MissingKeyword = "HDU {0}: the required keyword {1} is missing";
    public const string BadKeywordValue = "HDU {0}: keyword {1} = {2} is not allowed ({3})";
    public const string UnclosedString = "HDU {0}: the string value of keyword {1} has no closing quote";
    public const string NoTable = "no BINTABLE extension in the file; the HDUs found are: {0}";
    public const string NoSuchExtension = "no BINTABLE extension with EXTNAME '{0}'; the EXTNAMEs found are: {1}";
    public const string AsciiTable = "HDU {0} (EXTNAME '{1}') is an ASCII TABLE extension, which is not supported; convert it to a BINTABLE";
    public const string BadTform = "TFORM{0} = '{1}' is not a valid binary-table format (expected rT with T one of L X B I J K A E D C M P Q)";
    public const string UnsupportedTform = "TFORM{0} = '{1}': {2} columns are not supported (supported: L, B, I, J, K, E, D, rA and numeric vectors rB..rD)";
    public const string RowWidthMismatch = "NAXIS1 = {0} bytes per row, but the TFORMn formats add up to {1} bytes";
    public const string DataTruncated = "the table is truncated: NAXIS2 = {0} rows of NAXIS1 = {1} bytes need {2} bytes of data from byte {3}, but only {4} are present";
    public const string DuplicateColumn = "column name '{0}' occurs twice (TTYPE{1} and TTYPE{2})";
    public const string BadLogical = "logical value byte 0x{0:X2} at row {1} is not 'T', 'F' or 0";
    public const string NameNotAscii = "column name '{0}' has characters outside printable ASCII, which a FITS header cannot hold";
    public const string UnitNotAscii = "the unit '{0}' of column '{1}' has characters outside printable ASCII, which a FITS header cannot hold";
    public const string ExtNameInvalid = "EXTNAME '{0}' is empty or has characters outside printable ASCII";
    public const string Unsigned64AsDouble = "column {0}: unsigned 64-bit values above 9223372036854775807 were read as Double (exact only up to 2^53)";
}
