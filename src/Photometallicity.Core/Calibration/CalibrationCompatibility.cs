using Photometallicity.Errors;

namespace Photometallicity.Calibration;

/// <summary>Guards against applying a calibration to photometry in another filter set.</summary>
public static class CalibrationCompatibility
{
    /// <summary>
    /// Throws <see cref="InputException"/> naming the calibration file when the photometry's filters differ from
    /// the calibration's (see <see cref="FilterSet.Difference"/>); recalibrate or transfer the calibration.
    /// </summary>
    public static void Require(CalibrationModel model, FilterSet photometryFilters, string calibrationPath)
    {
        string? diff = model.Filters.Difference(photometryFilters);
        if (diff is not null)
            throw new InputException(
                $"the calibration belongs to another filter set than the photometry ({diff}); refit the calibration in these filters or transfer it (FilterTransfer).",
                file: calibrationPath, column: "filters");
    }
}
