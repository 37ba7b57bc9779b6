using Photometallicity.Catalogues;
using Photometallicity.Configuration;
using Photometallicity.Demo;
using Photometallicity.Pipeline;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Pipeline;

/// <summary>
/// Dwarfs and giants: standards with log g give a giant calibration (dwarfs rejected from it) and a dwarf one,
/// and every star gets both [Fe/H] values. On the invented field the foreground dwarfs follow their own index
/// relation (offset from the giants' by DemoTruth.DwarfIndexOffset), so their dwarf-branch [Fe/H] is the closer one.
/// </summary>
public class DwarfBranchTest
{
    [Fact]
    public void StandardsWithLogG_GiveADwarfCalibrationThatFitsTheDwarfs()
    {
        using var dir = new TempDir();
        var (field, configPath) = WriteField(dir.Path);
        var truth = field.StarTruth;
        var broad = field.Broadband;
        bool[] member = Enumerable.Range(0, truth.RowCount).Select(i => truth.Require("is_member").GetDouble(i) == 1).ToArray();
        double[] fehTrue = truth.RequireDoubles("feh_true"), blue = broad.RequireDoubles("b480");
        double[] colour = truth.RequireDoubles("colour0_true");

        var result = PipelineRunner.Run(ConfigLoader.Load(configPath), scope: new RunScope(PipelineStage.Metallicity));

        Assert.NotNull(result.Dwarf);
        Assert.All(result.Calibration!.PerStandard.Where(v => v.Id.StartsWith('D')), v => Assert.False(v.Accepted));
        var rows = result.Stars!;
        Assert.NotNull(rows.FehDwarf);
        double giantErr = 0, dwarfErr = 0;
        int count = 0;
        for (int i = 0; i < rows.Count; i++)
        {
            // Compared where the dwarf standards are (colours 0.6-1.3): farther out both branches only extrapolate.
            if (member[i] || colour[i] < 0.6 || colour[i] > 1.3 || !double.IsFinite(rows.Feh[i]) || !double.IsFinite(rows.FehDwarf![i])) continue;
            giantErr += Math.Abs(rows.Feh[i] - fehTrue[i]);
            dwarfErr += Math.Abs(rows.FehDwarf[i] - fehTrue[i]);
            count++;
        }
        Assert.True(count > 50, $"{count} foreground dwarfs with both values");
        Assert.True(dwarfErr < giantErr, $"mean |error| dwarf branch {dwarfErr / count:F3}, giant branch {giantErr / count:F3} dex");
    }

    /// <summary>The invented field with 40 foreground dwarfs (log g 4.5) added to the giant standards (log g 2), and its config.</summary>
    public static (DemoField Field, string ConfigPath) WriteField(string directory)
    {
        var field = DemoGenerator.Generate(6000, 21);
        string configPath = DemoWriter.Write(field, directory, 21);
        var truth = field.StarTruth;
        var broad = field.Broadband;
        bool[] member = Enumerable.Range(0, truth.RowCount).Select(i => truth.Require("is_member").GetDouble(i) == 1).ToArray();
        double[] fehTrue = truth.RequireDoubles("feh_true"), blue = broad.RequireDoubles("b480");
        double[] colour = truth.RequireDoubles("colour0_true");

        // Giant standards from the demo (log g 2) plus 40 bright foreground dwarfs (log g 4.5) with their true [Fe/H].
        var st = field.Standards;
        var dwarfs = Enumerable.Range(0, truth.RowCount).Where(i => !member[i] && blue[i] < 21.5 && colour[i] > 0.6 && colour[i] < 1.3).Take(40).ToArray();
        int n = st.RowCount + dwarfs.Length;
        var ids = new string[n]; var ra = new double[n]; var dec = new double[n]; var feh = new double[n]; var err = new double[n]; var logg = new double[n];
        for (int i = 0; i < st.RowCount; i++)
        {
            ids[i] = st.Require("star").GetString(i)!;
            ra[i] = st.RequireDoubles("ra")[i]; dec[i] = st.RequireDoubles("dec")[i];
            feh[i] = st.RequireDoubles("feh_spec")[i]; err[i] = st.RequireDoubles("feh_spec_err")[i]; logg[i] = 2.0;
        }
        for (int k = 0; k < dwarfs.Length; k++)
        {
            int i = st.RowCount + k, j = dwarfs[k];
            ids[i] = $"D{k:D3}"; ra[i] = broad.RequireDoubles("ra")[j]; dec[i] = broad.RequireDoubles("dec")[j];
            feh[i] = fehTrue[j]; err[i] = 0.05; logg[i] = 4.5;
        }
        var table = new Table([new Column<string>("star", ids), new Column<double>("ra", ra), new Column<double>("dec", dec),
            new Column<double>("feh_spec", feh), new Column<double>("feh_spec_err", err), new Column<double>("logg", logg)]);
        CatalogueIO.Write(table, Path.Combine(directory, "standards.csv"));
        File.WriteAllText(configPath, File.ReadAllText(configPath).Replace("\"feh_err\": \"feh_spec_err\"", "\"feh_err\": \"feh_spec_err\", \"logg\": \"logg\"")
            .Replace("\"bootstrap\": 300", "\"bootstrap\": 50"));

        return (field, configPath);
    }
}
