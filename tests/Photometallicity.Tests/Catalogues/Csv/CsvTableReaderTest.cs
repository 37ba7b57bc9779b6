using Photometallicity.Catalogues;

namespace Photometallicity.Tests.Catalogues.Csv;

public class CsvTableReaderTest
{
    [Fact]
    public void Read_InfersTypesFromContent()
    {
        var t = CsvFiles.Read("id,gmag,flag,name,big\n1,20.5,true,a,1\n2,21,false,b,12345678901234567890\n");
        Assert.Equal(ColumnType.Int64, t["id"].Type);
        Assert.Equal(ColumnType.Double, t["gmag"].Type);
        Assert.Equal(ColumnType.Boolean, t["flag"].Type);
        Assert.Equal(ColumnType.String, t["name"].Type);
        Assert.Equal(ColumnType.Double, t["big"].Type); // does not fit in a long
        Assert.Equal([1L, 2L], ((Column<long>)t["id"]).Values);
        Assert.Equal([20.5, 21.0], ((Column<double>)t["gmag"]).Values);
        Assert.Equal([true, false], ((Column<bool>)t["flag"]).Values);
        Assert.Equal(["a", "b"], ((Column<string>)t["name"]).Values);
        Assert.Equal(1.2345678901234567e19, t["big"].GetDouble(1));
    }

    [Fact]
    public void Read_IntegersThenReal_BecomesDouble()
    {
        var t = CsvFiles.Read("x\n1\n2\n2.5\n-4e1\n");
        Assert.Equal(ColumnType.Double, t["x"].Type);
        Assert.Equal([1.0, 2.0, 2.5, -40.0], ((Column<double>)t["x"]).Values);
    }

    [Fact]
    public void Read_NumbersThenText_KeepsTheOriginalText()
    {
        var t = CsvFiles.Read("id,v\n007,1\n1.50,2\n,3\nA12,4\n");
        var id = Assert.IsType<Column<string>>(t["id"]);
        Assert.Equal((IEnumerable<string?>)["007", "1.50", null, "A12"], id.Values);
    }

    [Fact]
    public void Read_SentinelThenText_KeepsTheSentinelText()
    {
        var t = CsvFiles.Read("id\n-99\nnan\nX1\n", new ReadOptions { MissingSentinels = [-99] });
        Assert.Equal((IEnumerable<string?>)["-99", null, "X1"], ((Column<string>)t["id"]).Values);
    }

    [Fact]
    public void Read_BooleansThenText_BecomesString()
    {
        var t = CsvFiles.Read("f\nTrue\nfalse\nmaybe\n");
        Assert.Equal(["True", "false", "maybe"], ((Column<string>)t["f"]).Values);
    }

    [Fact]
    public void Read_MissingMarkers()
    {
        var t = CsvFiles.Read("a,b,c,s\n1,NaN,true,x\n,2.5,,null\nnull,nan,NULL,\n4,NAN,false,\"\"\n");
        var a = (Column<long>)t["a"];
        Assert.False(a.IsMissing(0));
        Assert.True(a.IsMissing(1));
        Assert.True(a.IsMissing(2));
        Assert.Equal(4L, a.Values[3]);
        var b = (Column<double>)t["b"];
        Assert.True(double.IsNaN(b.Values[0]) && double.IsNaN(b.Values[2]) && double.IsNaN(b.Values[3]));
        Assert.Equal(2.5, b.Values[1]);
        var c = (Column<bool>)t["c"];
        Assert.True(c.IsMissing(1) && c.IsMissing(2) && !c.IsMissing(3));
        var s = (Column<string>)t["s"];
        Assert.Equal((IEnumerable<string?>)["x", null, null, ""], s.Values); // "" is an empty string, an empty cell is missing
    }

    [Fact]
    public void Read_AllMissingColumn_IsDoubleNaN()
    {
        var t = CsvFiles.Read("a,b\n1,\n2,nan\n");
        Assert.Equal(ColumnType.Double, t["b"].Type);
        Assert.True(t["b"].IsMissing(0) && t["b"].IsMissing(1));
    }

