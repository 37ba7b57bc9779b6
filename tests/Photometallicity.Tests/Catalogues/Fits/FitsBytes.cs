using System.Text;

namespace Photometallicity.Tests.Catalogues.Fits;

/// <summary>
/// Builds FITS files byte by byte for tests, following FITS Standard 4.0 directly (80-character cards,
/// 2880-byte blocks, headers padded with spaces and data with zeros), independently of the writer under test.
/// </summary>
internal sealed class FitsBytes
{
    private readonly MemoryStream _out = new();

    /// <summary>A card "KEY     = value" with the value right-justified to column 30 (strings are given quoted).</summary>
    public static string Card(string key, string value) => (key.PadRight(8) + "= " + value.PadLeft(20)).PadRight(80);

    public static string Raw(string image) => image.PadRight(80);

    /// <summary>The standard empty primary header.</summary>
    public static string[] EmptyPrimary() =>
        [Card("SIMPLE", "T"), Card("BITPIX", "8"), Card("NAXIS", "0"), Card("EXTEND", "T")];

    /// <summary>A BINTABLE header: XTENSION ... TFIELDS followed by the given column and extra cards.</summary>
    public static string[] TableHeader(int rowBytes, int rows, int fields, params string[] more) =>
    [
        Card("XTENSION", "'BINTABLE'"), Card("BITPIX", "8"), Card("NAXIS", "2"), Card("NAXIS1", rowBytes.ToString()),
        Card("NAXIS2", rows.ToString()), Card("PCOUNT", "0"), Card("GCOUNT", "1"), Card("TFIELDS", fields.ToString()), .. more,
    ];

    public FitsBytes Header(IEnumerable<string> cards, bool end = true)
    {
        var text = new StringBuilder();
        foreach (var c in cards) text.Append(c.PadRight(80));
        if (end) text.Append("END".PadRight(80));
        int pad = (2880 - text.Length % 2880) % 2880;
        text.Append(' ', pad);
        _out.Write(Encoding.ASCII.GetBytes(text.ToString()));
        return this;
    }

    public FitsBytes Data(byte[] data, bool pad = true)
    {
        _out.Write(data);
        if (pad) _out.Write(new byte[(2880 - data.Length % 2880) % 2880]);
        return this;
    }

    public byte[] ToArray() => _out.ToArray();

    public string WriteTo(string path)
    {
        File.WriteAllBytes(path, ToArray());
        return path;
    }

    /// <summary>Big-endian bytes of the values, concatenated.</summary>
    public static byte[] BigEndian(params object[] values)
    {
        var ms = new MemoryStream();
        foreach (var v in values)
        {
            byte[] b = v switch
            {
                double d => BitConverter.GetBytes(d),
                float f => BitConverter.GetBytes(f),
                long l => BitConverter.GetBytes(l),
                int i => BitConverter.GetBytes(i),
                short s => BitConverter.GetBytes(s),
                byte u => [u],
                string s => Encoding.ASCII.GetBytes(s),
                _ => throw new ArgumentException(v.GetType().Name),
            };
            if (BitConverter.IsLittleEndian && v is not (string or byte)) Array.Reverse(b);
            ms.Write(b);
        }
        return ms.ToArray();
    }
}
