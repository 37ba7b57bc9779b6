using Microsoft.Extensions.Logging;
using Photometallicity.Calibration;
using Photometallicity.Catalogues;
using Photometallicity.Configuration;
using Photometallicity.Photometry;
using Photometallicity.Photometry.Extinction;

namespace Photometallicity.Pipeline;

/// <summary>What the photometric preparation of a run produced.</summary>
public sealed record PhotometryProducts(
    PhotometryResult Result,
    BandValues ExtinctionCoefficients,
    FilterSet Filters,
    IReadOnlyList<PhotometricErrorModel> ErrorModels,
    double[] Ebv)
{
    public IndexPhotometry Index => Result.Photometry;
}

/// <summary>
/// Gathers each band's magnitudes for every broadband row (narrow-band values through the cross-match),
/// resolves the extinction coefficients (numbers or filter-curve recipes), runs the photometric preparation
/// and fits each band's error model. <see cref="Prepare"/> does the preparation alone for any matched catalogue
/// pair read with the config's band columns (the main field, or a cluster field of standards).
/// </summary>
public static class PhotometryStep
{
    public static PhotometryProducts Run(PipelineConfig config, InputCatalogues inputs, int[] narrowIndexPerRow, ILogger log)
    {
        var (coefficients, filters) = Filters(config, log);
        var broad = inputs.Broadband;
        var result = Prepare(config, broad, inputs.Narrowband, config.Broadband, config.Reddening, narrowIndexPerRow, coefficients, log);

        var models = new List<PhotometricErrorModel>();
        foreach (var band in new[] { config.Blue, config.Red, config.Narrow })
        {
            try
            {
                models.Add(FitErrorModel(band, inputs, log));
            }
            catch (Errors.MethodException ex)
            {
                log.LogWarning("no error model for the {Band} band: {Message}", band.Name, ex.Message);
            }
        }
        return new PhotometryProducts(result, coefficients, filters, models, Ebv(config.Reddening, broad));
    }

    /// <summary>The bands' extinction coefficients A/E(B-V) (curve recipes computed) and the filter set they define.</summary>
    public static (BandValues Coefficients, FilterSet Filters) Filters(PipelineConfig config, ILogger log)
    {
        var coefficients = new BandValues(Coefficient(config.Blue, log), Coefficient(config.Red, log), Coefficient(config.Narrow, log));
        var filters = new FilterSet(config.PhotometricSystem, config.Blue.Filter, config.Red.Filter, config.Narrow.Filter,
            config.Index.ColourCoefficient, coefficients.Blue, coefficients.Red, coefficients.Narrow);
        return (coefficients, filters);
    }

    /// <summary>
    /// The band's photometric error model fitted to its own catalogue (every row, matched or not);
    /// a <see cref="Errors.MethodException"/> when too few stars have a magnitude and an error.
    /// </summary>
    public static PhotometricErrorModel FitErrorModel(BandConfig band, InputCatalogues inputs, ILogger log)
    {
        var table = band.From == CatalogueSide.Broadband ? inputs.Broadband : inputs.Narrowband;
        return ErrorModelFitter.Fit(band.Filter, table.RequireDoubles(band.MagColumn), table.RequireDoubles(band.ErrColumn), log);
    }

    /// <summary>
    /// A band's column for every broadband row: from the broadband table itself, or from the narrow-band table through
    /// the cross-match (<paramref name="narrowIndexPerRow"/>, -1: no partner, NaN).
    /// </summary>
    public static double[] BandColumn(BandConfig band, string column, Table broad, Table narrow, int[] narrowIndexPerRow)
    {
        if (band.From == CatalogueSide.Broadband) return broad.RequireDoubles(column);
        double[] right = narrow.RequireDoubles(column);
        var v = new double[broad.RowCount];
        for (int i = 0; i < v.Length; i++) v[i] = narrowIndexPerRow[i] >= 0 ? right[narrowIndexPerRow[i]] : double.NaN;
        return v;
    }

