using Photometallicity.Calibration;
using Photometallicity.Errors;
using Photometallicity.Numerics;

namespace Photometallicity.Tests.Calibration;

/// <summary>The outlier mixture and the extrapolation error, on invented standards with known truth (SyntheticStandards).</summary>
public class RobustCalibrationTest
{
    /// <summary>Bad standards as in practice: [Fe/H] off by 0.5-1.2 dex either way (binaries, non-members, bad spectra).</summary>
    private static (CalibrationStandards St, bool[] Bad) WithBadFeh(int stars, double share, ulong seed)
    {
        var st = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = stars }, seed);
        var rng = new Rng(seed + 100);
        var bad = new bool[stars];
        int nBad = (int)Math.Round(share * stars);
        foreach (int i in Enumerable.Range(0, stars).OrderBy(_ => rng.NextDouble()).Take(nBad))
        {
            bad[i] = true;
            st.Feh[i] += (rng.NextDouble() < 0.5 ? -1 : 1) * (0.5 + 0.7 * rng.NextDouble());
        }
        return (st, bad);
    }

    [Fact]
    public void BadStandards_AreFlaggedWithTheirProbability_GoodOnesAlmostNever()
    {
        int badTotal = 0, badFlagged = 0, goodTotal = 0, goodFlagged = 0;
        foreach (var (share, seed) in new[] { (0.05, 41UL), (0.10, 42UL), (0.15, 43UL) })
        {
            var (st, bad) = WithBadFeh(200, share, seed);
            var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 0));
            for (int i = 0; i < st.Count; i++)
            {
                var v = r.PerStandard[i];
                Assert.InRange(v.POutlier, 0.0, 1.0);
                if (v.Status == StandardStatus.RejectedOutlier) Assert.True(v.POutlier > CalibrationFitter.OutlierThreshold && Math.Abs(v.ResidualSigma) > MixtureFit.MinOutlierSigma);
                if (bad[i]) { badTotal++; if (!v.Accepted) badFlagged++; }
                else { goodTotal++; if (!v.Accepted) goodFlagged++; }
            }
            Assert.InRange(r.OutlierFraction, 0.5 * share, 2 * share + 0.02);
        }
        Assert.True(badFlagged >= 0.8 * badTotal, $"{badFlagged} of {badTotal} bad standards flagged");
        Assert.True(goodFlagged <= 0.02 * goodTotal, $"{goodFlagged} of {goodTotal} good standards flagged");
    }

    [Fact]
    public void MoreThanHalfTheStandardsOutliers_IsAnErrorThatSaysSo()
    {
        var (st, _) = WithBadFeh(120, 0.65, 44);
        var e = Assert.Throws<MethodException>(() => CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 0)));
        Assert.Contains("more than half", e.Message);
    }

    [Fact]
    public void AnIndexThatDoesNotFollowTheStandardsFeh_IsAnError()
    {
        var st = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 60 }, 46);
        var rng = new Rng(45);
        for (int i = 0; i < 60; i++) st.Feh[i] = -3.0 + 2.8 * rng.NextDouble(); // the [Fe/H] column has nothing to do with the stars
        var e = Assert.Throws<MethodException>(() => CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 0)));
        Assert.Contains("does not follow", e.Message);
        Assert.Contains("more than half", e.Message);
    }

    /// <summary>
    /// Standards only at red colours (1.2-1.6), model curved in colour: bluer stars lie outside the standards. The ensemble (bootstrap
    /// plus the measured model-form error) must contain the true index at blue colours about as often as its quantiles say.
    /// </summary>
    [Fact]
    public void BeyondTheStandards_TheEnsembleSpreadGrowsAndCoversTheTruth()
    {
        int inside = 0, total = 0;
        double spreadNear = 0, spreadFar = 0;
        for (int rep = 0; rep < 6; rep++)
        {
            var spec = new SyntheticStandards.Spec { Stars = 150, ColourMin = 1.2, ColourMax = 1.6 };
            var st = SyntheticStandards.Make(spec, 50 + (ulong)rep);
            var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 200, seed: (ulong)rep));
            var m = r.Model;
            Assert.NotNull(m.Extrapolation);
            foreach (double c in new[] { 0.9, 1.0, 1.1 })
                foreach (double f in new[] { -2.0, -1.5, -1.0 })
                {
                    var values = Enumerable.Range(0, m.EnsembleCoefficients.Length).Select(k => m.MemberSlice(k, c).At(f).Value).Order().ToArray();
                    double lo = values[(int)(0.025 * values.Length)], hi = values[(int)(0.975 * values.Length)];
                    double truth = SyntheticStandards.Truth(c, f);
                    total++;
                    if (truth >= lo && truth <= hi) inside++;
                    if (c == 1.1) spreadNear += hi - lo; else if (c == 0.9) spreadFar += hi - lo;
                }
        }
        Assert.True(spreadFar > spreadNear, $"95% spread {spreadFar / 18:F3} mag at colour 0.9 against {spreadNear / 18:F3} at 1.1");
        Assert.True(inside >= 0.8 * total, $"truth inside the ensemble's 95% range in {inside} of {total} cases");
    }
}
