using Photometallicity.Catalogues;
using Photometallicity.Membership;
using Photometallicity.Numerics;
using Photometallicity.Photometry;
using Photometallicity.Units;

namespace Photometallicity.Demo;

/// <summary>
/// Generates the invented demonstration field: an invented dwarf galaxy (elliptical Plummer profile, red-giant
/// branch at its distance, Gaussian metallicity distribution) over a uniform Milky Way foreground of dwarfs that
/// sit off the giant index relation; a broadband catalogue (two bands, per-star E(B-V)), a shallower narrow-band
/// catalogue from "other images" (own ids, an astrometric offset, spurious sources, shuffled order), and
/// spectroscopic standards with errors, some of them bad. All of it invented.
/// </summary>
public static class DemoGenerator
{
    /// <summary>
    /// Generates the field. <paramref name="variant"/> null is the demo field itself (byte for byte as it has always been);
    /// a variant changes the index law and the standards and adds truth columns (see <see cref="DemoVariant"/>).
    /// </summary>
    public static DemoField Generate(int stars, ulong seed, DemoTruth? truth = null, DemoVariant? variant = null)
    {
        var giantIndex = variant?.GiantIndex ?? DemoTruth.GiantIndex;
        if (stars < 500) throw new ArgumentOutOfRangeException(nameof(stars), stars, "the demo field needs at least 500 stars");
        truth ??= DemoTruth.ForStars(stars);
        var rng = Seeds.For(seed, "demo-field");
        var errB = new PhotometricErrorModel("b480", truth.BlueDepth5, truth.ErrorFloor);
        var errR = new PhotometricErrorModel("r770", truth.RedDepth5, truth.ErrorFloor);
        var errN = new PhotometricErrorModel("n395", truth.NarrowDepth5, truth.ErrorFloor);
        double[] coef = truth.ExtinctionCoefficients;
        var tangent = new TangentPlane(SkyPosition.FromDegrees(truth.CentreRaDeg, truth.CentreDecDeg));

        var id = new string[stars];
        var ra = new double[stars];
        var dec = new double[stars];
        var b = new double[stars];
        var be = new double[stars];
        var r = new double[stars];
        var re = new double[stars];
        var ebv = new double[stars];
        var member = new bool[stars];
        var fehTrue = new double[stars];
        var colourTrue = new double[stars];
        var indexTrue = new double[stars];
        var narrowTrue = new double[stars];
        var blueTrue = new double[stars];
        var redTrue = new double[stars];

        for (int i = 0; i < stars; i++)
        {
            id[i] = $"VD{i + 1:D7}";
            bool isMember = rng.NextDouble() < truth.MemberFraction;
            member[i] = isMember;
            double xi, eta;
            if (isMember) (xi, eta) = PlummerPosition(rng, truth);
            else
            {
                xi = (2 * rng.NextDouble() - 1) * truth.FieldHalfWidthArcmin;
                eta = (2 * rng.NextDouble() - 1) * truth.FieldHalfWidthArcmin;
            }
            var pos = tangent.Deproject(xi, eta);
            (ra[i], dec[i]) = (pos.RaDegrees, pos.DecDegrees);

            double blue0, c0, x0, feh;
            if (isMember)
            {
                feh = Math.Clamp(rng.NextGaussian(truth.MeanFeh, truth.SigmaFeh), -3.6, -0.1);
                double absB = SampleExponential(rng, -2.6, 2.8, 0.3 * Math.Log(10)); // luminosity function rising to faint mags, invented
                blue0 = absB + truth.DistanceModulus;
                c0 = DemoTruth.GiantColour(absB, feh) + rng.NextGaussian(0, 0.015);
                x0 = giantIndex(c0, feh) + rng.NextGaussian(0, truth.IntrinsicIndexScatter);
            }
            else
            {
                feh = Math.Clamp(rng.NextGaussian(-0.7, 0.45), -2.5, 0.4); // invented foreground disc/halo mix
                blue0 = SampleExponential(rng, 17.5, 25.3, 0.25);
                c0 = Math.Clamp(rng.NextGaussian(1.05, 0.38), 0.35, 2.6);
                x0 = giantIndex(c0, feh) + truth.DwarfIndexOffset + rng.NextGaussian(0, 0.03);
            }
            fehTrue[i] = feh;
            colourTrue[i] = c0;
            indexTrue[i] = x0;
            double e = Math.Max(0.0, truth.MeanEbv + 0.01 * (xi / truth.FieldHalfWidthArcmin) + rng.NextGaussian(0, 0.003));
            ebv[i] = Math.Round(e + rng.NextGaussian(0, 0.005), 4); // the catalogue's E(B-V) is a measurement: 0.005 mag error, as the demo config states
            double red0 = blue0 - c0;
            double narrow0 = blue0 + x0 + truth.ColourCoefficient * c0;
            double bt = blue0 + coef[0] * e, rt = red0 + coef[1] * e;
            narrowTrue[i] = narrow0 + coef[2] * e;
            blueTrue[i] = blue0;
            redTrue[i] = red0;
            be[i] = errB.Sigma(bt);
            re[i] = errR.Sigma(rt);
            b[i] = bt + rng.NextGaussian(0, be[i]);
            r[i] = rt + rng.NextGaussian(0, re[i]);
            ra[i] += rng.NextGaussian(0, 0.03) / 3600.0 / Math.Cos(dec[i] * Math.PI / 180);
            dec[i] += rng.NextGaussian(0, 0.03) / 3600.0;
            ra[i] = WrapRa(ra[i]); // only a field straddling RA = 0/360 can leave [0, 360) here
        }

        var broad = new Table(stars, "broad.csv");
        broad.Add(new Column<string>("src", id, description: "broadband source id"));
        broad.Add(new Column<double>("ra", WrapAll(Round(ra, 7)), unit: "deg"));
        broad.Add(new Column<double>("dec", Round(dec, 7), unit: "deg"));
        var rMissing = new bool[stars];
        for (int i = 0; i < stars; i++)
            if (r[i] > truth.RedDepth5 + 0.4) { r[i] = 99.999; re[i] = 9.999; } // below detection: the catalogue's sentinel (invented convention)
        broad.Add(new Column<double>("b480", Round(b, 4), unit: "mag"));
        broad.Add(new Column<double>("b480_err", Round(be, 4), unit: "mag"));
        broad.Add(new Column<double>("r770", Round(r, 4), unit: "mag"));
        broad.Add(new Column<double>("r770_err", Round(re, 4), unit: "mag"));
        broad.Add(new Column<double>("ebv", ebv, unit: "mag"));

        var detected = new bool[stars];
        var narrow = MakeNarrow(rng, truth, tangent, ra, dec, narrowTrue, errN, detected);
        var standards = variant is null
            ? MakeStandards(rng, id, ra, dec, b, member, fehTrue, colourTrue)
            : VariantStandards.Make(Seeds.For(seed, DemoVariant.StandardsStream), variant, truth, id, ra, dec, member, fehTrue, redTrue, detected);

        var starTruth = new Table(stars, "truth_stars.csv");
        starTruth.Add(new Column<string>("src", id));
        starTruth.Add(new Column<bool>("is_member", member));
        starTruth.Add(new Column<double>("feh_true", Round(fehTrue, 4), unit: "dex"));
        starTruth.Add(new Column<double>("colour0_true", Round(colourTrue, 4), unit: "mag"));
        starTruth.Add(new Column<double>("index0_true", Round(indexTrue, 4), unit: "mag"));
        if (variant is not null)
        {
            var snr = new double[stars];
            for (int i = 0; i < stars; i++) snr[i] = Math.Round(errN.SignalToNoise(narrowTrue[i]), 2);
            starTruth.Add(new Column<double>("blue0_true", Round(blueTrue, 4), unit: "mag"));
            starTruth.Add(new Column<double>("red0_true", Round(redTrue, 4), unit: "mag"));
            starTruth.Add(new Column<double>("narrow_snr_true", snr, description: "narrow-band S/N at the true magnitude"));
            starTruth.Add(new Column<bool>("narrow_detected", detected, description: "the star is in the narrow-band catalogue"));
        }
        return new DemoField(broad, narrow, standards, starTruth, truth);
    }

