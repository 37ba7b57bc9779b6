using System.Diagnostics;
using Photometallicity.Calibration;
using Photometallicity.Errors;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Calibration;

public class GlobularClusterCatalogueTest
{
    private static readonly Lazy<IReadOnlyList<GlobularCluster>> Shipped =
        new(() => GlobularClusterCatalogue.Load(RepoPaths.Calibration("globular_clusters.csv")));

    [Fact]
    public void Load_ShippedTable_IsHarris2010WithEveryClusterThatHasAnFeh()
    {
        var list = Shipped.Value;
        // Harris (1996; 2010 edition) lists 157 clusters, 152 of them with an [Fe/H] (part II of harris2010_mwgc.dat).
        Assert.Equal(152, list.Count);
        Assert.All(list, c => Assert.StartsWith("Harris 1996 (2010 edition)", c.Note));
        Assert.All(list, c => Assert.True(double.IsFinite(c.Ebv) && double.IsFinite(c.DistanceModulusV), c.Name));
        string text = File.ReadAllText(RepoPaths.Calibration("globular_clusters.csv"));
        Assert.Contains("Harris, W. E. 1996, AJ 112, 1487 (2010 edition, arXiv:1012.3224)", text);
        Assert.Contains("free of charge", text);
        Assert.DoesNotContain("recalled from memory", text);
    }

    [Theory]
    // Expected values typed from calibration/reference/harris2010_mwgc.dat (Harris 1996, AJ 112, 1487, 2010 edition):
    // part I RA, Dec (J2000) converted by hand, part II [Fe/H], E(B-V), (m-M)V.
    [InlineData("NGC 104", "47 Tuc", 0, 24, 5.67, -1, 72, 4, 52.6, -0.72, 0.04, 13.37)]
    [InlineData("NGC 6341", "M 92", 17, 17, 7.39, +1, 43, 8, 9.4, -2.31, 0.02, 14.65)]
    [InlineData("Pal 5", "", 15, 16, 5.25, -1, 0, 6, 41.8, -1.41, 0.03, 16.92)]       // Dec -00 06 41.8: south despite 0 degrees
    [InlineData("NGC 6528", "", 18, 4, 49.64, -1, 30, 3, 22.6, -0.11, 0.54, 16.17)]
    [InlineData("Whiting 1", "", 2, 2, 57.0, -1, 3, 15, 10.0, -0.70, 0.03, 17.49)]     // whole seconds, no other name
    [InlineData("Lynga 7", "BH184", 16, 11, 3.65, -1, 55, 19, 4.0, -1.01, 0.73, 16.78)]
    public void Load_ShippedTable_MatchesTheCatalogue(string name, string alias, int h, int m, double s, int sign, int d, int dm, double ds,
        double feh, double ebv, double dmv)
    {
        var c = GlobularClusterCatalogue.Find(Shipped.Value, name);
        Assert.NotNull(c);
        Assert.Equal((name, alias), (c!.Name, c.Alias));
        Assert.Equal(15.0 * (h + m / 60.0 + s / 3600.0), c.Centre.RaDegrees, 5e-6);
        Assert.Equal(sign * (d + dm / 60.0 + ds / 3600.0), c.Centre.DecDegrees, 5e-6);
        Assert.Equal((feh, ebv, dmv), (c.Feh, c.Ebv, c.DistanceModulusV));
    }

    [Fact]
    public void Load_ShippedTable_LeavesOutClustersWithoutFeh()
    {
        // Ko 1, Ko 2, FSR 1735, 2MS-GC01 and GLIMPSE01 have a blank [Fe/H] in part II of Harris (2010 edition).
        foreach (var n in new[] { "Ko 1", "Ko 2", "FSR 1735", "2MS-GC01", "2MASS-GC01", "GLIMPSE01" })
            Assert.Null(GlobularClusterCatalogue.Find(Shipped.Value, n));
        Assert.NotNull(GlobularClusterCatalogue.Find(Shipped.Value, "GLIMPSE02"));
    }

    [Theory]
    [InlineData("NGC 104", "NGC 104")]
    [InlineData("NGC104", "NGC 104")]
    [InlineData("ngc 104", "NGC 104")]
    [InlineData("47 Tuc", "NGC 104")]
    [InlineData("47tuc", "NGC 104")]
    [InlineData("m92", "NGC 6341")]
    [InlineData("M 15", "NGC 7078")]
    [InlineData("omega cen", "NGC 5139")]
    [InlineData("ESO 452-SC11", "1636-283")]
    [InlineData("pal7", "IC 1276")]
    public void Find_ByNameOrAlias_IgnoresCaseAndSpaces(string query, string expected)
    {
        Assert.Equal(expected, GlobularClusterCatalogue.Find(Shipped.Value, query)?.Name);
    }

    [Theory]
    [InlineData("")]
    [InlineData("  ")]
    [InlineData("M 1")] // a supernova remnant, not in the catalogue
    [InlineData("NGC 10")]
    public void Find_Unknown_IsNull(string query) => Assert.Null(GlobularClusterCatalogue.Find(Shipped.Value, query));

