using Photometallicity.Catalogues;
using Photometallicity.Errors;
using Photometallicity.Numerics;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Fits;

/// <summary>
/// Damaged copies of a valid file (cut at many lengths, header bytes overwritten) either read or fail with an
/// <see cref="InputException"/>; no other exception escapes. Corruptions are drawn from a fixed seed.
/// </summary>
public class FitsCorruptionTest
{
    private static byte[] ValidFile(TempDir dir)
    {
        var t = new Table(
        [
            new Column<double>("x", [1.0, 2.0, double.NaN]),
            new Column<int>("n", [1, 2, 3], new[] { false, true, false }),
            new Column<string>("s", ["a", "bb", null!]),
            new Column<bool>("ok", [true, false, true]),
        ]);
        t.Metadata.Add(("NOTE", new string('z', 150), null));
        string path = dir.File("ok.fits");
        CatalogueIO.Write(t, path);
        return File.ReadAllBytes(path);
    }

    private static void ReadsOrInputError(byte[] bytes, string path)
    {
        File.WriteAllBytes(path, bytes);
        try
        {
            CatalogueIO.Read(path);
        }
        catch (InputException)
        {
        }
    }

    [Fact]
    public void Read_CutAtAnyLength_ReadsOrInputError()
    {
        using var dir = new TempDir();
        var bytes = ValidFile(dir);
        string path = dir.File("cut.fits");
        for (int len = 1; len < bytes.Length; len += 97)
            ReadsOrInputError(bytes[..len], path);
        // Cut inside the table data: a truncation error, not a partial table.
        File.WriteAllBytes(path, bytes[..(2 * 2880 + 10)]);
        Assert.Contains("the table is truncated", Assert.Throws<InputException>(() => CatalogueIO.Read(path)).Message);
    }

    [Fact]
    public void Read_HeaderBytesOverwritten_ReadsOrInputError()
    {
        using var dir = new TempDir();
        var bytes = ValidFile(dir);
        string path = dir.File("bad.fits");
        var rng = new Rng(20260101);
        byte[] alphabet = "0123456789 -+.'=/ABCDEFGHIJKLMNOPQRSTUVWXYZTFDE()&\0"u8.ToArray();
        for (int trial = 0; trial < 200; trial++)
        {
            var copy = (byte[])bytes.Clone();
            int edits = 1 + rng.NextInt(4);
            for (int k = 0; k < edits; k++)
            {
                // Header region of the extension (the first 12 cards hold the structural keywords).
                int pos = 2880 + rng.NextInt(80 * 20);
                copy[pos] = alphabet[rng.NextInt(alphabet.Length)];
            }
            ReadsOrInputError(copy, path);
        }
    }
}
