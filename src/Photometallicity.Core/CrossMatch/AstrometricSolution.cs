using Photometallicity.Units;

namespace Photometallicity.CrossMatch;

/// <summary>
/// What a cross-match needs to repeat its pairing exactly on any subset of the catalogues (a survey tile): the
/// tangent plane's centre as a unit vector, the similarity transform that maps the left frame onto the right one
/// (applied inverted to every right source), and the match radius. <see cref="Corrected"/> is false when no offset
/// was solved: the right catalogue is then used as observed and the centre is irrelevant.
/// </summary>
public sealed record AstrometricSolution(bool Corrected, double CentreX, double CentreY, double CentreZ, AstrometricTransform Transform, Angle Radius)
{
    internal TangentPlane? Plane => Corrected ? TangentPlane.FromCentre(CentreX, CentreY, CentreZ) : null;

    /// <summary>The largest distance the correction moves any source: |offset| scaled up by the rotation and scale over a field of <paramref name="fieldRadius"/>.</summary>
    public Angle LargestShift(Angle fieldRadius)
    {
        if (!Corrected) return Angle.FromRadians(0);
        var t = Transform;
        double turn = Math.Sqrt((t.A - 1) * (t.A - 1) + t.B * t.B) * Math.Tan(fieldRadius.Radians);
        return Angle.FromRadians(Math.Sqrt(t.DXi * t.DXi + t.DEta * t.DEta) + turn);
    }
}
