using Photometallicity.Numerics;

namespace Photometallicity.Tests.CrossMatch;

/// <summary>
/// Invented test fields built in the tangent plane about a chosen centre and turned into (RA, Dec) with the
/// trigonometric inverse gnomonic projection (Calabretta &amp; Greisen 2002, A&amp;A 395, 1077, eqs. 54 and 55 for
/// TAN; Snyder 1987, USGS Prof. Paper 1395, p. 165), independent of the vector form in the code under test.
/// Right = left mapped by a similarity (offset, rotation, scale) plus Gaussian noise, for a kept fraction;
/// then uniform spurious right sources.
/// </summary>
public sealed record SyntheticField(double[] LeftRa, double[] LeftDec, double[] RightRa, double[] RightDec, int[] TruePartner)
{
    public static SyntheticField Make(ulong seed, int n, double ra0, double dec0, double halfWidthDeg,
        double offXiArcsec, double offEtaArcsec, double noiseArcsec, double keep, int spurious,
        double rotationArcsec = 0.0, double scale = 1.0)
    {
        var rng = new Rng(seed);
        const double as2rad = Math.PI / 180.0 / 3600.0;
        double w = halfWidthDeg * Math.PI / 180.0;
        double th = rotationArcsec * as2rad;
        double a = scale * Math.Cos(th), b = scale * Math.Sin(th);
        var lra = new double[n];
        var ldec = new double[n];
        var truth = new int[n];
        var rra = new List<double>();
        var rdec = new List<double>();
        for (int i = 0; i < n; i++)
        {
            double xi = (2 * rng.NextDouble() - 1) * w, eta = (2 * rng.NextDouble() - 1) * w;
            (lra[i], ldec[i]) = Deproject(ra0, dec0, xi, eta);
            truth[i] = -1;
            if (rng.NextDouble() < keep)
            {
                double rx = a * xi - b * eta + offXiArcsec * as2rad + rng.NextGaussian(0, noiseArcsec) * as2rad;
                double ry = b * xi + a * eta + offEtaArcsec * as2rad + rng.NextGaussian(0, noiseArcsec) * as2rad;
                truth[i] = rra.Count;
                var (r1, d1) = Deproject(ra0, dec0, rx, ry);
                rra.Add(r1);
                rdec.Add(d1);
            }
        }
        for (int k = 0; k < spurious; k++)
        {
            var (r1, d1) = Deproject(ra0, dec0, (2 * rng.NextDouble() - 1) * w, (2 * rng.NextDouble() - 1) * w);
            rra.Add(r1);
            rdec.Add(d1);
        }
        return new SyntheticField(lra, ldec, rra.ToArray(), rdec.ToArray(), truth);
    }

    /// <summary>Inverse gnomonic projection about (ra0, dec0) in degrees of standard coordinates in radians.</summary>
    public static (double Ra, double Dec) Deproject(double ra0Deg, double dec0Deg, double xi, double eta)
    {
        double a0 = ra0Deg * Math.PI / 180, d0 = dec0Deg * Math.PI / 180;
        double rho = Math.Sqrt(xi * xi + eta * eta);
        if (rho == 0) return (ra0Deg, dec0Deg);
        double c = Math.Atan(rho);
        double dec = Math.Asin(Math.Cos(c) * Math.Sin(d0) + eta * Math.Sin(c) * Math.Cos(d0) / rho);
        double ra = a0 + Math.Atan2(xi * Math.Sin(c), rho * Math.Cos(d0) * Math.Cos(c) - eta * Math.Sin(d0) * Math.Sin(c));
        double raDeg = ra * 180 / Math.PI % 360.0;
        if (raDeg < 0) raDeg += 360.0;
        return (raDeg, dec * 180 / Math.PI);
    }
}
