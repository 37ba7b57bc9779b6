using Photometallicity.Units;

namespace Photometallicity.Tests.Units;

public class AngleTest
{
    [Fact]
    public void FromArcseconds_RoundTripsThroughDegrees()
    {
        var a = Angle.FromArcseconds(3600.0);
        Assert.Equal(1.0, a.Degrees, 12);
        Assert.Equal(Math.PI / 180.0, a.Radians, 15);
    }

    [Fact]
    public void SkyPosition_WrapsRaAndRejectsBadDec()
    {
        Assert.Equal(10.0, SkyPosition.FromDegrees(370.0, 0).RaDegrees, 12);
        Assert.Equal(350.0, SkyPosition.FromDegrees(-10.0, 0).RaDegrees, 12);
        Assert.Throws<ArgumentOutOfRangeException>(() => SkyPosition.FromDegrees(0, 90.5));
        Assert.Throws<ArgumentException>(() => SkyPosition.FromDegrees(double.NaN, 0));
    }
}