    private static Table MakeNarrow(Rng rng, DemoTruth truth, TangentPlane tangent, double[] ra, double[] dec, double[] narrowTrue, PhotometricErrorModel errN, bool[] detected)
    {
        var rows = new List<(double Ra, double Dec, double Mag, double Err)>();
        for (int i = 0; i < ra.Length; i++)
        {
            double m = narrowTrue[i];
            double pDetect = 1.0 / (1.0 + Math.Exp((m - (truth.NarrowDepth5 + 0.2)) / 0.15)); // completeness roll-off, invented
            if (rng.NextDouble() >= pDetect) continue;
            detected[i] = true;
            double err = errN.Sigma(m);
            double cosd = Math.Cos(dec[i] * Math.PI / 180);
            double nra = ra[i] + (truth.OffsetRaCosDecArcsec + rng.NextGaussian(0, 0.05)) / 3600.0 / cosd;
            double ndec = dec[i] + (truth.OffsetDecArcsec + rng.NextGaussian(0, 0.05)) / 3600.0;
            rows.Add((WrapRa(nra), ndec, m + rng.NextGaussian(0, err), err));
        }
        int spurious = Math.Max(5, rows.Count / 50); // 2% spurious detections (cosmic rays, artefacts), invented
        for (int s = 0; s < spurious; s++)
        {
            var sp = tangent.Deproject((2 * rng.NextDouble() - 1) * truth.FieldHalfWidthArcmin, (2 * rng.NextDouble() - 1) * truth.FieldHalfWidthArcmin);
            var (sra, sdec) = (sp.RaDegrees, sp.DecDegrees);
            double m = 21.5 + 2.0 * rng.NextDouble();
            rows.Add((sra, sdec, m, errN.Sigma(m)));
        }
        // The narrow-band catalogue comes from other images: its own order.
        for (int i = rows.Count - 1; i > 0; i--)
        {
            int j = rng.NextInt(i + 1);
            (rows[i], rows[j]) = (rows[j], rows[i]);
        }
        var t = new Table(rows.Count, "narrow.csv");
        t.Add(new Column<string>("nid", rows.Select((_, k) => $"N{k + 1:D6}").ToArray(), description: "narrow-band source id"));
        t.Add(new Column<double>("ra", WrapAll(Round(rows.Select(x => x.Ra).ToArray(), 7)), unit: "deg"));
        t.Add(new Column<double>("dec", Round(rows.Select(x => x.Dec).ToArray(), 7), unit: "deg"));
        t.Add(new Column<double>("n395", Round(rows.Select(x => x.Mag).ToArray(), 4), unit: "mag"));
        t.Add(new Column<double>("n395_err", Round(rows.Select(x => x.Err).ToArray(), 4), unit: "mag"));
        return t;
    }

