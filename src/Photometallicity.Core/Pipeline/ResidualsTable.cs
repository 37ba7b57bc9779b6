using Photometallicity.Calibration;
using Photometallicity.Catalogues;

namespace Photometallicity.Pipeline;

/// <summary>The calibration residuals table: every standard, used, rejected or left out before the fit, with the reason.</summary>
public static class ResidualsTable
{
    public static Table Build(StandardsProducts standards, CalibrationResult fit)
    {
        var st = standards.Standards;
        var verdicts = fit.PerStandard;
        int n = st.Count + standards.Excluded.Count;
        var id = new string[n];
        var status = new string[n];
        var reason = new string[n];
        var colour = Nan(n);
        var index = Nan(n);
        var feh = Nan(n);
        var fehErr = Nan(n);
        var resIdx = Nan(n);
        var resDex = Nan(n);
        var resSig = Nan(n);
        var cvDex = Nan(n);
        var pOut = Nan(n);
        for (int i = 0; i < st.Count; i++)
        {
            var v = verdicts[i];
            id[i] = st.Id[i];
            status[i] = CalibrationJson.StatusCode(v.Status);
            reason[i] = v.Reason;
            colour[i] = st.Colour0[i];
            index[i] = st.Index0[i];
            feh[i] = st.Feh[i];
            fehErr[i] = st.FehErr[i];
            resIdx[i] = v.ResidualIndex;
            resDex[i] = v.ResidualDex;
            resSig[i] = v.ResidualSigma;
            cvDex[i] = v.CvResidualDex;
            pOut[i] = v.POutlier;
        }
        for (int k = 0; k < standards.Excluded.Count; k++)
        {
            var e = standards.Excluded[k];
            int i = st.Count + k;
            id[i] = e.Id;
            status[i] = "excluded";
            reason[i] = e.Reason;
        }
        var t = new Table(n, "calibration_residuals");
        t.Add(new Column<string>("id", id));
        t.Add(new Column<string>("status", status));
        t.Add(new Column<string>("reason", reason));
        t.Add(new Column<double>("colour0", colour, unit: "mag"));
        t.Add(new Column<double>("index0", index, unit: "mag"));
        t.Add(new Column<double>("feh_spec", feh, unit: "dex"));
        t.Add(new Column<double>("feh_spec_err", fehErr, unit: "dex"));
        t.Add(new Column<double>("residual_index", resIdx, unit: "mag", description: "observed minus model index"));
        t.Add(new Column<double>("residual_sigma", resSig, description: "residual in units of the effective sigma"));
        t.Add(new Column<double>("residual_dex", resDex, unit: "dex", description: "residual expressed in [Fe/H]"));
        t.Add(new Column<double>("cv_residual_dex", cvDex, unit: "dex", description: "cross-validated residual in [Fe/H]"));
        t.Add(new Column<double>("p_outlier", pOut, description: "probability that the standard belongs to the outlier component of the fit"));
        return t;
    }

    private static double[] Nan(int n)
    {
        var a = new double[n];
        Array.Fill(a, double.NaN);
        return a;
    }
}