    [Fact]
    public void Read_Sentinels_BecomeMissingWithinTolerance()
    {
        var opts = new ReadOptions { MissingSentinels = [99.999, -99] };
        var t = CsvFiles.Read("m,n\n99.999,-99\n99.99900000000001,5\n99.998,-99.0\n20.1,-98\n", opts);
        var m = t["m"];
        Assert.True(m.IsMissing(0));
        Assert.True(m.IsMissing(1)); // within 1e-9 relative
        Assert.False(m.IsMissing(2));
        Assert.Equal(99.998, m.GetDouble(2));
        var n = t["n"];
        Assert.Equal(ColumnType.Double, n.Type); // -99.0 is not an integer literal
        Assert.True(n.IsMissing(0) && n.IsMissing(2));
        Assert.Equal(5.0, n.GetDouble(1));
        Assert.Equal(-98.0, n.GetDouble(3));
    }

    [Fact]
    public void Read_BomAndCrlf()
    {
        var t = CsvFiles.Read("ra,dec\r\n10.5,-3\r\n11,4.25\r\n", bom: true);
        Assert.Equal(["ra", "dec"], t.Columns.Select(c => c.Name));
        Assert.Equal([10.5, 11.0], t["ra"].ToDoubleArray());
        Assert.Equal([-3.0, 4.25], t["dec"].ToDoubleArray());
    }

    [Fact]
    public void Read_QuotedFields_WithCommasQuotesAndNewlines()
    {
        var t = CsvFiles.Read("name,note,x\n\"Smith, J.\",\"said \"\"hi\"\"\nthen left\",1\nplain,\" padded \",2\n");
        var name = (Column<string>)t["name"];
        var note = (Column<string>)t["note"];
        Assert.Equal(["Smith, J.", "plain"], name.Values);
        Assert.Equal(["said \"hi\"\nthen left", " padded "], note.Values);
        Assert.Equal([1L, 2L], ((Column<long>)t["x"]).Values);
    }

    [Fact]
    public void Read_TrimsSpacesAroundUnquotedCells()
    {
        var t = CsvFiles.Read(" a , b \n 1 , x y \n");
        Assert.Equal(["a", "b"], t.Columns.Select(c => c.Name));
        Assert.Equal(1L, ((Column<long>)t["a"]).Values[0]);
        Assert.Equal("x y", ((Column<string>)t["b"]).Values[0]);
    }

    [Fact]
    public void Read_CommentLinesBeforeHeader_AreSkipped_BlankLinesToo()
    {
        var t = CsvFiles.Read("# invented test field\n#units: mag\na,b\n1,2\n\n3,4\n", bom: true);
        Assert.Equal(["a", "b"], t.Columns.Select(c => c.Name));
        Assert.Equal(2, t.RowCount);
    }

    [Fact]
    public void Read_HashInsideData_IsData()
    {
        var t = CsvFiles.Read("id,x\n#1,2\n");
        Assert.Equal("#1", t["id"].GetString(0));
    }

    [Fact]
    public void Read_HeaderOnly_GivesZeroRows()
    {
        var t = CsvFiles.Read("id,ra,dec\n");
        Assert.Equal(0, t.RowCount);
        Assert.Equal(3, t.Columns.Count);
    }

    [Fact]
    public void Read_TextColumns_AreForcedToString()
    {
        var t = CsvFiles.Read("id,x\n007,1\n12,2\n", new ReadOptions { TextColumns = new HashSet<string> { "id" } });
        Assert.Equal(["007", "12"], ((Column<string>)t["id"]).Values);
        Assert.Equal(ColumnType.Int64, t["x"].Type);
    }

    [Fact]
    public void Read_NumericColumns_AcceptNumbersAndMissing()
    {
        var t = CsvFiles.Read("x\n1\n\n2.5\nnan\n", new ReadOptions { NumericColumns = new HashSet<string> { "x" } });
        Assert.Equal(ColumnType.Double, t["x"].Type);
        Assert.Equal(3, t.RowCount); // the blank line is skipped
    }

    [Fact]
    public void Read_InvariantCulture_CommaIsNotADecimalSeparator()
    {
        var t = CsvFiles.Read("x,y\n\"1,5\",1.5\n");
        Assert.Equal(ColumnType.String, t["x"].Type);
        Assert.Equal(1.5, t["y"].GetDouble(0));
    }
}
