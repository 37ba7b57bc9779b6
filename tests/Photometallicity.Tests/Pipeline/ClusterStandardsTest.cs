using Microsoft.Extensions.Logging.Abstractions;
using Photometallicity.Calibration;
using Photometallicity.Configuration;
using Photometallicity.Demo;
using Photometallicity.Pipeline;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Pipeline;

/// <summary>Cluster fields among the standards, on the invented demo field plus the invented <see cref="InventedClusterField"/>.</summary>
public class ClusterStandardsTest
{
    [Fact]
    public void Run_ClusterField_MembersEnterAsOneBlockAndCalibrationRecoversTheInventedRelation()
    {
        using var dir = new TempDir();
        var config = ConfigLoader.Load(InventedClusterField.WriteRun(dir.Path));
        var r = PipelineRunner.Run(config, NullLogger.Instance, null, new RunScope(PipelineStage.Calibration));
        var products = r.Standards!;
        var st = products.Standards;

        var summary = Assert.Single(products.Clusters);
        Assert.Equal(InventedClusterField.Name, summary.Name);
        Assert.Equal(280, summary.Rows);
        int g = Array.IndexOf(st.GroupName, InventedClusterField.Name);
        Assert.True(g >= 0);
        var inCluster = Enumerable.Range(0, st.Count).Where(i => st.Id[i].StartsWith(InventedClusterField.Name + ":", StringComparison.Ordinal)).ToArray();
        Assert.Equal(summary.Entered, inCluster.Length);
        Assert.All(inCluster, i => Assert.Equal(g, st.Group[i]));
        Assert.All(inCluster, i => Assert.Equal(InventedClusterField.Feh, st.Feh[i]));
        Assert.All(inCluster, i => Assert.Equal(InventedClusterField.FehErr, st.FehErr[i]));
        Assert.All(Enumerable.Range(0, st.Count).Except(inCluster), i => Assert.Equal(-1, st.Group[i]));
        Assert.All(inCluster, i => Assert.Equal(-1, products.BroadbandRow[i]));
        // Most true members enter; few foreground stars get in (those that happen to fall on the ridge).
        int trueMembers = inCluster.Count(i => st.Id[i].Contains(":QM", StringComparison.Ordinal));
        Assert.True(trueMembers >= 140, $"{trueMembers} of 160 invented members entered");
        Assert.True(inCluster.Length - trueMembers <= 8, $"{inCluster.Length - trueMembers} foreground stars entered");
        Assert.Equal(summary.Rows - summary.InsideRadius + summary.OffRidge + summary.MembersWithoutIndex + summary.Entered, summary.Rows);

        // The bootstrap's and cross-validation's units: the cluster is one unit holding all its members.
        var usable = Enumerable.Range(0, st.Count).Select(i => st.Unusable(i) is null).ToArray();
        var units = ResampleUnits.Build(st.Group, usable);
        int individual = Enumerable.Range(0, st.Count).Count(i => usable[i] && st.Group[i] < 0);
        Assert.Equal(individual + 1, units.Count);
        Assert.Contains(Enumerable.Range(0, units.Count), u => units.Size(u) == inCluster.Length);

        // The calibration still works, and through the cluster block reaches the invented relation at the cluster's [Fe/H].
        var model = r.Calibration!.Model;
        Assert.Equal(60, model.EnsembleCoefficients.Length);
        foreach (double c in new[] { 0.75, 0.85, 0.95 })
            Assert.Equal(DemoTruth.GiantIndex(c, InventedClusterField.Feh), model.Evaluate(c, InventedClusterField.Feh), 0.03);
        Assert.True(model.Domain.FehMin <= InventedClusterField.Feh + 1e-9);
        int accepted = inCluster.Count(i => r.Calibration.PerStandard[i].Accepted);
        Assert.True(accepted >= 0.9 * trueMembers, $"{accepted} cluster standards accepted");

        // Accepted and rejected members appear in the residuals table like other standards.
        var table = ResidualsTable.Build(products, r.Calibration);
        var idColumn = table["id"];
        var ids = Enumerable.Range(0, table.RowCount).Select(idColumn.GetString).ToHashSet();
        Assert.All(inCluster, i => Assert.Contains(st.Id[i], ids));
    }

    [Fact]
    public void Run_ClusterRadiusHoldsTooFewStars_MethodExceptionNamesTheCluster()
    {
        using var dir = new TempDir();
        var config = ConfigLoader.Load(InventedClusterField.WriteRun(dir.Path, radiusArcmin: 0.1));
        var e = Assert.Throws<Errors.MethodException>(() => PipelineRunner.Run(config, NullLogger.Instance, null, new RunScope(PipelineStage.Calibration)));
        Assert.StartsWith($"cluster '{InventedClusterField.Name}' (standards[1]): Only ", e.Message);
        Assert.Equal(2, e.ExitCode);
    }
}
