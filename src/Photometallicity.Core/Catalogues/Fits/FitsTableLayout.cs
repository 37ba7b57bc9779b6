using System.Globalization;
using Photometallicity.Errors;

namespace Photometallicity.Catalogues.Fits;

/// <summary>
/// The structure of a BINTABLE extension read from its header (FITS Standard 4.0, sect. 7.3.1): row width, row
/// count and the fields, with every structural rule checked (BITPIX = 8, NAXIS = 2, GCOUNT = 1, TFORMn valid,
/// widths adding up to NAXIS1, unique names).
/// </summary>
internal sealed record FitsTableLayout(int RowBytes, int RowCount, IReadOnlyList<FitsFieldSpec> Fields)
{
    public static FitsTableLayout FromHeader(FitsHeader h)
    {
        int hdu = h.HduIndex;
        Expect(h, "BITPIX", 8);
        Expect(h, "NAXIS", 2);
        if ((h.GetLong("GCOUNT") ?? 1) != 1) throw h.Error(FitsMessages.BadKeywordValue, hdu, "GCOUNT", h.GetLong("GCOUNT"), "a BINTABLE must have GCOUNT = 1");
        long rowBytes = h.RequireLong("NAXIS1");
        long rows = h.RequireLong("NAXIS2");
        long tfields = h.RequireLong("TFIELDS");
        if (rowBytes is < 0 or > int.MaxValue / 4) throw h.Error(FitsMessages.BadKeywordValue, hdu, "NAXIS1", rowBytes, "allowed: 0 to " + int.MaxValue / 4);
        if (rows is < 0 or > int.MaxValue) throw h.Error(FitsMessages.BadKeywordValue, hdu, "NAXIS2", rows, "allowed: 0 to " + int.MaxValue);
        if (tfields is < 0 or > 999) throw h.Error(FitsMessages.BadKeywordValue, hdu, "TFIELDS", tfields, "allowed: 0 to 999");

        var fields = new List<FitsFieldSpec>();
        var seen = new Dictionary<string, int>(StringComparer.Ordinal);
        long offset = 0;
        for (int n = 1; n <= tfields; n++)
        {
            string ns = n.ToString(CultureInfo.InvariantCulture);
            string tformText = h.GetString("TFORM" + ns) ?? throw h.Error(FitsMessages.MissingKeyword, hdu, "TFORM" + ns);
            var ttype = h["TTYPE" + ns];
            string name = string.IsNullOrWhiteSpace(ttype?.Value) ? "col" + ns : ttype!.Value.Trim();
            var format = FitsColumnFormat.Parse(tformText)
                         ?? throw new InputException(Format(FitsMessages.BadTform, ns, tformText), h.File, column: name);
            string? unsupported = format.Code switch
            {
                'X' => "bit-array (X)",
                'C' => "complex (C)",
                'M' => "double complex (M)",
                'P' or 'Q' => $"variable-length array ({format.Code})",
                _ => null,
            };
            if (unsupported is not null)
                throw new InputException(Format(FitsMessages.UnsupportedTform, ns, tformText.Trim(), unsupported), h.File, column: name);

            string? unit = h.GetString("TUNIT" + ns) is { Length: > 0 } u ? u : null;
            string? description = h.GetString("TCOMM" + ns) is { Length: > 0 } d ? d : ttype?.Comment;
            double scale = h.GetDouble("TSCAL" + ns) ?? 1.0;
            double zero = h.GetDouble("TZERO" + ns) ?? 0.0;
            decimal? zeroExact = h.GetString("TZERO" + ns) is string zt && FitsNumberSyntax.TryParseDecimal(zt, out var z) ? z : null;
            bool integer = format.Code is 'B' or 'I' or 'J' or 'K';
            long? tnull = integer ? h.GetLong("TNULL" + ns) : null;
            if (format.Code is 'L' or 'A') { scale = 1.0; zero = 0.0; zeroExact = null; } // TSCAL/TZERO are not defined for L and A

            if (offset + format.FieldBytes > rowBytes) throw WidthMismatch(h, rowBytes, tfields);
            if (format.Code != 'A' && format.Repeat > MaxVectorLength)
                throw new InputException(Format(FitsMessages.UnsupportedTform, ns, tformText.Trim(), $"numeric vector (more than {MaxVectorLength} elements)"), h.File, column: name);
            int width = FitsColumnFormat.ElementBytes(format.Code);
            if (format.Code == 'A')
            {
                if (format.Repeat > 0) Add(new FitsFieldSpec(n, name, 'A', (int)offset, (int)format.Repeat, unit, description, 1, 0, null, null), n);
            }
            else if (format.Repeat == 1)
            {
                Add(new FitsFieldSpec(n, name, format.Code, (int)offset, width, unit, description, scale, zero, zeroExact, tnull), n);
            }
            else
            {
                for (int e = 0; e < format.Repeat; e++)
                    Add(new FitsFieldSpec(n, name + "_" + e.ToString(CultureInfo.InvariantCulture), format.Code, (int)(offset + e * width), width,
                        unit, description, scale, zero, zeroExact, tnull), n);
            }
            offset += format.FieldBytes;
        }
        if (offset != rowBytes) throw WidthMismatch(h, rowBytes, tfields);
        return new FitsTableLayout((int)rowBytes, (int)rows, fields);

        void Add(FitsFieldSpec spec, int n)
        {
            if (seen.TryGetValue(spec.Name, out int first))
                throw new InputException(Format(FitsMessages.DuplicateColumn, spec.Name, first, n), h.File, column: spec.Name);
            seen[spec.Name] = n;
            fields.Add(spec);
        }
    }

    /// <summary>Numeric vector fields up to this many elements are read as separate columns name_0, name_1, ...</summary>
    public const int MaxVectorLength = 1000;

    private static InputException WidthMismatch(FitsHeader h, long rowBytes, long tfields)
    {
        long sum = 0;
        for (int n = 1; n <= tfields; n++)
            sum += FitsColumnFormat.Parse(h.GetString("TFORM" + n.ToString(CultureInfo.InvariantCulture)) ?? "")?.FieldBytes ?? 0;
        return h.Error(FitsMessages.RowWidthMismatch, rowBytes, sum);
    }

    private static void Expect(FitsHeader h, string keyword, long value)
    {
        long v = h.RequireLong(keyword);
        if (v != value) throw h.Error(FitsMessages.BadKeywordValue, h.HduIndex, keyword, v, $"a BINTABLE must have {keyword} = {value}");
    }

    private static string Format(string format, params object?[] args) => string.Format(CultureInfo.InvariantCulture, format, args);
}
