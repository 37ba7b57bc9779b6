using System.Text.Json;
using Microsoft.Extensions.Logging.Abstractions;
using Photometallicity.Calibration;
using Photometallicity.Catalogues;
using Photometallicity.Configuration;
using Photometallicity.Demo;
using Photometallicity.Numerics;
using Photometallicity.Pipeline;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Calibration;

/// <summary>`calibrate CONFIG --transfer OLD.json --common FILE` end to end, with an invented known transformation.</summary>
public class CalibrateTransferCommandTest
{
    // Invented transformation from the config's (new) filter set to the synthetic standards' (old) one.
    private const double A0 = 0.05, A1 = 1.08, B0 = -0.12, B1 = 0.93, B2 = 0.07;

    private sealed record Setup(string Config, string Old, CalibrationModel OldModel);

    private static Setup Prepare(TempDir dir)
    {
        foreach (var f in new[] { "broad.csv", "narrow.csv", "standards.csv" }) File.WriteAllText(dir.File(f), "ra,dec\n1,2\n");
        DemoFilters.WriteTo(dir.Path);
        string config = dir.File("config.json");
        File.WriteAllText(config, DemoWriter.ConfigText(new DemoTruth(), 5).Replace("\"bootstrap\": 300", "\"bootstrap\": 80", StringComparison.Ordinal));
        var fit = CalibrationFitter.Run(SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 80 }, 42), SyntheticStandards.Options(bootstrap: 20));
        string old = dir.File("old_calibration.json");
        CalibrationJson.Write(fit.Model, fit, old);
        return new Setup(config, old, CalibrationJson.Read(old));
    }

    /// <summary>Stars in both sets from the invented transformation, 0.005 mag errors, covering the mapped domain.</summary>
    private static string WriteCommon(TempDir dir, int n, ulong seed, string? drop = null)
    {
        const double sigma = 0.005;
        var rng = new Rng(seed);
        var cols = TransferCommonStars.Columns.ToDictionary(c => c, _ => new double[n]);
        for (int i = 0; i < n; i++)
        {
            double c = 0.6 + 0.95 * rng.NextDouble(), x = 1.3 * rng.NextDouble();
            cols["new_colour0"][i] = c + sigma * rng.NextGaussian();
            cols["new_index0"][i] = x + sigma * rng.NextGaussian();
            cols["old_colour0"][i] = A0 + A1 * c + sigma * rng.NextGaussian();
            cols["old_index0"][i] = B0 + B1 * x + B2 * c + sigma * rng.NextGaussian();
            foreach (var e in new[] { "old_colour0_err", "old_index0_err", "new_colour0_err", "new_index0_err" }) cols[e][i] = sigma;
        }
        var t = new Table(n, "common.csv");
        t.Add(new Column<string>("star", Enumerable.Range(1, n).Select(i => $"C{i:D3}").ToArray()));
        foreach (var (name, v) in cols) if (name != drop) t.Add(new Column<double>(name, v, unit: "mag"));
        string p = dir.File("common.csv");
        CatalogueIO.Write(t, p);
        return p;
    }

    [Fact]
    public void Transfer_KnownTransformation_GivesTheOldCalibrationInTheConfigsFilters()
    {
        using var dir = new TempDir();
        var s = Prepare(dir);
        string common = WriteCommon(dir, 200, 7);
        string outDir = dir.File("out");
        var r = CliRun.Invoke("calibrate", s.Config, "--transfer", s.Old, "--common", common, "--out", outDir);
        Assert.True(r.ExitCode == 0, r.Error);
        Assert.Equal(["calibration.json", "transfer.json"], Directory.GetFiles(outDir).Select(f => Path.GetFileName(f)).Order(StringComparer.Ordinal).ToArray<string>());

        var m = CalibrationJson.Read(Path.Combine(outDir, "calibration.json"));
        var expectFilters = PhotometryStep.Filters(ConfigLoader.Load(s.Config), NullLogger.Instance).Filters;
        Assert.Null(m.Filters.Difference(expectFilters));
        Assert.NotNull(m.Filters.Difference(s.OldModel.Filters));

        // The new model against the TRUE transformation: f_new(C, F) = (f_old(a0 + a1 C, F) - b0 - b2 C) / b1.
        foreach (double c in new[] { 0.75, 0.95, 1.15, 1.35 })
            foreach (double f in new[] { -2.2, -1.5, -0.8 })
            {
                double expect = (s.OldModel.Evaluate(A0 + A1 * c, f) - B0 - B2 * c) / B1;
                Assert.Equal(expect, m.Evaluate(c, f), 0.01);
            }
        Assert.Equal((s.OldModel.Domain.ColourMin - A0) / A1, m.Domain.ColourMin, 0.01);
        Assert.Equal(s.OldModel.EnsembleCoefficients.Length, m.EnsembleCoefficients.Length);

        // transfer.json: the fitted parameters agree with the truth within their errors.
        using var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "transfer.json")));
        var root = doc.RootElement;
        Assert.Equal(200, root.GetProperty("stars").GetInt32());
        Assert.Equal(80, root.GetProperty("bootstrap").GetInt32());
        var aErr = root.GetProperty("a_err").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        var bErr = root.GetProperty("b_err").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        foreach (var (key, truth, err) in new[] { ("a0", A0, aErr[0]), ("a1", A1, aErr[1]), ("b0", B0, bErr[0]), ("b1", B1, bErr[1]), ("b2", B2, bErr[2]) })
        {
            double v = root.GetProperty(key).GetDouble();
            Assert.True(err > 0 && err < 0.02, $"{key} error {err}");
            Assert.True(Math.Abs(v - truth) < 4 * err, $"{key} = {v} vs {truth} +/- {err}");
        }

        // Same inputs and seed: byte-identical calibration.
        string again = dir.File("again");
        Assert.Equal(0, CliRun.Invoke("calibrate", s.Config, "--transfer", s.Old, "--common", common, "--out", again).ExitCode);
        Assert.Equal(File.ReadAllBytes(Path.Combine(outDir, "calibration.json")), File.ReadAllBytes(Path.Combine(again, "calibration.json")));
    }

    [Fact]
    public void Transfer_MissingColumns_Exit2NamingThem()
    {
        using var dir = new TempDir();
        var s = Prepare(dir);
        string common = WriteCommon(dir, 50, 8, drop: "new_index0_err");
        var r = CliRun.Invoke("calibrate", s.Config, "--transfer", s.Old, "--common", common, "--out", dir.File("out"));
        Assert.Equal(2, r.ExitCode);
        Assert.Contains($"{common}, column 'new_index0_err': the table of common stars has no column 'new_index0_err'", r.Error);
        Assert.False(Directory.Exists(dir.File("out")) && Directory.GetFiles(dir.File("out")).Length > 0);
    }

    [Fact]
    public void Transfer_TooFewCommonStars_Exit2WithCounts()
    {
        using var dir = new TempDir();
        var s = Prepare(dir);
        var r = CliRun.Invoke("calibrate", s.Config, "--transfer", s.Old, "--common", WriteCommon(dir, 4, 9), "--out", dir.File("out"));
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("needs at least 5 stars measured in both filter sets; 4 usable of 4 given", r.Error);
    }

    [Fact]
    public void Transfer_WithoutCommon_Exit2()
    {
        using var dir = new TempDir();
        var s = Prepare(dir);
        var r = CliRun.Invoke("calibrate", s.Config, "--transfer", s.Old);
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("--transfer needs --common FILE", r.Error);
    }

    [Fact]
    public void Transfer_NegativeError_Exit2NamingRowAndColumn()
    {
        using var dir = new TempDir();
        var s = Prepare(dir);
        string common = WriteCommon(dir, 20, 10);
        var lines = File.ReadAllLines(common);
        var header = lines[0].Split(',');
        int k = Array.IndexOf(header, "old_index0_err");
        var cells = lines[3].Split(',');
        cells[k] = "-0.01";
        lines[3] = string.Join(',', cells);
        File.WriteAllLines(common, lines);
        var r = CliRun.Invoke("calibrate", s.Config, "--transfer", s.Old, "--common", common);
        Assert.Equal(2, r.ExitCode);
        Assert.Contains("row 3, column 'old_index0_err': error -0.01 is missing or negative", r.Error);
    }
}
