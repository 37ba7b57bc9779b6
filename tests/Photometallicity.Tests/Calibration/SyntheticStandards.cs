using Photometallicity.Calibration;
using Photometallicity.Numerics;

namespace Photometallicity.Tests.Calibration;

/// <summary>
/// Invented calibration standards for tests: a known forward model X0 = f(C0, [Fe/H]) (invented numbers, no
/// real system), true colours and metallicities drawn uniformly, Gaussian errors in index, colour (correlated)
/// and [Fe/H], plus an intrinsic scatter. Optional clusters: blocks of stars sharing one true [Fe/H] and one
/// literature value.
/// </summary>
internal static class SyntheticStandards
{
    public static readonly FilterSet Filters = new("invented-system", "b_inv", "r_inv", "hk_inv", 1.1, 3.0, 1.5, 4.0);

    /// <summary>Invented degree-2 model: X0 = 0.40 + 0.55 C + 0.30 F + 0.10 C^2 + 0.15 C F + 0.06 F^2.</summary>
    public static double Truth(double c, double f) => 0.40 + 0.55 * c + 0.30 * f + 0.10 * c * c + 0.15 * c * f + 0.06 * f * f;

    public sealed record Spec
    {
        public int Stars { get; init; } = 120;
        public int Clusters { get; init; }
        public int StarsPerCluster { get; init; } = 10;
        public double SigmaIndex { get; init; } = 0.02;
        public double SigmaColour { get; init; } = 0.01;
        public double Correlation { get; init; } = -0.3;
        public double SigmaFeh { get; init; } = 0.10;
        public double SigmaInt { get; init; } = 0.02;
        public double ColourMin { get; init; } = 0.8;
        public double ColourMax { get; init; } = 1.6;
        public double FehMin { get; init; } = -2.4;
        public double FehMax { get; init; } = -0.6;
        public Func<double, double, double> Model { get; init; } = Truth;
    }

    public static CalibrationStandards Make(Spec s, ulong seed)
    {
        var rng = new Rng(seed);
        int n = s.Stars + s.Clusters * s.StarsPerCluster;
        var id = new string[n];
        var c0 = new double[n]; var x0 = new double[n]; var vc = new double[n]; var vx = new double[n];
        var cov = new double[n]; var feh = new double[n]; var fe = new double[n]; var grp = new int[n];
        int k = 0;
        void Star(string name, double fTrue, double fObs, double fErr, int g)
        {
            double cTrue = s.ColourMin + (s.ColourMax - s.ColourMin) * rng.NextDouble();
            double e1 = rng.NextGaussian(), e2 = rng.NextGaussian();
            double eC = s.SigmaColour * e1;
            double eX = s.SigmaIndex * (s.Correlation * e1 + Math.Sqrt(1 - s.Correlation * s.Correlation) * e2);
            id[k] = name;
            c0[k] = cTrue + eC;
            x0[k] = s.Model(cTrue, fTrue) + eX + s.SigmaInt * rng.NextGaussian();
            vc[k] = s.SigmaColour * s.SigmaColour;
            vx[k] = s.SigmaIndex * s.SigmaIndex;
            cov[k] = s.Correlation * s.SigmaColour * s.SigmaIndex;
            feh[k] = fObs;
            fe[k] = fErr;
            grp[k] = g;
            k++;
        }
        for (int i = 0; i < s.Stars; i++)
        {
            double f = s.FehMin + (s.FehMax - s.FehMin) * rng.NextDouble();
            Star($"star{i:D4}", f, f + s.SigmaFeh * rng.NextGaussian(), s.SigmaFeh, -1);
        }
        var names = new string[s.Clusters];
        for (int g = 0; g < s.Clusters; g++)
        {
            names[g] = $"cluster{g:D2}";
            double f = s.FehMin + (s.FehMax - s.FehMin) * (g + 0.5) / s.Clusters;
            double fObs = f + 0.05 * rng.NextGaussian();
            for (int j = 0; j < s.StarsPerCluster; j++) Star($"cl{g:D2}-{j:D2}", f, fObs, 0.05, g);
        }
        return new CalibrationStandards
        {
            Id = id, Colour0 = c0, Index0 = x0, VarColour = vc, VarIndex = vx, CovIndexColour = cov,
            Feh = feh, FehErr = fe, Group = grp, GroupName = names,
        };
    }

    public static CalibrationOptions Options(int bootstrap = 100, int? degree = null, ulong seed = 11) =>
        new() { Bootstrap = bootstrap, Degree = degree, Seed = seed, Filters = Filters };
}
