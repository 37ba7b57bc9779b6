using MathNet.Numerics.LinearAlgebra;
using Photometallicity.Calibration;
using Photometallicity.Numerics;
using Photometallicity.Photometry;

namespace Photometallicity.Tests.Metallicity;

/// <summary>
/// An invented forward model with a known truth, for testing the inversion (not a published calibration):
/// X0 = a + b C + (c + d C) kappa (F + 3.8)^2 with kappa = 0.06, so dX/dF falls from ~0.4 mag/dex at [Fe/H] = 0 to ~0.03 at -3.5
/// (the index loses sensitivity at low [Fe/H]). The ensemble perturbs (a, b, c, d) with a known Gaussian covariance; the true model
/// of each synthetic star is a fresh draw from that same distribution. Expressed exactly on a degree-3 basis by least squares.
/// </summary>
public sealed class SyntheticCalibration
{
    public const double Kappa = 0.06;
    public static readonly double[] Parameters = [0.30, 0.20, 0.50, 0.25];
    public static readonly double[] ParameterSigma = [0.006, 0.004, 0.012, 0.006];
    public const double ParameterCorrelation = -0.5; // between a and b, and between c and d
    public const double K = 1.1;

    public static readonly PolynomialBasis2D Basis = new(3, 1.4, 0.6, -1.75, 1.75);

    /// <summary>Domain: colour 0.8 to 2.0, [Fe/H] from -3.5 (blue) / -3.3 (red) to -0.3 (blue) / 0.0 (red).</summary>
    public static readonly ValidityDomain Domain = new([(0.8, -3.5), (2.0, -3.3), (2.0, 0.0), (0.8, -0.3)], []);

    public static readonly FilterSet Filters = new("invented-system", "iB", "iR", "iN", K, 3.3, 1.6, 4.6);

    public static double Model(ReadOnlySpan<double> p, double c, double f) => p[0] + p[1] * c + (p[2] + p[3] * c) * Kappa * (f + 3.8) * (f + 3.8);

    public static double SlopeFeh(ReadOnlySpan<double> p, double c, double f) => (p[2] + p[3] * c) * Kappa * 2 * (f + 3.8);

    /// <summary>Coefficients on <see cref="Basis"/> reproducing the model with parameters p (exact: the model is in the span).</summary>
    public static double[] Project(double[] p)
    {
        var rows = new List<double[]>();
        var rhs = new List<double>();
        for (int i = 0; i < 8; i++)
            for (int j = 0; j < 8; j++)
            {
                double c = 0.6 + i * 0.25, f = -4 + j * 0.6;
                var t = new double[Basis.Count];
                Basis.Terms(c, f, t);
                rows.Add(t);
                rhs.Add(Model(p, c, f));
            }
        var a = Matrix<double>.Build.DenseOfRowArrays(rows);
        return a.Solve(Vector<double>.Build.DenseOfEnumerable(rhs)).ToArray();
    }

    /// <summary>A draw of (a, b, c, d) from the ensemble distribution.</summary>
    public static double[] DrawParameters(Rng rng)
    {
        var p = new double[4];
        double r = ParameterCorrelation, q = Math.Sqrt(1 - r * r);
        for (int pair = 0; pair < 2; pair++)
        {
            double z1 = rng.NextGaussian(), z2 = rng.NextGaussian();
            p[2 * pair] = Parameters[2 * pair] + ParameterSigma[2 * pair] * z1;
            p[2 * pair + 1] = Parameters[2 * pair + 1] + ParameterSigma[2 * pair + 1] * (r * z1 + q * z2);
        }
        return p;
    }

