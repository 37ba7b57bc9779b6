namespace Photometallicity.Calibration;

/// <summary>
/// The standards as the fitter sees them: columnar measurements with [Fe/H] variance precomputed, and a mask of
/// the standards that may enter a fit at all (finite values, passing the log g cut).
/// </summary>
internal sealed class FitData
{
    public FitData(CalibrationStandards s, bool[] usable)
    {
        N = s.Count;
        C = s.Colour0; X = s.Index0; VarC = s.VarColour; VarX = s.VarIndex; Cov = s.CovIndexColour; F = s.Feh;
        VarF = new double[N];
        // A cluster's members share one literature [Fe/H]: its error is common to them, not independent per star, so it does not
        // enter each member's effective variance (which would overstate their scatter and drive sigma_int to zero); the block
        // bootstrap, which draws each cluster as one unit with its one [Fe/H], carries it into the ensemble.
        for (int i = 0; i < N; i++) VarF[i] = s.Group[i] >= 0 ? 0.0 : s.FehErr[i] * s.FehErr[i];
        Usable = usable;
    }

    public int N { get; }
    public double[] C { get; }
    public double[] X { get; }
    public double[] VarC { get; }
    public double[] VarX { get; }
    public double[] Cov { get; }
    public double[] F { get; }
    public double[] VarF { get; }
    public bool[] Usable { get; }
}
