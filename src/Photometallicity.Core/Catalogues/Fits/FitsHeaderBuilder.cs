using System.Globalization;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// Builds the two headers this project writes (FITS Standard 4.0, sect. 4.4.1 and 7.3.1): an empty primary HDU
/// (NAXIS = 0, EXTEND = T) and the BINTABLE extension header with the column keywords and the table metadata.
/// <para>Metadata rules: keys that are structural here (NAXISn, TFORMn, EXTNAME, ...) are left out, as the writer
/// makes its own. COMMENT and HISTORY become commentary cards. Keys of 1-8 characters from A-Z, 0-9, '_' and '-'
/// become ordinary cards; any other printable-ASCII key without '=' is written with the HIERARCH convention (case
/// kept; a string that does not fit the one card is cut); keys that cannot be written either way are skipped.
/// Values "T"/"F" are written as logicals, values in FITS integer or float syntax as numbers, anything else as a
/// quoted string (continued on CONTINUE cards when long), so a string keyword read as 'T' or '42' comes back as a
/// logical or a number, and complex or undefined values come back as strings. Non-ASCII characters in values and
/// comments become '?'.</para>
/// </summary>
internal static class FitsHeaderBuilder
{
    public static byte[] Primary()
    {
        var w = new FitsCardWriter();
        w.Logical("SIMPLE", true, "conforms to FITS Standard 4.0");
        w.Integer("BITPIX", 8, "no primary data");
        w.Integer("NAXIS", 0, "no primary data");
        w.Logical("EXTEND", true, "a binary table extension follows");
        w.End();
        return w.ToBlocks();
    }

    public static byte[] Extension(Table table, IReadOnlyList<FitsColumnEncoder> encoders, int rowBytes, string extensionName)
    {
        var w = new FitsCardWriter();
        w.String("XTENSION", "BINTABLE", "binary table extension");
        w.Integer("BITPIX", 8, "8-bit bytes");
        w.Integer("NAXIS", 2, "2-dimensional table");
        w.Integer("NAXIS1", rowBytes, "bytes per row");
        w.Integer("NAXIS2", table.RowCount, "rows");
        w.Integer("PCOUNT", 0, "no heap");
        w.Integer("GCOUNT", 1, "one group");
        w.Integer("TFIELDS", encoders.Count, "columns");
        for (int i = 0; i < encoders.Count; i++)
        {
            var e = encoders[i];
            var c = e.Column;
            string n = (i + 1).ToString(CultureInfo.InvariantCulture);
            if (!FitsKeywords.IsPrintableAscii(c.Name))
                throw new InputException(string.Format(CultureInfo.InvariantCulture, FitsMessages.NameNotAscii, c.Name), table.Source, column: c.Name);
            w.String("TTYPE" + n, c.Name, c.Description);
            w.String("TFORM" + n, e.Tform);
            if (!string.IsNullOrEmpty(c.Unit))
            {
                if (!FitsKeywords.IsPrintableAscii(c.Unit))
                    throw new InputException(string.Format(CultureInfo.InvariantCulture, FitsMessages.UnitNotAscii, c.Unit, c.Name), table.Source, column: c.Name);
                w.String("TUNIT" + n, c.Unit);
            }
            if (e.Null is long tnull) w.Integer("TNULL" + n, tnull, "value of a missing entry");
            // TCOMMn is not defined by FITS Standard 4.0: it is a keyword some table tools use for a column description.
            // Readers that do not know it keep it as a plain keyword; the TTYPEn comment carries the same text (cut to fit).
            if (!string.IsNullOrEmpty(c.Description)) w.String("TCOMM" + n, c.Description);
        }
        w.String("EXTNAME", extensionName, "name of this table");
        foreach (var (key, value, comment) in table.Metadata) Metadata(w, key, value, comment);
        w.End();
        return w.ToBlocks();
    }

    private static void Metadata(FitsCardWriter w, string key, string value, string? comment)
    {
        if (key is "COMMENT" or "HISTORY") { w.Commentary(key, value); return; }
        if (FitsKeywords.IsStructural(key.ToUpperInvariant()) || key.Trim().Length == 0) return;
        bool number = value.Length <= 70 && (FitsNumberSyntax.IsInteger(value) || FitsNumberSyntax.IsFloat(value));
        bool logical = value is "T" or "F";
        if (FitsKeywords.IsStandardName(key))
        {
            if (logical || number) w.Fixed(key, value, comment);
            else w.String(key, value, comment);
            return;
        }
        w.Hierarch(key, value, quoted: !(logical || number), comment);
    }
}
