using Photometallicity.Membership;
using Photometallicity.Metallicity;
using Photometallicity.Numerics;

namespace Photometallicity.Tests.Membership;

/// <summary>
/// Invented test fields (not any real object): an elliptical Plummer dwarf plus a uniform foreground in a square
/// field, with distinct colour-magnitude distributions and Gaussian [Fe/H] likelihoods on a grid. Positions are
/// made on the tangent plane and put on the sky by rotating unit vectors (independent of the code's projection).
/// </summary>
internal sealed record SyntheticFieldSpec
{
    public double CentreRa { get; init; } = 151.25;   // invented
    public double CentreDec { get; init; } = -21.4;   // invented
    public double HalfWidthArcmin { get; init; } = 20;
    public double HalfLightArcmin { get; init; } = 3.5;
    public double Ellipticity { get; init; } = 0.3;
    public double PositionAngleDeg { get; init; } = 40;
    public int Members { get; init; } = 1500;
    public int Foreground { get; init; } = 6000;
    public double DistanceModulus { get; init; } = 22.0;
    public double MdfMean { get; init; } = -1.6;
    public double MdfSigma { get; init; } = 0.3;
    public double ForegroundFehMean { get; init; } = -0.6;
    public double ForegroundFehSigma { get; init; } = 0.4;
    /// <summary>Stars brighter than this have a narrow-band [Fe/H] likelihood.</summary>
    public double NarrowLimit { get; init; } = 23.0;
    public bool Astrometry { get; init; }
    public ulong Seed { get; init; } = 11;
}

internal sealed class SyntheticField
{
    public required MembershipInputs Inputs { get; init; }
    public required bool[] IsMember { get; init; }
    public required SyntheticFieldSpec Spec { get; init; }
    public int MembersInField => IsMember.Count(m => m);

    public const double GridMin = -4.0, GridStep = 0.02;
    public const int GridCount = 251;

    public static double RidgeColour(double m, double dm) { double t = m - dm + 1; return 1.0 - 0.18 * t + 0.02 * t * t; }

    public static SyntheticField Make(SyntheticFieldSpec s)
    {
        var rng = new Rng(s.Seed);
        var ra = new List<double>(); var dec = new List<double>(); var mag = new List<double>(); var col = new List<double>();
        var varC = new List<double>(); var truth = new List<bool>(); var feh = new List<double>();
        var pmr = new List<double>(); var pmd = new List<double>(); var pme = new List<double>(); var plx = new List<double>(); var plxe = new List<double>();
        double th = s.PositionAngleDeg * Math.PI / 180, w = s.HalfWidthArcmin;
        double plx0 = 1000.0 / Math.Pow(10, s.DistanceModulus / 5 + 1);
        void Add(double xi, double eta, bool member)
        {
            var (a, d) = ToSky(s.CentreRa, s.CentreDec, xi, eta);
            ra.Add(a); dec.Add(d); truth.Add(member);
            double m = member ? Exponential(rng, s.DistanceModulus - 3.5, s.DistanceModulus + 2.0, 0.7)
                              : Exponential(rng, s.DistanceModulus - 4.0, s.DistanceModulus + 2.0, 0.3);
            double sc = 0.01 + 0.03 * Math.Pow(10, 0.4 * (m - s.DistanceModulus - 2));
            double c = member ? RidgeColour(m, s.DistanceModulus) + rng.NextGaussian(0, 0.03)
                              : (rng.NextDouble() < 0.6 ? rng.NextGaussian(0.75, 0.15) : rng.NextGaussian(1.5, 0.25));
            mag.Add(m); col.Add(c + rng.NextGaussian(0, sc)); varC.Add(sc * sc);
            feh.Add(member ? rng.NextGaussian(s.MdfMean, s.MdfSigma) : rng.NextGaussian(s.ForegroundFehMean, s.ForegroundFehSigma));
            double e = 0.3 + 0.7 * rng.NextDouble(), ep = 0.2 + 0.6 * rng.NextDouble();
            pme.Add(e); plxe.Add(ep);
            if (member) { pmr.Add(0.3 + rng.NextGaussian(0, 0.02) + rng.NextGaussian(0, e)); pmd.Add(-0.2 + rng.NextGaussian(0, 0.02) + rng.NextGaussian(0, e)); plx.Add(plx0 + rng.NextGaussian(0, ep)); }
            else { pmr.Add(rng.NextGaussian(-2, 4) + rng.NextGaussian(0, e)); pmd.Add(rng.NextGaussian(-4, 4) + rng.NextGaussian(0, e)); plx.Add(Math.Abs(rng.NextGaussian(0.8, 0.6)) + rng.NextGaussian(0, ep)); }
        }
        for (int k = 0; k < s.Members; k++)
        {
            var (xi, eta) = SamplePlummer(rng, 0, 0, s.HalfLightArcmin, s.Ellipticity, th);
            if (Math.Abs(xi) <= w && Math.Abs(eta) <= w) Add(xi, eta, true);
        }
        for (int k = 0; k < s.Foreground; k++) Add(w * (2 * rng.NextDouble() - 1), w * (2 * rng.NextDouble() - 1), false);

        int n = ra.Count;
        var usable = new bool[n];
        Array.Fill(usable, true);
        var inputs = new MembershipInputs
        {
            RaDeg = ra.ToArray(), DecDeg = dec.ToArray(), Mag = mag.ToArray(), Colour0 = col.ToArray(), VarColour = varC.ToArray(),
            VarMag = varC.ToArray(), Usable = usable, Feh = Likelihoods(rng, feh, mag, s.NarrowLimit),
            PmRa = s.Astrometry ? pmr.ToArray() : null, PmDec = s.Astrometry ? pmd.ToArray() : null,
            PmRaErr = s.Astrometry ? pme.ToArray() : null, PmDecErr = s.Astrometry ? pme.ToArray() : null,
            Parallax = s.Astrometry ? plx.ToArray() : null, ParallaxErr = s.Astrometry ? plxe.ToArray() : null,
        };
        return new SyntheticField { Inputs = inputs, IsMember = truth.ToArray(), Spec = s };
    }