    [NeedsPython3Fact]
    public void Converter_ReproducesTheShippedTableByteForByte()
    {
        using var dir = new TempDir();
        string output = dir.File("gc.csv");
        var psi = new ProcessStartInfo(NeedsPython3FactAttribute.Python)
        {
            ArgumentList = { RepoPaths.Calibration("make_globular_clusters.py"), "--input", RepoPaths.Calibration("reference", "harris2010_mwgc.dat"), "--output", output },
            RedirectStandardError = true,
            RedirectStandardOutput = true,
            UseShellExecute = false,
        };
        using var p = Process.Start(psi)!;
        string err = p.StandardError.ReadToEnd();
        p.StandardOutput.ReadToEnd();
        p.WaitForExit();
        Assert.True(p.ExitCode == 0, $"converter exit {p.ExitCode}: {err}");
        Assert.Equal(File.ReadAllBytes(RepoPaths.Calibration("globular_clusters.csv")), File.ReadAllBytes(output));
    }

    [Fact]
    public void Load_OldLayout_StillReadsWithoutDistanceModulus()
    {
        using var dir = new TempDir();
        string path = dir.File("gc.csv");
        File.WriteAllText(path, "# old layout\nname,alias,ra_deg,dec_deg,feh,ebv,note\nNGC 6341,M92,259.2808,43.1359,-2.31,0.02,mine\n");
        var c = Assert.Single(GlobularClusterCatalogue.Load(path));
        Assert.Equal(("NGC 6341", "M92", -2.31, 0.02, "mine"), (c.Name, c.Alias, c.Feh, c.Ebv, c.Note));
        Assert.True(double.IsNaN(c.DistanceModulusV));
        Assert.Same(c, GlobularClusterCatalogue.Find([c], "m 92"));
    }

    [Fact]
    public void Load_EmptyOptionalCells_AreNaN()
    {
        using var dir = new TempDir();
        string path = dir.File("gc.csv");
        File.WriteAllText(path, "name,ra_deg,dec_deg,feh,ebv,distance_modulus_v\nA,10,20,-1.5,,\nB,10,20,-1.5,0.1,15.2\n");
        var list = GlobularClusterCatalogue.Load(path);
        Assert.True(double.IsNaN(list[0].Ebv) && double.IsNaN(list[0].DistanceModulusV));
        Assert.Equal((0.1, 15.2), (list[1].Ebv, list[1].DistanceModulusV));
    }

    [Fact]
    public void Load_BadNumber_NamesRowAndColumn()
    {
        using var dir = new TempDir();
        string path = dir.File("gc.csv");
        File.WriteAllText(path, "# test\nname,ra_deg,dec_deg,feh,ebv\nA,10,20,-1.5,0.1\nB,10,20,abc,0.1\n");
        var e = Assert.Throws<InputException>(() => GlobularClusterCatalogue.Load(path));
        Assert.Equal(2, e.Row);
        Assert.Equal("feh", e.Column);
    }

    [Theory]
    [InlineData("A,,10,20,,0.1,15", 1, "feh", "empty")]                 // [Fe/H] is what the table is for: never empty
    [InlineData("A,,10,20,-1.5,0.1,xx", 1, "distance_modulus_v", "'xx' is not a number")]
    [InlineData("A,,10,20,-1.5,0.1,-3", 1, "distance_modulus_v", "outside")]
    [InlineData("A,,10,20,-1.5,0.1,15\nB,a,10,20,-1.5,0.1,15", 2, "alias", "already the name or alias of the cluster 'A' on row 1")]
    [InlineData("NGC 1,x,10,20,-1.5,0.1,15\nngc1,,10,20,-1.5,0.1,15", 2, "name", "already")]
    [InlineData("A,,10,20,-1.5,0.1", 1, null, "6 cells but the header has 7 columns")]
    public void Load_BadRow_NamesFileRowAndColumn(string rows, int row, string? column, string what)
    {
        using var dir = new TempDir();
        string path = dir.File("gc.csv");
        File.WriteAllText(path, "name,alias,ra_deg,dec_deg,feh,ebv,distance_modulus_v\n" + rows + "\n");
        var e = Assert.Throws<InputException>(() => GlobularClusterCatalogue.Load(path));
        Assert.Equal((path, (long?)row, column), (e.File, e.Row, e.Column));
        Assert.Contains(what, e.Message);
    }

    [Fact]
    public void Load_AliasEqualToItsOwnName_IsAllowed()
    {
        using var dir = new TempDir();
        string path = dir.File("gc.csv");
        File.WriteAllText(path, "name,alias,ra_deg,dec_deg,feh,ebv\nPal 5,pal5,229.0,-0.1,-1.4,0.03\n");
        Assert.Equal("Pal 5", GlobularClusterCatalogue.Find(GlobularClusterCatalogue.Load(path), "PAL5")?.Name);
    }

    [Fact]
    public void Load_HeaderNamesAColumnTwice_IsAnError()
    {
        using var dir = new TempDir();
        string path = dir.File("gc.csv");
        File.WriteAllText(path, "name,ra_deg,dec_deg,feh,ebv,feh\nA,10,20,-1.5,0.1,-1\n");
        var e = Assert.Throws<InputException>(() => GlobularClusterCatalogue.Load(path));
        Assert.Equal("feh", e.Column);
    }
}
