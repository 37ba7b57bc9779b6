using Photometallicity.Calibration;

namespace Photometallicity.Metallicity;

/// <summary>
/// Where the [Fe/H] assignment applies a calibration. Strict (or a calibration without an extrapolation model): the convex hull
/// of the accepted standards, as in <see cref="CalibrationModel.Domain"/>. Otherwise a rectangle: every [Fe/H] of the grid, at
/// colours within <see cref="MetallicityOptions.ColourReach"/> of the standards' colours; beyond the standards each star's
/// variance carries the model-form error that grows with the distance (<see cref="Extrapolation.ModelFormVariance"/>).
/// </summary>
internal static class ApplicationDomain
{
    public static bool Extrapolates(CalibrationModel model, MetallicityOptions o) => !o.StrictDomain && model.Extrapolation is not null;

    public static ValidityDomain For(CalibrationModel model, MetallicityOptions o)
    {
        if (!Extrapolates(model, o)) return model.Domain;
        var e = model.Extrapolation!;
        double c0 = e.ColourLo - o.ColourReach, c1 = e.ColourHi + o.ColourReach;
        return new ValidityDomain([(c0, o.GridMin), (c1, o.GridMin), (c1, o.GridMax), (c0, o.GridMax)], []);
    }
}
