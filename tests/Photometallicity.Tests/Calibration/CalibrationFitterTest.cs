using Photometallicity.Calibration;
using Photometallicity.Errors;

namespace Photometallicity.Tests.Calibration;

public class CalibrationFitterTest
{
    [Fact]
    public void Run_RecoversKnownForwardModelWithinBootstrapErrors()
    {
        // Source of truth: the invented model SyntheticStandards.Truth that generated the data.
        var st = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 200 }, 1);
        var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 200));
        var m = r.Model;
        Assert.True(r.Degree == 2, $"degree {r.Degree}: CV {string.Join(", ", r.CvScoreByDegree)} +- {string.Join(", ", r.CvScoreErrorByDegree)}");
        // Compare the model with the truth at points inside the domain, against the ensemble spread there.
        foreach (var (c, f) in new[] { (1.0, -2.0), (1.2, -1.5), (1.4, -1.0), (1.2, -2.0) })
        {
            double truth = SyntheticStandards.Truth(c, f);
            double fit = m.Evaluate(c, f);
            var ens = m.EnsembleCoefficients.Select(e => m.Basis.Value(e, c, f)).ToArray();
            double mean = ens.Average(), sd = Math.Sqrt(ens.Sum(v => (v - mean) * (v - mean)) / (ens.Length - 1));
            Assert.True(Math.Abs(fit - truth) < 3 * sd, $"at ({c}, {f}): fit {fit}, truth {truth}, bootstrap sd {sd}");
        }
        // Intrinsic scatter recovered (truth 0.02 mag).
        Assert.InRange(m.SigmaInt, 0.012, 0.028);
        Assert.All(m.EnsembleSigmaInt, s => Assert.InRange(s, 0.0, 0.05));
        Assert.Equal(200, r.PerStandard.Length);
        Assert.Equal(+1, r.FehSlopeSign);
    }
}
