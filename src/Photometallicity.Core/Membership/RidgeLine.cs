namespace Photometallicity.Membership;

/// <summary>
/// The members' colour distribution at fixed magnitude: colour ~ N(ridge(m), sigma_int^2 + VarColour_i), with the
/// ridge either a polynomial in (m - Pivot) learned from the data or a fixed fiducial locus (colour against absolute
/// magnitude, shifted by the distance modulus, linearly interpolated). Weighted ECM (Meng &amp; Rubin 1993): the
/// polynomial by weighted least squares with weights w_i / (sigma_int^2 + VarColour_i) (exact at fixed sigma_int),
/// then sigma_int by the measurement-error EM step, as in <see cref="HeteroscedasticGaussian"/>.
/// The colour density is normalised over the whole colour axis (the CMD window is taken wide enough that the
/// truncation of a narrow giant branch is negligible).
/// </summary>
internal sealed class RidgeLine
{
    private readonly double[]? _fidMag, _fidColour;

    public RidgeLine(int degree, double pivot, double[] coefficients, double sigmaInt, double sigmaFloor)
    {
        Degree = degree; Pivot = pivot; Coefficients = coefficients; SigmaInt = sigmaInt; SigmaFloor = sigmaFloor;
    }

    /// <summary>A fixed fiducial ridge (apparent magnitudes, ascending) with a learned width.</summary>
    public RidgeLine(double[] apparentMag, double[] colour, double sigmaInt, double sigmaFloor)
        : this(0, 0, [], sigmaInt, sigmaFloor)
    {
        _fidMag = apparentMag; _fidColour = colour;
    }

    /// <summary>An independent copy (the width and coefficients are updated in place by the fit).</summary>
    public RidgeLine Copy() => _fidMag is not null
        ? new RidgeLine(_fidMag, _fidColour!, SigmaInt, SigmaFloor)
        : new RidgeLine(Degree, Pivot, (double[])Coefficients.Clone(), SigmaInt, SigmaFloor);

    public int Degree { get; }
    public double Pivot { get; }
    public double[] Coefficients { get; private set; }
    public double SigmaInt { get; private set; }
    public double SigmaFloor { get; }
    public bool IsFiducial => _fidMag is not null;

    public double Colour(double m)
    {
        if (_fidMag is not null) return Interpolate(_fidMag, _fidColour!, m);
        double t = m - Pivot, c = 0;
        for (int k = Coefficients.Length - 1; k >= 0; k--) c = c * t + Coefficients[k];
        return c;
    }

    public double LogDensity(double colour, double mag, double varColour)
    {
        double t = SigmaInt * SigmaInt + varColour;
        double d = colour - Colour(mag);
        return -0.5 * (d * d / t + Math.Log(2 * Math.PI * t));
    }

    /// <summary>One ECM cycle with weights <paramref name="w"/> over <paramref name="rows"/>.</summary>
    public void Update(double[] mag, double[] colour, double[] varColour, int[] rows, double[] w)
    {
        double s2 = SigmaInt * SigmaInt;
        if (!IsFiducial)
        {
            int p = Degree + 1;
            var ata = new double[p, p];
            var atb = new double[p];
            var phi = new double[p];
            foreach (int i in rows)
            {
                double wi = w[i] / (s2 + varColour[i]);
                if (wi <= 0) continue;
                double t = mag[i] - Pivot;
                phi[0] = 1;
                for (int k = 1; k < p; k++) phi[k] = phi[k - 1] * t;
                for (int a = 0; a < p; a++)
                {
                    atb[a] += wi * phi[a] * colour[i];
                    for (int b = 0; b <= a; b++) ata[a, b] += wi * phi[a] * phi[b];
                }
            }
            for (int a = 0; a < p; a++) for (int b = 0; b < a; b++) ata[b, a] = ata[a, b];
            var m = MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.DenseOfArray(ata);
            if (Math.Abs(m.Determinant()) > 1e-300)
            {
                var sol = m.Solve(MathNet.Numerics.LinearAlgebra.Vector<double>.Build.DenseOfArray(atb));
                if (sol.All(double.IsFinite)) Coefficients = sol.ToArray();
            }
        }
        double num = 0, den = 0;
        foreach (int i in rows)
        {
            double wi = w[i];
            if (wi <= 0) continue;
            double t = s2 + varColour[i];
            double shrink = s2 * (colour[i] - Colour(mag[i])) / t;
            num += wi * (s2 * varColour[i] / t + shrink * shrink);
            den += wi;
        }
        if (den > 0) SigmaInt = Math.Max(Math.Sqrt(num / den), SigmaFloor);
    }

    internal static double Interpolate(double[] x, double[] y, double v)
    {
        if (v <= x[0]) return y[0] + (x.Length > 1 ? (y[1] - y[0]) / (x[1] - x[0]) * (v - x[0]) : 0);
        int n = x.Length;
        if (v >= x[n - 1]) return y[n - 1] + (y[n - 1] - y[n - 2]) / (x[n - 1] - x[n - 2]) * (v - x[n - 1]);
        int k = Array.BinarySearch(x, v);
        if (k >= 0) return y[k];
        k = ~k;
        double f = (v - x[k - 1]) / (x[k] - x[k - 1]);
        return y[k - 1] + f * (y[k] - y[k - 1]);
    }
}