    /// <summary>
    /// Dereddened colour, index and their covariance for every row of <paramref name="broad"/>, with the config's
    /// bands, zero points, error cuts and index; narrow-band values through <paramref name="narrowIndexPerRow"/>
    /// (-1: no partner). <paramref name="broadCfg"/> and <paramref name="reddening"/> are the pair's own (flag column, E(B-V)).
    /// </summary>
    public static PhotometryResult Prepare(PipelineConfig config, Table broad, Table narrowTable, CatalogueConfig broadCfg, ReddeningConfig reddening,
        int[] narrowIndexPerRow, BandValues coefficients, ILogger log)
    {
        int n = broad.RowCount;
        double[] Values(BandConfig band, string column) => BandColumn(band, column, broad, narrowTable, narrowIndexPerRow);
        bool[] hasNarrow = new bool[n];
        for (int i = 0; i < n; i++) hasNarrow[i] = narrowIndexPerRow[i] >= 0;

        StarValues? ebvErr = reddening.ErrorColumn is { } eec ? StarValues.PerStar(broad.RequireDoubles(eec))
            : reddening.Error is { } e ? StarValues.Constant(e) : null;
        bool[]? flagged = null;
        if (broadCfg.FlagColumn is { } fc)
        {
            var col = broad.Require(fc, "broadband.flag");
            flagged = new bool[n];
            for (int i = 0; i < n; i++) flagged[i] = !col.IsMissing(i) && col.GetDouble(i) != 0;
        }

        var inputsArrays = new PhotometryInputs
        {
            BlueMag = Values(config.Blue, config.Blue.MagColumn),
            BlueErr = Values(config.Blue, config.Blue.ErrColumn),
            RedMag = Values(config.Red, config.Red.MagColumn),
            RedErr = Values(config.Red, config.Red.ErrColumn),
            NarrowMag = Values(config.Narrow, config.Narrow.MagColumn),
            NarrowErr = Values(config.Narrow, config.Narrow.ErrColumn),
            HasNarrowMatch = hasNarrow,
            Ebv = StarValues.PerStar(Ebv(reddening, broad)),
            EbvErr = ebvErr,
            CatalogueFlagged = flagged,
        };
        var options = new PhotometryOptions
        {
            ExtinctionCoefficients = coefficients,
            ZeroPoints = new BandValues(config.Blue.ZeroPoint, config.Red.ZeroPoint, config.Narrow.ZeroPoint),
            ColourCoefficient = config.Index.ColourCoefficient,
            MaxError = new BandValues(config.Blue.MaxError, config.Red.MaxError, config.Narrow.MaxError),
            ColourMin = config.Index.ColourMin,
            ColourMax = config.Index.ColourMax,
        };
        return PhotometryPreparer.Run(inputsArrays, options, log);
    }

    private static double[] Ebv(ReddeningConfig reddening, Table broad) =>
        reddening.Column is { } ec ? broad.RequireDoubles(ec) : Enumerable.Repeat(reddening.Value ?? 0.0, broad.RowCount).ToArray();

    private static double Coefficient(BandConfig band, ILogger log)
    {
        var spec = band.Extinction;
        if (spec.Value is { } v) return v;
        var curve = FilterCurve.Load(spec.CurvePath!);
        var law = ExtinctionLaws.FromName(spec.Law, $"bands.{band.Name}.extinction.law");
        var r = BandExtinction.Compute(curve, law, spec.Rv, spec.TeffK, spec.CurvePath);
        log.LogInformation("extinction {Band}: A/E(B-V) = {A:F3} from {Curve} ({Law}, R_V = {Rv}), effective wavelength {L:F0} A",
            band.Name, r.AOverEbv, Path.GetFileName(spec.CurvePath), spec.Law, spec.Rv, r.LambdaEffAngstrom);
        return r.AOverEbv;
    }
}