    public static CalibrationModel Build(int members, double sigmaInt, ulong seed, ValidityDomain? domain = null, bool exactEnsemble = false)
    {
        var rng = new Rng(seed);
        var ens = new double[members][];
        var sint = new double[members];
        for (int m = 0; m < members; m++)
        {
            ens[m] = Project(exactEnsemble ? Parameters : DrawParameters(rng));
            sint[m] = exactEnsemble ? sigmaInt : Math.Abs(sigmaInt + 0.1 * sigmaInt * rng.NextGaussian());
        }
        int nb = Basis.Count;
        var cov = new double[nb * nb];
        var mean = new double[nb];
        foreach (var e in ens) for (int i = 0; i < nb; i++) mean[i] += e[i] / members;
        foreach (var e in ens)
            for (int i = 0; i < nb; i++)
                for (int j = 0; j < nb; j++) cov[i * nb + j] += (e[i] - mean[i]) * (e[j] - mean[j]) / Math.Max(1, members - 1);
        return new CalibrationModel
        {
            Basis = Basis, Coefficients = Project(Parameters), CoefficientCovariance = cov, SigmaInt = sigmaInt,
            EnsembleCoefficients = ens, EnsembleSigmaInt = sint, Domain = domain ?? Domain, Filters = Filters,
        };
    }

    /// <summary>Synthetic stars with their true [Fe/H].</summary>
    public sealed record Stars(IndexPhotometry Photometry, double[] TrueFeh, double[] TrueColour);

    /// <summary>
    /// Stars with true colour uniform in [colourLo, colourHi] and true [Fe/H] uniform inside the domain chord at that colour
    /// (the flat prior), each with its own true model drawn from the ensemble distribution, intrinsic scatter sigmaInt, and
    /// band errors sb, sr, sn uniform in the given ranges (mag). Index errors follow from the bands:
    /// dC = dB - dR, dX = dN - (1 + k) dB + k dR.
    /// </summary>
    public static Stars Draw(int n, ulong seed, double sigmaInt, (double Lo, double Hi) bandSigma, (double Lo, double Hi) narrowSigma,
        double colourLo = 0.85, double colourHi = 1.95, double fehLo = double.NegativeInfinity, double fehHi = double.PositiveInfinity)
    {
        var rng = new Rng(seed);
        var x = new double[n]; var c = new double[n]; var vx = new double[n]; var vc = new double[n]; var cv = new double[n];
        var tf = new double[n]; var tc = new double[n];
        for (int i = 0; i < n; i++)
        {
            double ct = colourLo + (colourHi - colourLo) * rng.NextDouble();
            var r = Domain.FehRangeAt(ct)!.Value;
            double lo = Math.Max(r.FehLo, fehLo), hi = Math.Min(r.FehHi, fehHi);
            double ft = lo + (hi - lo) * rng.NextDouble();
            var p = DrawParameters(rng);
            double sb = bandSigma.Lo + (bandSigma.Hi - bandSigma.Lo) * rng.NextDouble();
            double sr = bandSigma.Lo + (bandSigma.Hi - bandSigma.Lo) * rng.NextDouble();
            double sn = narrowSigma.Lo + (narrowSigma.Hi - narrowSigma.Lo) * rng.NextDouble();
            double db = sb * rng.NextGaussian(), dr = sr * rng.NextGaussian(), dn = sn * rng.NextGaussian();
            c[i] = ct + db - dr;
            x[i] = Model(p, ct, ft) + sigmaInt * rng.NextGaussian() + dn - (1 + K) * db + K * dr;
            vc[i] = sb * sb + sr * sr;
            vx[i] = sn * sn + (1 + K) * (1 + K) * sb * sb + K * K * sr * sr;
            cv[i] = -(1 + K) * sb * sb - K * sr * sr;
            tf[i] = ft;
            tc[i] = ct;
        }
        return new Stars(Photometry(x, c, vx, vc, cv), tf, tc);
    }

    public static IndexPhotometry Photometry(double[] x, double[] c, double[] vx, double[] vc, double[] cv, PhotometryStatus[]? status = null)
    {
        int n = x.Length;
        var nan = Enumerable.Repeat(double.NaN, n).ToArray();
        return new IndexPhotometry
        {
            Blue0 = nan, Red0 = nan, Narrow0 = nan, Colour0 = c, Index0 = x, VarColour = vc, VarIndex = vx, CovIndexColour = cv,
            Status = status ?? new PhotometryStatus[n], ColourCoefficient = K,
        };
    }
}
