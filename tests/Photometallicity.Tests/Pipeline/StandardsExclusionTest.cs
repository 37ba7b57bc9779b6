using System.Globalization;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Pipeline;

/// <summary>A narrow-band catalogue that matches nothing leaves no usable standard: exit 2, the reasons counted, nothing written.</summary>
public class StandardsExclusionTest
{
    [Fact]
    public void Run_NarrowBandFromAnotherField_ExitsTwoWithTheReasons()
    {
        using var dir = new TempDir();
        foreach (var f in Directory.GetFiles(RepoPaths.Samples(), "*", SearchOption.AllDirectories))
        {
            string dst = Path.Combine(dir.Path, Path.GetRelativePath(RepoPaths.Samples(), f));
            Directory.CreateDirectory(Path.GetDirectoryName(dst)!);
            File.Copy(f, dst);
        }
        var lines = File.ReadAllLines(dir.File("narrow.csv"));
        for (int i = 1; i < lines.Length; i++)
        {
            var cells = lines[i].Split(',');
            cells[2] = (double.Parse(cells[2], CultureInfo.InvariantCulture) + 1.0).ToString("R", CultureInfo.InvariantCulture); // dec moved 1 deg
            lines[i] = string.Join(',', cells);
        }
        File.WriteAllLines(dir.File("narrow.csv"), lines);
        var r = CliRun.Invoke("run", dir.File("config.json"), "--out", dir.File("out"));
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("error: only 0 of ", r.Error);
        Assert.Contains("standards can enter the calibration (at least 5 are needed); left out before the fit: ", r.Error);
        Assert.Contains(" x photometry not usable (no_narrow_match)", r.Error);
        Assert.False(Directory.Exists(dir.File("out")) && Directory.EnumerateFiles(dir.File("out"), "*", SearchOption.AllDirectories).Any());
    }
}
