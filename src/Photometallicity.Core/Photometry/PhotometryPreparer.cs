using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;

namespace Photometallicity.Photometry;

/// <summary>
/// Photometric preparation: zero points, dereddening, colour, index, their covariance and a status per row.
/// <code>
///   m0      = m + zp - R_m E(B-V)                       (R_m = A_m / E(B-V), per band)
///   C0      = blue0 - red0
///   X0      = (narrow0 - blue0) - k C0 = narrow0 - (1 + k) blue0 + k red0
///   Var C0  = sb^2 + sr^2                       + (dC/dE)^2 sE^2,   dC/dE = -(Rb - Rr)
///   Var X0  = sn^2 + (1 + k)^2 sb^2 + k^2 sr^2  + (dX/dE)^2 sE^2,   dX/dE = -(Rn - Rb) + k (Rb - Rr)
///   Cov     = -(1 + k) sb^2 - k sr^2            + (dX/dE)(dC/dE) sE^2
/// </code>
/// (first-order propagation of independent magnitude errors sb, sr, sn and the E(B-V) error sE; exact here because
/// everything is linear). Every row gets a status; values are NaN where they cannot be computed.
/// </summary>
public static class PhotometryPreparer
{
    public static PhotometryResult Run(PhotometryInputs inputs, PhotometryOptions options, ILogger? logger = null)
    {
        logger ??= NullLogger.Instance;
        options.Validate();
        inputs.CheckShape();
        int n = inputs.Count;
        var blue0 = new double[n];
        var red0 = new double[n];
        var narrow0 = new double[n];
        var colour0 = new double[n];
        var index0 = new double[n];
        var varC = new double[n];
        var varX = new double[n];
        var cov = new double[n];
        var status = new PhotometryStatus[n];

        var r = options.ExtinctionCoefficients;
        var zp = options.ZeroPoints;
        var maxErr = options.MaxError;
        double k = options.ColourCoefficient;
        double dCdE = -(r.Blue - r.Red);
        double dXdE = -(r.Narrow - r.Blue) + k * (r.Blue - r.Red);
        double lo = options.ColourMin ?? double.NegativeInfinity, hi = options.ColourMax ?? double.PositiveInfinity;
        double[] bMag = inputs.BlueMag, bErr = inputs.BlueErr, rMag = inputs.RedMag, rErr = inputs.RedErr;
        double[] nMag = inputs.NarrowMag, nErr = inputs.NarrowErr;
        bool[] match = inputs.HasNarrowMatch;
        bool[]? flagged = inputs.CatalogueFlagged;
        StarValues ebvs = inputs.Ebv;
        StarValues? ebvErrs = inputs.EbvErr;

        for (int i = 0; i < n; i++)
        {
            var st = PhotometryStatus.Ok;
            double ebv = ebvs[i];
            double sE = ebvErrs is null ? 0.0 : ebvErrs[i];
            bool redden = double.IsFinite(ebv) && double.IsFinite(sE) && sE >= 0;
            if (!redden) st |= PhotometryStatus.ReddeningMissing;

            double b = bMag[i], sb = bErr[i], rm = rMag[i], sr = rErr[i];
            bool blueOk = Valid(b, sb), redOk = Valid(rm, sr);
            if (!blueOk || !redOk) st |= PhotometryStatus.BroadbandMissing;
            else if (sb > maxErr.Blue || sr > maxErr.Red) st |= PhotometryStatus.ErrorTooLarge;

            double nm = nMag[i], sn = nErr[i];
            bool narrowOk = false;
            if (!match[i]) st |= PhotometryStatus.NoNarrowMatch;
            else if (!Valid(nm, sn)) st |= PhotometryStatus.NarrowMissing;
            else
            {
                narrowOk = true;
                if (sn > maxErr.Narrow) st |= PhotometryStatus.NarrowErrorTooLarge;
            }

            if (flagged is not null && flagged[i]) st |= PhotometryStatus.CatalogueFlag;

            blue0[i] = redden && blueOk ? b + zp.Blue - r.Blue * ebv : double.NaN;
            red0[i] = redden && redOk ? rm + zp.Red - r.Red * ebv : double.NaN;
            narrow0[i] = redden && narrowOk ? nm + zp.Narrow - r.Narrow * ebv : double.NaN;

            double sE2 = sE * sE;
            if (redden && blueOk && redOk)
            {
                colour0[i] = blue0[i] - red0[i];
                varC[i] = sb * sb + sr * sr + dCdE * dCdE * sE2;
                if (!(colour0[i] >= lo && colour0[i] <= hi)) st |= PhotometryStatus.ColourOutOfRange;
            }
            else
            {
                colour0[i] = double.NaN;
                varC[i] = double.NaN;
            }

            if (redden && blueOk && redOk && narrowOk)
            {
                index0[i] = narrow0[i] - blue0[i] - k * colour0[i];
                varX[i] = sn * sn + (1 + k) * (1 + k) * sb * sb + k * k * sr * sr + dXdE * dXdE * sE2;
                cov[i] = -(1 + k) * sb * sb - k * sr * sr + dXdE * dCdE * sE2;
            }
            else
            {
                index0[i] = double.NaN;
                varX[i] = double.NaN;
                cov[i] = double.NaN;
            }
            status[i] = st;
        }

        var photometry = new IndexPhotometry
        {
            Blue0 = blue0, Red0 = red0, Narrow0 = narrow0, Colour0 = colour0, Index0 = index0,
            VarColour = varC, VarIndex = varX, CovIndexColour = cov, Status = status, ColourCoefficient = k,
        };
        var diagnostics = Summarise(photometry);
        logger.LogInformation("photometry: {Summary}", diagnostics.ToString());
        return new PhotometryResult(photometry, diagnostics);
    }

    /// <summary>A measurement is valid when the magnitude and error are finite and the error is not negative.</summary>
    private static bool Valid(double mag, double err) => double.IsFinite(mag) && double.IsFinite(err) && err >= 0;

    private static PhotometryDiagnostics Summarise(IndexPhotometry p)
    {
        var flags = Enum.GetValues<PhotometryStatus>().Where(f => f != PhotometryStatus.Ok).ToArray();
        var counts = flags.ToDictionary(f => f, _ => 0);
        int usable = 0, usableColour = 0;
        for (int i = 0; i < p.Count; i++)
        {
            var st = p.Status[i];
            if (st == PhotometryStatus.Ok) usable++;
            if (p.HasUsableColour(i)) usableColour++;
            if (st == PhotometryStatus.Ok) continue;
            foreach (var f in flags)
                if ((st & f) != 0) counts[f]++;
        }
        return new PhotometryDiagnostics(p.Count, usable, usableColour, counts);
    }
}
