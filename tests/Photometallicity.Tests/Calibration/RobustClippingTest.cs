using Photometallicity.Calibration;

namespace Photometallicity.Tests.Calibration;

/// <summary>
/// Many moderately bad standards inflate the fitted intrinsic scatter until none of them exceeds the clipping
/// threshold in plain sigma_eff units; the robust spread of the normalised residuals (1.4826 MAD; Hampel 1974,
/// JASA 69, 383) must still expose them.
/// </summary>
public class RobustClippingTest
{
    [Fact]
    public void Fit_FifteenPercentModerateOutliers_AreAllRejected()
    {
        var s = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 140, SigmaInt = 0.01, SigmaFeh = 0.03 }, 4242);
        var bad = Enumerable.Range(0, s.Count).Where(i => i % 7 == 3).ToArray(); // 20 of 140
        foreach (int i in bad) s.Index0[i] += 0.15; // 7 sigma of the good standards' scatter
        var r = CalibrationFitter.Run(s, new CalibrationOptions { Bootstrap = 0, Seed = 1, Degree = 2, Filters = SyntheticStandards.Filters });
        var rejected = r.PerStandard.Select((v, i) => (v, i)).Where(x => !x.v.Accepted).Select(x => x.i).ToHashSet();
        Assert.True(bad.All(rejected.Contains), $"{bad.Count(rejected.Contains)} of {bad.Length} bad standards rejected");
        Assert.True(rejected.Count <= bad.Length + 3, $"{rejected.Count} rejected in all");
        Assert.InRange(r.Model.SigmaInt, 0.0, 0.03);
    }
}
