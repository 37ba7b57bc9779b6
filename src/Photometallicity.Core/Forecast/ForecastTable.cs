using Photometallicity.Catalogues;

namespace Photometallicity.Forecast;

/// <summary>Forecast results as catalogue tables (columns with units) for CSV/FITS/Parquet output; one row per result.</summary>
public static class ForecastTable
{
    public static Table ToTable(IReadOnlyList<PrecisionPoint> rows)
    {
        Column D(string name, Func<PrecisionPoint, double> get, string unit, string description) => Doubles(rows, name, get, unit, description);
        return new Table([
            D("blue_mag", r => r.BlueMag, "mag", "dereddened blue magnitude"),
            D("colour0", r => r.Colour, "mag", "dereddened colour blue - red"),
            D("feh", r => r.Feh, "dex", "[Fe/H] of the model star"),
            D("index0", r => r.Index, "mag", "index on the best-fit model"),
            D("sigma_blue", r => r.SigmaBlue, "mag", "blue magnitude error"),
            D("sigma_red", r => r.SigmaRed, "mag", "red magnitude error"),
            D("sigma_narrow", r => r.SigmaNarrow, "mag", "narrow-band magnitude error"),
            D("sigma_index", r => r.SigmaIndex, "mag", "index error"),
            D("sigma_colour", r => r.SigmaColour, "mag", "colour error"),
            D("cov_index_colour", r => r.CovIndexColour, "mag2", "index-colour covariance"),
            D("sigma_eff", r => r.SigmaEff, "mag", "effective index error incl. colour term and intrinsic scatter"),
            D("dindex_dfeh", r => r.DIndexDFeh, "mag/dex", "model sensitivity df/d[Fe/H]"),
            D("sigma_feh", r => r.SigmaFeh, "dex", "posterior half-width (p84 - p16) / 2"),
            D("feh_median", r => r.FehMedian, "dex", "posterior median"),
            D("sigma_feh_analytic", r => r.SigmaFehAnalytic, "dex", "sigma_eff / |df/d[Fe/H]|"),
            D("sigma_feh_analytic_cal", r => r.SigmaFehAnalyticCalibration, "dex", "as sigma_feh_analytic, with the ensemble spread"),
            new Column<string>("status", rows.Select(r => r.Status.ToString()).ToArray(), description: "metallicity status of the model star"),
        ]);
    }

    public static Table ToTable(IReadOnlyList<LimitingMagnitude> rows)
    {
        Column D(string name, Func<LimitingMagnitude, double> get, string unit, string description) => Doubles(rows, name, get, unit, description);
        return new Table([
            D("distance_modulus", r => r.DistanceModulus, "mag", "distance modulus"),
            D("colour0", r => r.Colour, "mag", "dereddened colour blue - red"),
            D("feh", r => r.Feh, "dex", "[Fe/H]"),
            D("precision", r => r.PrecisionDex, "dex", "requested posterior half-width"),
            D("blue_apparent", r => r.BlueApparent, "mag", "faintest dereddened apparent blue magnitude reaching the precision"),
            D("blue_absolute", r => r.BlueAbsolute, "mag", "the same as absolute magnitude"),
            new Column<string>("status", rows.Select(r => r.Status.ToString()).ToArray(), description: "search outcome"),
        ]);
    }

    public static Table ToTable(IReadOnlyList<DepthRequirement> rows)
    {
        Column D(string name, Func<DepthRequirement, double> get, string unit, string description) => Doubles(rows, name, get, unit, description);
        return new Table([
            new Column<string>("band", rows.Select(r => r.Band.ToString().ToLowerInvariant()).ToArray(), description: "band whose depth is varied"),
            D("blue_mag", r => r.BlueMag, "mag", "dereddened blue magnitude"),
            D("colour0", r => r.Colour, "mag", "dereddened colour blue - red"),
            D("feh", r => r.Feh, "dex", "[Fe/H]"),
            D("precision", r => r.PrecisionDex, "dex", "requested posterior half-width"),
            D("depth5_required", r => r.RequiredDepth5Sigma, "mag", "5-sigma depth the band needs"),
            D("depth5_current", r => r.CurrentDepth5Sigma, "mag", "5-sigma depth of the given error model"),
            new Column<string>("status", rows.Select(r => r.Status.ToString()).ToArray(), description: "search outcome"),
        ]);
    }

    private static Column Doubles<T>(IReadOnlyList<T> rows, string name, Func<T, double> get, string unit, string description) =>
        new Column<double>(name, rows.Select(get).ToArray(), unit: unit, description: description);
}