    /// <summary>
    /// A point drawn from an elliptical Plummer profile: major-axis radius from the inverse of the enclosed fraction
    /// R^2 / (R^2 + a^2) (Plummer 1911), uniform angle, minor axis squeezed by 1 - e, major axis at position angle
    /// <paramref name="paRad"/> east of north.
    /// </summary>
    public static (double Xi, double Eta) SamplePlummer(Rng rng, double x0, double y0, double a, double e, double paRad)
    {
        double u = rng.NextDouble();
        double r = a * Math.Sqrt(u / (1 - u));
        double phi = 2 * Math.PI * rng.NextDouble();
        double v = r * Math.Cos(phi), q = r * Math.Sin(phi) * (1 - e);
        return (x0 + v * Math.Sin(paRad) + q * Math.Cos(paRad), y0 + v * Math.Cos(paRad) - q * Math.Sin(paRad));
    }

    public static MembershipOptions Options(SyntheticFieldSpec s, double offsetArcmin = 0) => new()
    {
        InitialCentre = Photometallicity.Units.SkyPosition.FromDegrees(ToSky(s.CentreRa, s.CentreDec, offsetArcmin, 0).Ra, ToSky(s.CentreRa, s.CentreDec, offsetArcmin, 0).Dec),
        DistanceModulus = s.DistanceModulus,
        InitialHalfLightArcmin = s.HalfLightArcmin * 1.2,
    };

    /// <summary>Gaussian likelihoods N(F; F_obs, sigma) on the grid, window where above 1e-6 of the peak, unit integral.</summary>
    private static FehLikelihoods Likelihoods(Rng rng, List<double> feh, List<double> mag, double limit)
    {
        int n = feh.Count;
        var off = new int[n]; var start = new int[n]; var len = new int[n];
        var vals = new List<Half>();
        for (int i = 0; i < n; i++)
        {
            off[i] = vals.Count;
            if (mag[i] > limit) continue;
            double sig = 0.12 + 0.15 * Math.Pow(10, 0.4 * (mag[i] - limit));
            double obs = feh[i] + rng.NextGaussian(0, sig);
            double half = sig * Math.Sqrt(2 * Math.Log(1e6));
            int j0 = Math.Max(0, (int)Math.Ceiling((obs - half - GridMin) / GridStep));
            int j1 = Math.Min(GridCount - 1, (int)Math.Floor((obs + half - GridMin) / GridStep));
            if (j1 < j0) continue;
            var win = new double[j1 - j0 + 1];
            for (int j = j0; j <= j1; j++) { double z = (GridMin + j * GridStep - obs) / sig; win[j - j0] = Math.Exp(-0.5 * z * z); }
            double norm = win.Sum() * GridStep;
            foreach (var v in win) vals.Add((Half)(v / norm));
            start[i] = j0; len[i] = win.Length;
        }
        return new FehLikelihoods { GridMin = GridMin, GridStep = GridStep, GridCount = GridCount, Offset = off, Start = start, Length = len, Values = vals.ToArray() };
    }

    private static double Exponential(Rng rng, double lo, double hi, double beta)
    {
        double u = rng.NextDouble();
        return lo + Math.Log(1 + u * (Math.Exp(beta * (hi - lo)) - 1)) / beta;
    }

    /// <summary>Gnomonic deprojection by vector rotation: direction = e_r + xi e_east + eta e_north, normalised.</summary>
    public static (double Ra, double Dec) ToSky(double ra0Deg, double dec0Deg, double xiArcmin, double etaArcmin)
    {
        double a = ra0Deg * Math.PI / 180, d = dec0Deg * Math.PI / 180;
        double xi = xiArcmin / 60 * Math.PI / 180, eta = etaArcmin / 60 * Math.PI / 180;
        double[] er = [Math.Cos(d) * Math.Cos(a), Math.Cos(d) * Math.Sin(a), Math.Sin(d)];
        double[] ee = [-Math.Sin(a), Math.Cos(a), 0];
        double[] en = [-Math.Sin(d) * Math.Cos(a), -Math.Sin(d) * Math.Sin(a), Math.Cos(d)];
        double x = er[0] + xi * ee[0] + eta * en[0], y = er[1] + xi * ee[1] + eta * en[1], z = er[2] + xi * ee[2] + eta * en[2];
        double norm = Math.Sqrt(x * x + y * y + z * z);
        double ra = Math.Atan2(y, x) * 180 / Math.PI;
        if (ra < 0) ra += 360;
        return (ra, Math.Asin(z / norm) * 180 / Math.PI);
    }

    /// <summary>Area under the ROC curve of scores against truth (Mann-Whitney U / (n1 n0), ties counted half).</summary>
    public static double Auc(double[] score, bool[] truth)
    {
        var idx = Enumerable.Range(0, score.Length).OrderBy(i => score[i]).ToArray();
        double rankSum = 0; int n1 = 0;
        int k = 0;
        while (k < idx.Length)
        {
            int j = k;
            while (j + 1 < idx.Length && score[idx[j + 1]] == score[idx[k]]) j++;
            double rank = 0.5 * (k + j) + 1;
            for (int q = k; q <= j; q++) if (truth[idx[q]]) { rankSum += rank; n1++; }
            k = j + 1;
        }
        int n0 = score.Length - n1;
        return (rankSum - n1 * (n1 + 1) / 2.0) / ((double)n1 * n0);
    }
}
