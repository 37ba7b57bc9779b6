using System.Globalization;
using System.Text.Json;
using Photometallicity.Calibration;
using Photometallicity.Catalogues;

namespace Photometallicity.Pipeline;

/// <summary>
/// Writes the files of a run into the output directory: stars.csv (and .fits / .parquet when asked),
/// summary.json, calibration.json, calibration_residuals.csv. Every file is written under a temporary name and
/// renamed when complete. Figures and the summary page are written by the report step.
/// </summary>
public static class RunOutputWriter
{
    public static readonly JsonSerializerOptions JsonOptions = new() { WriteIndented = true };

    public static IReadOnlyList<string> Write(PipelineResult r, string directory)
    {
        Directory.CreateDirectory(directory);
        var written = new List<string>();
        if (r.Stars is { } rows)
        {
            var stars = StarsTable.Build(rows);
            AddProvenance(stars, r);
            foreach (var format in r.Config.Output.Formats)
            {
                string path = Path.Combine(directory, "stars." + format);
                CatalogueIO.Write(stars, path, new WriteOptions { ExtensionName = "STARS" });
                written.Add(path);
            }
        }
        string cal = Path.Combine(directory, "calibration.json");
        CalibrationJson.Write(r.Model, r.Calibration, cal);
        written.Add(cal);
        if (r.Dwarf is { } dwarf)
        {
            string dc = Path.Combine(directory, "calibration_dwarf.json");
            CalibrationJson.Write(dwarf.Calibration.Model, dwarf.Calibration, dc);
            written.Add(dc);
        }
        if (r.Standards is { } standards && r.Calibration is { } fit)
        {
            string res = Path.Combine(directory, "calibration_residuals.csv");
            CatalogueIO.Write(ResidualsTable.Build(standards, fit), res);
            written.Add(res);
        }
        if (r.Forecast is { } fc && r.ForecastRequest is { } fr) written.AddRange(ForecastStep.Write(fc, directory, fr.PrecisionDex).Take(3));
        string summary = Path.Combine(directory, "summary.json");
        AtomicFile.WriteAllText(summary, SummaryBuilder.Build(r).ToJsonString(JsonOptions) + "\n");
        written.Add(summary);
        return written;
    }

    /// <summary>FITS header provenance: version, seed, config and input checksums (FITS keywords of at most 8 characters).</summary>
    private static void AddProvenance(Table t, PipelineResult r)
    {
        t.Metadata.Add(("CREATOR", $"photometallicity {ToolVersion.Current}", "program that wrote this file"));
        t.Metadata.Add(("PM_SEED", r.Config.Seed.ToString(CultureInfo.InvariantCulture), "master seed of the run"));
        for (int i = 0; i < r.Inputs.Checksums.Count; i++)
        {
            var (path, sha) = r.Inputs.Checksums[i];
            t.Metadata.Add(($"PM_IN{i + 1}", Path.GetFileName(path), "input file"));
            t.Metadata.Add(($"PM_SHA{i + 1}", sha, "SHA-256 of the input file"));
        }
    }
}
