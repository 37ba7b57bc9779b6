using Photometallicity.Catalogues;
using Photometallicity.Tests.Support;
using Photometallicity.Validation;

namespace Photometallicity.Tests.Validation;

/// <summary>`validate --quick` end to end (three small invented fields, a few seconds).</summary>
public class ValidateCommandTest
{
    [Fact]
    public void ValidateQuick_RunsEveryFieldAndWritesTheTables()
    {
        using var dir = new TempDir();
        var r = CliRun.Invoke("validate", "--quick", "--out", dir.Path);
        Assert.True(r.ExitCode == 0, r.Error);
        var bins = CatalogueIO.Read(dir.File("validation.csv"), new ReadOptions { TextColumns = new HashSet<string> { "field", "bin" } });
        var fields = CatalogueIO.Read(dir.File("validation_fields.csv"), new ReadOptions { TextColumns = new HashSet<string> { "field", "index_law", "standards", "depth", "error" } });
        Assert.Equal(ValidationGrid.Quick.Count, fields.RowCount);
        Assert.Equal(ValidationGrid.Quick.Count * MagnitudeBin.All.Count, bins.RowCount);
        for (int i = 0; i < fields.RowCount; i++)
        {
            Assert.Equal(ValidationGrid.Quick[i].Name, fields["field"].GetString(i));
            Assert.True(string.IsNullOrEmpty(fields["error"].GetString(i)), fields["error"].GetString(i));
            Assert.True(double.IsFinite(fields["mdf_mean"].GetDouble(i)));
            Assert.True(fields["std_bad"].GetDouble(i) > 0);
        }
        double[] members = bins.RequireDoubles("members"), withValue = bins.RequireDoubles("with_value");
        Assert.True(members.Sum() > 6000);
        Assert.True(withValue.Sum() > 0.3 * members.Sum());
        foreach (var f in ValidationGrid.Quick) Assert.Contains("== " + f.Name, r.Out);
        Assert.Contains("[3/3]", r.Error);

        // --fields picks by name; an unknown name is a usage error naming the known ones
        var bad = CliRun.Invoke("validate", "--fields", "no-such-field", "--out", dir.File("x"));
        Assert.Equal(2, bad.ExitCode);
        Assert.Contains("q-lin-spread-shallow", bad.Error);
    }
}
