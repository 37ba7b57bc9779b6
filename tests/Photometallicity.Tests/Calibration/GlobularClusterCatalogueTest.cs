using Photometallicity.Calibration;
using Photometallicity.Errors;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Calibration;

public class GlobularClusterCatalogueTest
{
    [Fact]
    public void Load_ShippedTable_ListsReferenceClustersMarkedAsRecalled()
    {
        var list = GlobularClusterCatalogue.Load(RepoPaths.Calibration("globular_clusters.csv"));
        Assert.True(list.Count >= 15);
        Assert.All(list, c => Assert.Equal("recalled from memory", c.Note));
        var m92 = GlobularClusterCatalogue.Find(list, "m92");
        Assert.NotNull(m92);
        Assert.Equal("NGC 6341", m92!.Name);
        Assert.InRange(m92.Feh, -2.6, -2.0); // among the most metal-poor clusters (Harris 1996, 2010 edition)
        Assert.NotNull(GlobularClusterCatalogue.Find(list, "NGC6397"));
        Assert.Contains("Harris", File.ReadAllText(RepoPaths.Calibration("globular_clusters.csv")));
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
}