    private static Table MakeStandards(Rng rng, string[] id, double[] ra, double[] dec, double[] blue, bool[] member, double[] fehTrue, double[] colour)
    {
        // An invented spectroscopic survey: bright member giants, chosen to spread over [Fe/H] (weights ~ 1/density),
        // plus a few bad standards (binaries, bad spectra: wrong [Fe/H]; foreground dwarfs mistaken for members).
        var bright = Enumerable.Range(0, id.Length).Where(i => member[i] && blue[i] < 22.6).ToArray();
        var picked = new List<int>();
        foreach (int i in bright)
        {
            double z = (fehTrue[i] + 1.65) / 0.38;
            double w = Math.Min(1.0, 0.12 * Math.Exp(0.5 * z * z));
            if (rng.NextDouble() < w) picked.Add(i);
            if (picked.Count >= 200) break;
        }
        var dwarfs = Enumerable.Range(0, id.Length).Where(i => !member[i] && blue[i] < 21.5 && colour[i] > 0.75 && colour[i] < 1.1).Take(3).ToList();
        var rows = new List<(string Id, double Ra, double Dec, double Feh, double Err, string Note)>();
        int bad = 0;
        foreach (int i in picked)
        {
            double err = 0.05 + 0.07 * rng.NextDouble();
            double feh = fehTrue[i] + rng.NextGaussian(0, err);
            string note = "ok";
            if (bad < 6 && rng.NextDouble() < 0.06)
            {
                feh += (rng.NextDouble() < 0.5 ? -1 : 1) * (0.7 + 0.4 * rng.NextDouble());
                note = "bad: wrong [Fe/H] (invented binary or bad spectrum)";
                bad++;
            }
            rows.Add(($"S{rows.Count + 1:D4}", ra[i], dec[i], feh, err, note));
        }
        foreach (int i in dwarfs)
            rows.Add(($"S{rows.Count + 1:D4}", ra[i], dec[i], fehTrue[i] + rng.NextGaussian(0, 0.1), 0.1, "bad: foreground dwarf (invented non-member)"));
        var t = new Table(rows.Count, "standards.csv");
        t.Add(new Column<string>("star", rows.Select(x => x.Id).ToArray()));
        t.Add(new Column<double>("ra", Round(rows.Select(x => x.Ra + 0.0).ToArray(), 7), unit: "deg"));
        t.Add(new Column<double>("dec", Round(rows.Select(x => x.Dec).ToArray(), 7), unit: "deg"));
        t.Add(new Column<double>("feh_spec", Round(rows.Select(x => x.Feh).ToArray(), 3), unit: "dex"));
        t.Add(new Column<double>("feh_spec_err", Round(rows.Select(x => x.Err).ToArray(), 3), unit: "dex"));
        t.Add(new Column<string>("truth_note", rows.Select(x => x.Note).ToArray(), description: "invented truth, for checking only"));
        return t;
    }

