using System.Buffers.Binary;
using System.Text;

namespace Photometallicity.Reporting;

/// <summary>
/// Records a print resolution in a PNG: inserts a pHYs chunk (pixels per metre, unit specifier 1) right after
/// IHDR, replacing any there was. Chunk layout and CRC-32 (polynomial 0xEDB88320 over type and data) as in
/// the PNG specification (W3C / ISO/IEC 15948:2004, sections 5.3 and 11.3.5.3, Annex D).
/// </summary>
internal static class PngDensity
{
    private static readonly byte[] Signature = [137, 80, 78, 71, 13, 10, 26, 10];
    private static readonly uint[] CrcTable = BuildCrcTable();

    public static byte[] WithDpi(byte[] png, double dpi)
    {
        if (png.Length < 33 || !png.AsSpan(0, 8).SequenceEqual(Signature) || Encoding.ASCII.GetString(png, 12, 4) != "IHDR")
            throw new InvalidOperationException("The encoder did not produce a PNG with an IHDR chunk.");
        uint ppm = (uint)Math.Round(dpi / 0.0254);
        var output = new MemoryStream(png.Length + 21);
        output.Write(png, 0, 33); // signature + IHDR (length 4, type 4, data 13, CRC 4)
        var data = new byte[9];
        BinaryPrimitives.WriteUInt32BigEndian(data.AsSpan(0), ppm);
        BinaryPrimitives.WriteUInt32BigEndian(data.AsSpan(4), ppm);
        data[8] = 1; // unit: metre
        WriteChunk(output, "pHYs", data);
        int pos = 33;
        while (pos + 12 <= png.Length)
        {
            int len = (int)BinaryPrimitives.ReadUInt32BigEndian(png.AsSpan(pos));
            string type = Encoding.ASCII.GetString(png, pos + 4, 4);
            int total = 12 + len;
            if (type != "pHYs") output.Write(png, pos, total);
            pos += total;
        }
        return output.ToArray();
    }

    private static void WriteChunk(Stream s, string type, byte[] data)
    {
        Span<byte> head = stackalloc byte[8];
        BinaryPrimitives.WriteUInt32BigEndian(head, (uint)data.Length);
        Encoding.ASCII.GetBytes(type, head[4..]);
        s.Write(head);
        s.Write(data);
        uint crc = Crc(head[4..], data);
        Span<byte> tail = stackalloc byte[4];
        BinaryPrimitives.WriteUInt32BigEndian(tail, crc);
        s.Write(tail);
    }

    internal static uint Crc(ReadOnlySpan<byte> type, ReadOnlySpan<byte> data)
    {
        uint c = 0xFFFFFFFFu;
        foreach (byte b in type) c = CrcTable[(c ^ b) & 0xFF] ^ (c >> 8);
        foreach (byte b in data) c = CrcTable[(c ^ b) & 0xFF] ^ (c >> 8);
        return c ^ 0xFFFFFFFFu;
    }

    private static uint[] BuildCrcTable()
    {
        var t = new uint[256];
        for (uint n = 0; n < 256; n++)
        {
            uint c = n;
            for (int k = 0; k < 8; k++) c = (c & 1) != 0 ? 0xEDB88320u ^ (c >> 1) : c >> 1;
            t[n] = c;
        }
        return t;
    }
}
