using System.Globalization;
using System.Text.Json.Nodes;
using Microsoft.Extensions.Logging;
using Photometallicity.Numerics;

namespace Photometallicity.Calibration;

/// <summary>Options of <see cref="CalibrationTransferStep"/>: the new filter set, bootstrap draws of the transformation, master seed.</summary>
public sealed record CalibrationTransferOptions
{
    public required FilterSet NewFilters { get; init; }

    /// <summary>Bootstrap draws of the transformation (0: the transformation's uncertainty is not propagated).</summary>
    public int Bootstrap { get; init; } = 1000;
    public ulong Seed { get; init; }
}

/// <summary>The transformation fitted to the common stars, the calibration in the new filter set, and warnings.</summary>
public sealed record CalibrationTransferResult(FilterTransform Transform, CalibrationModel Model, IReadOnlyList<string> Warnings)
{
    /// <summary>The transformation as JSON (parameters, standard errors, covariances, residuals, stars, seeds) for transfer.json.</summary>
    public JsonObject ToJson(string oldCalibration, ulong fitSeed, ulong applySeed)
    {
        var t = Transform;
        static JsonArray Arr(IEnumerable<double> v) => new(v.Select(x => (JsonNode?)JsonValue.Create(double.IsFinite(x) ? x : (double?)null)).ToArray());
        return new JsonObject
        {
            ["relation"] = "C_old = a0 + a1 C_new; X_old = b0 + b1 X_new + b2 C_new (mag)",
            ["from_calibration"] = oldCalibration,
            ["old_filters"] = $"{Model.Provenance.GetValueOrDefault("transfer.from_filters", "")}",
            ["new_filters"] = $"{Model.Filters.System}: {Model.Filters.BlueBand}, {Model.Filters.RedBand}, {Model.Filters.NarrowBand}",
            ["a0"] = t.A0, ["a1"] = t.A1, ["b0"] = t.B0, ["b1"] = t.B1, ["b2"] = t.B2,
            ["a_err"] = Arr([Math.Sqrt(t.ColourCovariance[0]), Math.Sqrt(t.ColourCovariance[3])]),
            ["b_err"] = Arr([Math.Sqrt(t.IndexCovariance[0]), Math.Sqrt(t.IndexCovariance[4]), Math.Sqrt(t.IndexCovariance[8])]),
            ["a_covariance"] = Arr(t.ColourCovariance),
            ["b_covariance"] = Arr(t.IndexCovariance),
            ["rms_colour_mag"] = t.RmsColour,
            ["rms_index_mag"] = t.RmsIndex,
            ["index_scatter_mag"] = t.IndexScatter,
            ["stars"] = t.Stars,
            ["bootstrap"] = t.Ensemble.Length,
            ["seeds"] = new JsonObject { ["fit"] = fitSeed, ["apply"] = applySeed },
            ["warnings"] = new JsonArray(Warnings.Select(w => (JsonNode?)JsonValue.Create(w)).ToArray()),
        };
    }
}

/// <summary>
/// Recalibration for a new filter set from an old calibration (see <see cref="FilterTransfer"/> for the method):
/// fits the transformation to the common stars, applies it, and warns when the calibration's colour range, mapped
/// into the new colours, reaches beyond the colours of the common stars (the transformation is then extrapolated)
/// or when the old and new filter sets are the same. Seeds: Seeds.Derive(seed, "filter-transfer") for the fit's
/// bootstrap and Seeds.Derive(seed, "filter-transfer-apply") for the ensemble's draws.
/// </summary>
public static class CalibrationTransferStep
{
    public static CalibrationTransferResult Run(CalibrationModel old, TransferStars common, CalibrationTransferOptions options, ILogger log)
    {
        var warnings = new List<string>();
        if (old.Filters.Difference(options.NewFilters) is null)
            warnings.Add("the old calibration already belongs to the config's filter set; the transfer only adds the transformation's uncertainty");
        var t = FilterTransfer.Fit(common, options.Bootstrap, FitSeed(options.Seed));
        var model = FilterTransfer.Apply(old, t, options.NewFilters, ApplySeed(options.Seed));
        var ok = Enumerable.Range(0, common.Count).Where(i => double.IsFinite(common.NewColour0[i]) && double.IsFinite(common.OldColour0[i])
            && double.IsFinite(common.NewIndex0[i]) && double.IsFinite(common.OldIndex0[i])).ToArray();
        double cmin = ok.Min(i => common.NewColour0[i]), cmax = ok.Max(i => common.NewColour0[i]);
        double tol = 0.02; // mag; common practice for "covers the range"
        if (model.Domain.ColourMin < cmin - tol || model.Domain.ColourMax > cmax + tol)
            warnings.Add(string.Create(CultureInfo.InvariantCulture,
                $"the calibration covers new colours {model.Domain.ColourMin:F3} to {model.Domain.ColourMax:F3} mag but the common stars only {cmin:F3} to {cmax:F3} mag: the transformation is extrapolated there"));
        log.LogInformation("filter transfer: from {Stars} common stars, C_old = {A0:F4} + {A1:F4} C_new; X_old = {B0:F4} + {B1:F4} X_new + {B2:F4} C_new; rms {Rc:F4} (colour), {Rx:F4} (index) mag, index scatter beyond errors {S:F4} mag, {N} bootstrap draws",
            t.Stars, t.A0, t.A1, t.B0, t.B1, t.B2, t.RmsColour, t.RmsIndex, t.IndexScatter, t.Ensemble.Length);
        foreach (var w in warnings) log.LogWarning("{Warning}", w);
        return new CalibrationTransferResult(t, model, warnings);
    }

    public static ulong FitSeed(ulong seed) => Seeds.Derive(seed, "filter-transfer");
    public static ulong ApplySeed(ulong seed) => Seeds.Derive(seed, "filter-transfer-apply");
}