    private static (double Xi, double Eta) PlummerPosition(Rng rng, DemoTruth t)
    {
        double pa = t.PositionAngleDeg * Math.PI / 180;
        while (true)
        {
            // Plummer: fraction inside R is R^2 / (R^2 + a^2) with a = r_h (Plummer 1911), so R = a sqrt(u / (1 - u)).
            double u = rng.NextDouble();
            double rad = t.HalfLightArcmin * Math.Sqrt(u / (1 - u));
            double th = 2 * Math.PI * rng.NextDouble();
            double major = rad * Math.Cos(th), minor = rad * Math.Sin(th) * (1 - t.Ellipticity);
            double xi = major * Math.Sin(pa) + minor * Math.Cos(pa);
            double eta = major * Math.Cos(pa) - minor * Math.Sin(pa);
            if (Math.Abs(xi) <= t.FieldHalfWidthArcmin && Math.Abs(eta) <= t.FieldHalfWidthArcmin) return (xi, eta);
        }
    }

    /// <summary>Draws from p(x) ∝ exp(b x) on [lo, hi] by inversion.</summary>
    private static double SampleExponential(Rng rng, double lo, double hi, double b)
    {
        double u = rng.NextDouble();
        double ea = Math.Exp(b * lo), eb = Math.Exp(b * hi);
        return Math.Log(ea + u * (eb - ea)) / b;
    }

    /// <summary>RA into [0, 360); values already inside are returned untouched (bit for bit).</summary>
    internal static double WrapRa(double ra) => ra < 0 ? ra + 360 : ra >= 360 ? ra - 360 : ra;

    /// <summary>Every RA into [0, 360) (a value rounded up to 360 becomes 0); values inside are untouched.</summary>
    internal static double[] WrapAll(double[] ra)
    {
        for (int i = 0; i < ra.Length; i++) ra[i] = WrapRa(ra[i]);
        return ra;
    }

    internal static double[] Round(double[] v, int digits)
    {
        for (int i = 0; i < v.Length; i++) v[i] = Math.Round(v[i], digits);
        return v;
    }
}
