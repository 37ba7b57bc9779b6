using System.Buffers.Binary;
using System.IO.Compression;
using System.Text;
using System.Xml.Linq;
using Photometallicity.Reporting;

namespace Photometallicity.Tests.Reporting;

/// <summary>
/// Independent checks of written figures against the open standards: PNG structure per the PNG specification
/// (W3C / ISO/IEC 15948:2004: signature, chunk CRCs, IHDR fields, IDAT a zlib stream of height x (1 + width x
/// bytes per pixel) bytes, decoded here with .NET's zlib) and SVG as well-formed XML with an svg root in the
/// SVG namespace.
/// </summary>
internal static class FigureChecks
{
    public sealed record PngInfo(int Width, int Height, int BitDepth, int ColourType, uint? PixelsPerMetre, string[] Chunks);

    private static readonly byte[] Signature = [137, 80, 78, 71, 13, 10, 26, 10];

    public static PngInfo Png(string path) => Png(File.ReadAllBytes(path));

    public static PngInfo Png(byte[] png)
    {
        Assert.True(png.Length > 64, "PNG too short");
        Assert.Equal(Signature, png[..8]);
        var chunks = new List<string>();
        var idat = new MemoryStream();
        int width = 0, height = 0, depth = 0, colourType = 0;
        uint? ppm = null;
        int pos = 8;
        while (pos < png.Length)
        {
            int len = (int)BinaryPrimitives.ReadUInt32BigEndian(png.AsSpan(pos));
            string type = Encoding.ASCII.GetString(png, pos + 4, 4);
            var data = png.AsSpan(pos + 8, len);
            uint crc = BinaryPrimitives.ReadUInt32BigEndian(png.AsSpan(pos + 8 + len));
            Assert.Equal(Crc32(png.AsSpan(pos + 4, 4 + len)), crc);
            chunks.Add(type);
            if (type == "IHDR")
            {
                width = (int)BinaryPrimitives.ReadUInt32BigEndian(data);
                height = (int)BinaryPrimitives.ReadUInt32BigEndian(data[4..]);
                depth = data[8];
                colourType = data[9];
            }
            else if (type == "pHYs")
            {
                ppm = BinaryPrimitives.ReadUInt32BigEndian(data);
                Assert.Equal(ppm, BinaryPrimitives.ReadUInt32BigEndian(data[4..]));
                Assert.Equal(1, data[8]);
            }
            else if (type == "IDAT") idat.Write(data);
            pos += 12 + len;
        }
        Assert.Equal("IHDR", chunks[0]);
        Assert.Equal("IEND", chunks[^1]);
        int channels = colourType switch { 0 => 1, 2 => 3, 4 => 2, 6 => 4, _ => 0 };
        Assert.True(channels > 0 && depth == 8, $"unexpected PNG colour type {colourType} / depth {depth}");
        idat.Position = 0;
        using var z = new ZLibStream(idat, CompressionMode.Decompress);
        var raw = new MemoryStream();
        z.CopyTo(raw);
        Assert.Equal((long)height * (1 + width * channels), raw.Length);
        return new PngInfo(width, height, depth, colourType, ppm, chunks.ToArray());
    }

    public static XDocument Svg(string path)
    {
        var doc = XDocument.Load(path);
        Assert.Equal(XName.Get("svg", "http://www.w3.org/2000/svg"), doc.Root!.Name);
        return doc;
    }

    /// <summary>All text content of the SVG's text elements, whitespace-trimmed.</summary>
    public static string[] SvgTexts(XDocument svg) =>
        svg.Descendants(XName.Get("text", "http://www.w3.org/2000/svg")).Select(t => t.Value.Trim()).Where(t => t.Length > 0).ToArray();

    /// <summary>Checks both files of a figure at the default size and returns the SVG's texts.</summary>
    public static string[] Valid(FigureFiles files, int width = 1200, int height = 900)
    {
        var png = Png(files.PngPath);
        Assert.Equal(width, png.Width);
        Assert.Equal(height, png.Height);
        Assert.Equal(5906u, png.PixelsPerMetre); // 150 dpi = 150 / 0.0254 m
        Assert.True(new FileInfo(files.PngPath).Length > 20_000, "PNG suspiciously small");
        Assert.True(new FileInfo(files.SvgPath).Length > 20_000, "SVG suspiciously small");
        return SvgTexts(Svg(files.SvgPath));
    }

    /// <summary>CRC-32 of ISO 3309 / ITU-T V.42 as the PNG specification uses it, bit by bit.</summary>
    public static uint Crc32(ReadOnlySpan<byte> bytes)
    {
        uint c = 0xFFFFFFFF;
        foreach (byte b in bytes)
        {
            c ^= b;
            for (int k = 0; k < 8; k++) c = (c & 1) != 0 ? (c >> 1) ^ 0xEDB88320 : c >> 1;
        }
        return ~c;
    }
}
