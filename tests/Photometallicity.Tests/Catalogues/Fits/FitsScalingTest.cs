using Photometallicity.Catalogues;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Catalogues.Fits;

/// <summary>
/// TSCALn / TZEROn / TNULLn on read (FITS Standard 4.0, sect. 7.3.2: the scaling equation and the table "Usage of TZEROn to represent non-default integer data types", the unsigned-integer
/// convention), and numeric vector fields, on hand-made files.
/// </summary>
public class FitsScalingTest
{
    private static Table ReadOne(string tform, string[] extra, byte[] data, int width, int rows)
    {
        using var dir = new TempDir();
        string path = new FitsBytes().Header(FitsBytes.EmptyPrimary())
            .Header(FitsBytes.TableHeader(width, rows, 1, [FitsBytes.Card("TTYPE1", "'c'"), FitsBytes.Card("TFORM1", $"'{tform}'"), .. extra]))
            .Data(data).WriteTo(dir.File("t.fits"));
        return CatalogueIO.Read(path);
    }

    [Fact]
    public void Read_UnsignedConventions_GiveWiderSignedTypes()
    {
        // physical = stored + TZERO (FITS Standard 4.0, sect. 7.3.2, table "Usage of TZEROn to represent non-default integer data types").
        var b = ReadOne("B", [FitsBytes.Card("TZERO1", "-128")], FitsBytes.BigEndian((byte)0, (byte)255, (byte)128), 1, 3);
        Assert.Equal(ColumnType.Int16, b["c"].Type);
        Assert.Equal([-128.0, 127.0, 0.0], b["c"].ToDoubleArray());

        var i = ReadOne("I", [FitsBytes.Card("TZERO1", "32768")], FitsBytes.BigEndian((short)-32768, (short)32767), 2, 2);
        Assert.Equal(ColumnType.Int32, i["c"].Type);
        Assert.Equal([0.0, 65535.0], i["c"].ToDoubleArray());

        var j = ReadOne("J", [FitsBytes.Card("TZERO1", "2147483648")], FitsBytes.BigEndian(int.MinValue, int.MaxValue), 4, 2);
        Assert.Equal(ColumnType.Int64, j["c"].Type);
        Assert.Equal([0.0, 4294967295.0], j["c"].ToDoubleArray());
    }

    [Fact]
    public void Read_Unsigned64_FitsInt64OrBecomesDoubleWithNote()
    {
        var fits = ReadOne("K", [FitsBytes.Card("TZERO1", "9223372036854775808")], FitsBytes.BigEndian(long.MinValue, -1L), 8, 2);
        Assert.Equal(ColumnType.Int64, fits["c"].Type);
        Assert.Equal([0L, long.MaxValue], ((Column<long>)fits["c"]).Values);

        var big = ReadOne("K", [FitsBytes.Card("TZERO1", "9223372036854775808")], FitsBytes.BigEndian(long.MinValue, long.MaxValue), 8, 2);
        Assert.Equal(ColumnType.Double, big["c"].Type);
        Assert.Equal([0.0, 18446744073709551615.0], big["c"].ToDoubleArray());
        Assert.Contains(big.Metadata, m => m.Key == "COMMENT" && m.Value.StartsWith("column c: unsigned 64-bit values"));
    }

    [Fact]
    public void Read_ScaledIntegerWithTnull_IsDoubleWithNaN()
    {
        // physical = TZERO + TSCAL * stored; TNULL compares the stored value.
        var t = ReadOne("I", [FitsBytes.Card("TSCAL1", "0.01"), FitsBytes.Card("TZERO1", "20.0"), FitsBytes.Card("TNULL1", "-32768")],
            FitsBytes.BigEndian((short)150, (short)-32768, (short)-2000), 2, 3);
        Assert.Equal(ColumnType.Double, t["c"].Type);
        var v = t["c"].ToDoubleArray();
        Assert.Equal(21.5, v[0], 12);
        Assert.True(double.IsNaN(v[1]));
        Assert.Equal(0.0, v[2], 12);
    }

    [Fact]
    public void Read_ScaledFloat_IsDouble()
    {
        var t = ReadOne("E", [FitsBytes.Card("TSCAL1", "2.0"), FitsBytes.Card("TZERO1", "1.0")], FitsBytes.BigEndian(1.5f), 4, 1);
        Assert.Equal(ColumnType.Double, t["c"].Type);
        Assert.Equal(4.0, t["c"].GetDouble(0));
    }

    [Fact]
    public void Read_TnullOnPlainInteger_Masks()
    {
        var t = ReadOne("J", [FitsBytes.Card("TNULL1", "-999")], FitsBytes.BigEndian(5, -999), 4, 2);
        Assert.Equal(ColumnType.Int32, t["c"].Type);
        Assert.False(t["c"].IsMissing(0));
        Assert.True(t["c"].IsMissing(1));
    }

    [Fact]
    public void Read_NumericVector_BecomesNumberedColumns()
    {
        var t = ReadOne("3I", [FitsBytes.Card("TUNIT1", "'adu'")], FitsBytes.BigEndian((short)1, (short)2, (short)3, (short)4, (short)5, (short)6), 6, 2);
        Assert.Equal(["c_0", "c_1", "c_2"], t.Columns.Select(c => c.Name));
        Assert.Equal([3.0, 6.0], t["c_2"].ToDoubleArray());
        Assert.Equal("adu", t["c_1"].Unit);
    }

    [Fact]
    public void Read_ZeroRepeatField_HasNoColumn()
    {
        // r = 0 is legal and means the field holds no data (FITS Standard 4.0, sect. 7.3.1).
        using var dir = new TempDir();
        string path = new FitsBytes().Header(FitsBytes.EmptyPrimary())
            .Header(FitsBytes.TableHeader(4, 1, 2, FitsBytes.Card("TTYPE1", "'empty'"), FitsBytes.Card("TFORM1", "'0D'"),
                FitsBytes.Card("TTYPE2", "'n'"), FitsBytes.Card("TFORM2", "'J'")))
            .Data(FitsBytes.BigEndian(12)).WriteTo(dir.File("t.fits"));
        var t = CatalogueIO.Read(path);
        Assert.Equal(["n"], t.Columns.Select(c => c.Name));
        Assert.Equal(12.0, t["n"].GetDouble(0));
    }

    [Fact]
    public void Read_LogicalAndStrings()
    {
        var t = ReadOne("1L", [], [(byte)'T', (byte)'F', 0], 1, 3);
        Assert.Equal([false, false, true], Enumerable.Range(0, 3).Select(t["c"].IsMissing));
        Assert.Equal("true", t["c"].GetString(0));
        // Text ends at the first NUL; a first byte NUL is a null string (FITS Standard 4.0, sect. 7.3.3.1).
        var s = ReadOne("4A", [], FitsBytes.BigEndian("ab  ", "x\0zz", "\0\0\0\0", "\0abc", "    "), 4, 5);
        Assert.Equal(["ab", "x", null, null, ""], Enumerable.Range(0, 5).Select(s["c"].GetString));
    }
}
