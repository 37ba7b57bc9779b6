using Photometallicity.Calibration;
using Photometallicity.Errors;
using Photometallicity.Numerics;
using Photometallicity.Units;

namespace Photometallicity.Tests.Calibration;

public class ClusterMemberSelectorTest
{
    /// <summary>
    /// Invented cluster field: 120 giants on a curved ridge colour = 1.0 - 0.15 (m - 17) + 0.03 (m - 17)^2 with
    /// 0.02 mag scatter within 3 arcmin, 30 foreground stars of random colour, 20 stars outside the radius.
    /// </summary>
    [Fact]
    public void Select_KeepsRidgeStarsAndRejectsForegroundAndDistantStars()
    {
        var rng = new Rng(51);
        var centre = SkyPosition.FromDegrees(150.0, 20.0);
        var ra = new List<double>(); var dec = new List<double>(); var col = new List<double>(); var mag = new List<double>();
        var truthMember = new List<bool>();
        void Add(double rArcmin, double c, double m, bool member)
        {
            double ang = 2 * Math.PI * rng.NextDouble();
            ra.Add(150.0 + rArcmin / 60.0 * Math.Cos(ang) / Math.Cos(20.0 * Math.PI / 180));
            dec.Add(20.0 + rArcmin / 60.0 * Math.Sin(ang));
            col.Add(c); mag.Add(m); truthMember.Add(member);
        }
        double Ridge(double m) => 1.0 - 0.15 * (m - 17) + 0.03 * (m - 17) * (m - 17);
        for (int i = 0; i < 120; i++) { double m = 15 + 4 * rng.NextDouble(); Add(3 * Math.Sqrt(rng.NextDouble()), Ridge(m) + 0.02 * rng.NextGaussian(), m, true); }
        for (int i = 0; i < 30; i++) { double m = 15 + 4 * rng.NextDouble(); Add(3 * Math.Sqrt(rng.NextDouble()), Ridge(m) + (rng.NextDouble() < 0.5 ? -1 : 1) * (0.15 + 0.5 * rng.NextDouble()), m, false); }
        for (int i = 0; i < 20; i++) { double m = 15 + 4 * rng.NextDouble(); Add(5 + 3 * rng.NextDouble(), Ridge(m), m, false); }

        var sel = ClusterMemberSelector.Select(ra.ToArray(), dec.ToArray(), col.ToArray(), mag.ToArray(), centre, Angle.FromArcminutes(4));
        int truePos = sel.Members.Count(i => truthMember[i]);
        Assert.True(truePos >= 110, $"{truePos} of 120 ridge stars kept");
        Assert.Equal(0, sel.Members.Count(i => !truthMember[i]));
        Assert.InRange(sel.RidgeSigma, 0.014, 0.026);
        Assert.Equal(Ridge(17.5), sel.RidgeColour(17.5), 0.01);
        Assert.All(Enumerable.Range(150, 20), i => Assert.Contains("outside the cluster radius", sel.PerStar[i].Reason));
        Assert.Contains(sel.PerStar.Skip(120).Take(30), v => v.Reason.Contains("off the red-giant ridge line"));
        Assert.InRange(sel.PerStar[0].RadiusArcmin, 0, 3.0001);
    }

    [Fact]
    public void Select_TooFewStarsInRadius_ThrowsMethodException()
    {
        var e = Assert.Throws<MethodException>(() => ClusterMemberSelector.Select([10.0, 10.0], [5.0, 5.0], [1.0, 1.1], [16.0, 17.0],
            SkyPosition.FromDegrees(10, 5), Angle.FromArcminutes(2)));
        Assert.Contains("Only 2 stars", e.Message);
    }
}
