using Photometallicity.CrossMatch;
using Photometallicity.Units;

namespace Photometallicity.Tests.CrossMatch;

/// <summary>
/// Recovery of an injected astrometric offset (and rotation and scale). Reference: the transform used to make
/// the invented field (SyntheticField, built with the trigonometric TAN projection of Calabretta &amp; Greisen 2002).
/// Tolerance: 4 standard errors of the solution, or 2 mas, whichever is larger.
/// </summary>
public class OffsetRecoveryTest
{
    private static void AssertOffset(CrossMatchResult r, double dx, double dy)
    {
        Assert.True(r.OffsetSolved, r.OffsetReason);
        double tx = Math.Max(4 * r.OffsetError.DRaCosDecArcsec, 0.002), ty = Math.Max(4 * r.OffsetError.DDecArcsec, 0.002);
        Assert.True(Math.Abs(r.Offset.DRaCosDecArcsec - dx) < tx, $"dRA cos Dec {r.Offset.DRaCosDecArcsec} vs injected {dx} (+/- {tx}); {r.OffsetReason}");
        Assert.True(Math.Abs(r.Offset.DDecArcsec - dy) < ty, $"dDec {r.Offset.DDecArcsec} vs injected {dy} (+/- {ty}); {r.OffsetReason}");
    }

    private static double CorrectFraction(SyntheticField f, CrossMatchResult r)
    {
        int truePairs = 0, correct = 0;
        for (int i = 0; i < f.TruePartner.Length; i++)
        {
            if (f.TruePartner[i] < 0) continue;
            truePairs++;
            if (r.RightIndex[i] == f.TruePartner[i]) correct++;
        }
        return (double)correct / truePairs;
    }

    [Fact]
    public void Run_RecoversOneArcsecOffsetWithOneArcsecRadius()
    {
        // |offset| = 1.0 arcsec, radius 1.0 arcsec: uncorrected, half the true pairs would fall outside.
        var f = SyntheticField.Make(11, 20_000, 150.0, 2.0, 0.25, 0.8, -0.6, 0.12, 0.7, 4_000);
        var r = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec, new CrossMatchOptions { Radius = Angle.FromArcseconds(1.0) });
        AssertOffset(r, 0.8, -0.6);
        Assert.True(r.Converged);
        Assert.InRange(r.Iterations, 1, 10);
        Assert.True(CorrectFraction(f, r) > 0.99, $"correct fraction {CorrectFraction(f, r)}");
        Assert.True(r.SecurePairs > 10_000);
    }

    [Fact]
    public void Run_WithoutOffsetSolutionLosesTruePairs()
    {
        // The same field matched as given: the 1 arcsec offset pushes most true pairs out of a 1 arcsec radius.
        var f = SyntheticField.Make(11, 20_000, 150.0, 2.0, 0.25, 0.8, -0.6, 0.12, 0.7, 4_000);
        var r = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec, new CrossMatchOptions { Radius = Angle.FromArcseconds(1.0), SolveOffset = false });
        Assert.False(r.OffsetSolved);
        Assert.True(CorrectFraction(f, r) < 0.8, $"correct fraction {CorrectFraction(f, r)}");
    }

    [Fact]
    public void Run_RecoversOffsetAcrossRaZero()
    {
        var f = SyntheticField.Make(12, 15_000, 0.0, -35.0, 0.2, -0.45, 0.3, 0.1, 0.8, 2_000);
        Assert.Contains(f.LeftRa, ra => ra > 359.9);
        Assert.Contains(f.LeftRa, ra => ra < 0.1);
        var r = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec, new CrossMatchOptions { Radius = Angle.FromArcseconds(1.0) });
        AssertOffset(r, -0.45, 0.3);
        Assert.True(CorrectFraction(f, r) > 0.99);
    }

    [Fact]
    public void Run_RecoversOffsetMagnitudeAtThePole()
    {
        // Centred 0.02 deg from the north pole, so RA spans all 360 deg. East/north are ill-defined there, so the
        // check is the frame-independent size of the offset and the correctness of the pairs.
        var f = SyntheticField.Make(13, 10_000, 45.0, 89.98, 0.05, 0.6, 0.8, 0.1, 0.8, 1_000);
        Assert.True(f.LeftRa.Max() - f.LeftRa.Min() > 300);
        var r = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec, new CrossMatchOptions { Radius = Angle.FromArcseconds(1.0) });
        Assert.True(r.OffsetSolved, r.OffsetReason);
        double mag = Math.Sqrt(r.Offset.DRaCosDecArcsec * r.Offset.DRaCosDecArcsec + r.Offset.DDecArcsec * r.Offset.DDecArcsec);
        Assert.True(Math.Abs(mag - 1.0) < 0.005, $"|offset| {mag}");
        Assert.True(CorrectFraction(f, r) > 0.99, $"correct fraction {CorrectFraction(f, r)}");
    }

    [Fact]
    public void Run_RecoversRotationAndScale()
    {
        // 40 arcsec rotation and scale 1.0003 displace the field edge (0.3 deg) by about 0.2 and 0.3 arcsec.
        var f = SyntheticField.Make(14, 30_000, 210.0, 40.0, 0.3, 0.3, 0.2, 0.08, 0.8, 3_000, rotationArcsec: 40.0, scale: 1.0003);
        var r = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec,
            new CrossMatchOptions { Radius = Angle.FromArcseconds(0.8), SolveRotationScale = true });
        AssertOffset(r, 0.3, 0.2);
        Assert.NotNull(r.RotationArcsec);
        Assert.True(Math.Abs(r.RotationArcsec!.Value - 40.0) < 1.0, $"rotation {r.RotationArcsec} arcsec");
        Assert.True(Math.Abs(r.Scale!.Value - 1.0003) < 5e-6, $"scale {r.Scale}");
    }

    [Fact]
    public void Run_SameResultTwice()
    {
        var f = SyntheticField.Make(15, 10_000, 80.0, -10.0, 0.2, 0.5, 0.5, 0.15, 0.7, 3_000);
        var o = new CrossMatchOptions { Radius = Angle.FromArcseconds(1.0) };
        var a = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec, o);
        var b = CrossMatcher.Run(f.LeftRa, f.LeftDec, f.RightRa, f.RightDec, o);
        Assert.Equal(a.RightIndex, b.RightIndex);
        Assert.Equal(a.SeparationArcsec, b.SeparationArcsec);
        Assert.Equal(a.Offset, b.Offset);
        Assert.Equal(a.MeasuredFalseMatchRate, b.MeasuredFalseMatchRate);
    }
}
