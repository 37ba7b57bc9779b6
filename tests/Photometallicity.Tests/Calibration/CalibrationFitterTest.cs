using System.Text;
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
        Assert.True(r.Degree == 2, $"colour degree {r.Degree}: CV {string.Join(", ", r.CvScores.Select(c => $"{c.Form}: {c.Score:F3} +- {c.StandardError:F3}"))}");
        foreach (var (c, f) in new[] { (1.0, -2.0), (1.2, -1.5), (1.4, -1.0), (1.2, -2.0) })
        {
            double truth = SyntheticStandards.Truth(c, f);
            double fit = m.Evaluate(c, f);
            var ens = m.EnsembleCoefficients.Select(e => m.Basis.Value(e, c, f)).ToArray();
            double mean = ens.Average(), sd = Math.Sqrt(ens.Sum(v => (v - mean) * (v - mean)) / (ens.Length - 1));
            Assert.True(Math.Abs(fit - truth) < 3 * sd, $"at ({c}, {f}): fit {fit}, truth {truth}, bootstrap sd {sd}");
        }
        Assert.InRange(m.SigmaInt, 0.012, 0.028); // truth 0.02 mag
        Assert.Equal(200, m.EnsembleSigmaInt.Length);
        Assert.Equal(200, r.PerStandard.Length);
        Assert.Empty(m.Domain.ExcludedColours);
        Assert.True(m.Basis is MonotoneBasis or SeparableBasis, m.Basis.Describe);
        // RMS in dex about the spectroscopic values: dominated by the 0.1 dex [Fe/H] errors plus index scatter.
        Assert.InRange(m.RmsDex, 0.08, 0.3);
    }

    [Fact]
    public void Run_LinearTruth_CrossValidationChoosesDegreeOne()
    {
        var spec = new SyntheticStandards.Spec { Stars = 150, Model = (c, f) => 0.3 + 0.6 * c + 0.25 * f };
        var r = CalibrationFitter.Run(SyntheticStandards.Make(spec, 3), SyntheticStandards.Options(bootstrap: 0));
        Assert.Equal(1, r.Degree);
        Assert.Equal(12, r.CvScores.Count); // colour degrees 1-2 x 0-2 interior knots, separable or not
        Assert.All(r.CvScores, s => Assert.True(double.IsFinite(s.Score), s.Failure));
        Assert.Contains("colour degree 1", r.DegreeReason);
    }

    [Fact]
    public void Run_InjectedBadStandards_AreRejectedWithReason()
    {
        var st = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 120 }, 5);
        int[] bad = [3, 40, 77, 101];
        foreach (int i in bad) st.Index0[i] += i % 2 == 0 ? 0.4 : -0.3; // far beyond 0.03 mag scatter
        var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 20));
        foreach (int i in bad)
        {
            var v = r.PerStandard[i];
            Assert.Equal(StandardStatus.RejectedOutlier, v.Status);
            Assert.Contains("p_outlier", v.Reason);
            Assert.True(Math.Abs(v.ResidualSigma) > 3.5);
            Assert.True(v.POutlier > 0.99, $"p_outlier {v.POutlier}");
        }
        Assert.True(r.PerStandard.Count(v => !v.Accepted) <= bad.Length + 2);
        Assert.True(r.Model.SigmaInt is > 0.01 and < 0.03, $"sigma_int {r.Model.SigmaInt}, {r.DegreeReason}; {string.Join("; ", r.CvScores.Select(c => $"{c.Form} {c.Score:F3}"))}"); // outliers do not inflate the intrinsic scatter
        // Domain from accepted standards only: no hull vertex is a rejected standard.
        var rejectedPoints = bad.Select(i => (st.Colour0[i], st.Feh[i])).ToHashSet();
        Assert.DoesNotContain(r.Model.Domain.Hull, p => rejectedPoints.Contains(p));
    }

    [Fact]
    public void Run_MissingValue_IsReportedUnusable()
    {
        var st = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 60 }, 6);
        st.Index0[7] = double.NaN;
        var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 0, degree: 1));
        Assert.Equal(StandardStatus.Unusable, r.PerStandard[7].Status);
        Assert.Contains("index0", r.PerStandard[7].Reason);
        Assert.Equal(59, r.Model.StandardsUsed + r.Model.StandardsRejected - 1);
    }

    [Fact]
    public void Run_AllOneColour_ThrowsMethodExceptionWithCounts()
    {
        var spec = new SyntheticStandards.Spec { Stars = 30, ColourMin = 1.0, ColourMax = 1.02, SigmaColour = 0.001 };
        var e = Assert.Throws<MethodException>(() => CalibrationFitter.Run(SyntheticStandards.Make(spec, 7), SyntheticStandards.Options(0)));
        Assert.Contains("all one colour", e.Message);
        Assert.Contains("30 usable standards", e.Message);
    }

    [Fact]
    public void Run_AllOneFeh_ThrowsMethodException()
    {
        var spec = new SyntheticStandards.Spec { Stars = 30, FehMin = -1.5, FehMax = -1.5, SigmaFeh = 0.0 };
        var e = Assert.Throws<MethodException>(() => CalibrationFitter.Run(SyntheticStandards.Make(spec, 8), SyntheticStandards.Options(0)));
        Assert.Contains("all one [Fe/H]", e.Message);
    }

    [Fact]
    public void Run_FewerStandardsThanNeeded_SaysHowManyAreNeeded()
    {
        var e = Assert.Throws<MethodException>(() =>
            CalibrationFitter.Run(SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 4 }, 9), SyntheticStandards.Options(0)));
        Assert.Contains("4 usable calibration standards", e.Message);
        Assert.Contains("at least 7", e.Message);
        // Enough for the simplest form but not for colour degree 3 with two knots (12 coefficients).
        var e3 = Assert.Throws<MethodException>(() =>
            CalibrationFitter.Run(SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 9 }, 9), SyntheticStandards.Options(0, degree: 3) with { Knots = 2 }));
        Assert.Contains("12 coefficients", e3.Message);
        Assert.Contains("at least 14 needed", e3.Message);
    }

    [Fact]
    public void Run_SameSeed_ByteIdenticalJsonWhateverTheThreadCount()
    {
        var st = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 80, Clusters = 3 }, 10);
        string Json(int? threads)
        {
            var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 60) with { MaxThreads = threads });
            using var ms = new MemoryStream();
            CalibrationJson.Write(r.Model, r, ms);
            return Encoding.UTF8.GetString(ms.ToArray());
        }
        string one = Json(1), all = Json(null), four = Json(4);
        Assert.Equal(one, all);
        Assert.Equal(one, four);
        Assert.NotEqual(one, Encoding.UTF8.GetString(Serialize(CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 60, seed: 12)))));
    }

    [Fact]
    public void Run_LogGCut_RejectsDwarfs()
    {
        var st0 = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 50 }, 13);
        var logg = Enumerable.Repeat(1.5, 50).ToArray();
        logg[4] = 4.5;
        var st = new CalibrationStandards
        {
            Id = st0.Id, Colour0 = st0.Colour0, Index0 = st0.Index0, VarColour = st0.VarColour, VarIndex = st0.VarIndex,
            CovIndexColour = st0.CovIndexColour, Feh = st0.Feh, FehErr = st0.FehErr, Group = st0.Group, GroupName = st0.GroupName, LogG = logg,
        };
        var r = CalibrationFitter.Run(st, SyntheticStandards.Options(0, degree: 1) with { MaxLogG = 3.5 });
        Assert.Equal(StandardStatus.RejectedLogG, r.PerStandard[4].Status);
        Assert.Contains("log g = 4.5", r.PerStandard[4].Reason);
    }

    [Fact]
    public void Validate_NegativeVariance_IsInputErrorNamingStandardAndColumn()
    {
        var st = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 20 }, 14);
        st.VarIndex[2] = -1e-4;
        var e = Assert.Throws<InputException>(() => CalibrationFitter.Run(st, SyntheticStandards.Options(0)));
        Assert.Equal("var_index", e.Column);
        Assert.Contains("star0002", e.Message);
    }

    [Fact]
    public void Run_ReportsProgressUpToOne()
    {
        var seen = new List<double>();
        var progress = new SyncProgress(v => { lock (seen) seen.Add(v); });
        CalibrationFitter.Run(SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 40 }, 15), SyntheticStandards.Options(bootstrap: 30, degree: 1), null, progress);
        Assert.Equal(1.0, seen.Max());
        Assert.All(seen, v => Assert.InRange(v, 0.0, 1.0));
    }

    private sealed class SyncProgress(Action<double> report) : IProgress<double>
    {
        public void Report(double value) => report(value);
    }

    [Fact]
    public void Run_FixedDegreeWithTooFewStandardsPerFold_StillFitsAndSaysWhy()
    {
        // 7 standards, colour degree 2 with no knot (separable: 6 parameters): enough to fit, too few for 5-fold cross-validation.
        var st = SyntheticStandards.Make(new SyntheticStandards.Spec { Stars = 7, SigmaInt = 0.005 }, 16);
        var r = CalibrationFitter.Run(st, SyntheticStandards.Options(bootstrap: 0, degree: 2) with { Knots = 0, Outliers = false });
        Assert.Equal(2, r.Degree);
        Assert.Contains("not cross-validated", r.DegreeReason);
        Assert.Equal(7, r.Model.StandardsUsed);
    }

    internal static byte[] Serialize(CalibrationResult r)
    {
        using var ms = new MemoryStream();
        CalibrationJson.Write(r.Model, r, ms);
        return ms.ToArray();
    }
}
