using System.Runtime.CompilerServices;

namespace Photometallicity.CrossMatch;

/// <summary>
/// Standard coordinates of a set of unit vectors on a tangent plane, computed where they are read rather than stored
/// (16 bytes per source saved on a whole-field cross-match). <see cref="TangentPlane.Project"/> is a pure function of
/// its inputs, so every reading gives the same bits.
/// </summary>
internal readonly struct Projection(TangentPlane plane, UnitVectors points)
{
    public int Count => points.Count;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public (double Xi, double Eta) At(int i) => plane.Project(points.X[i], points.Y[i], points.Z[i]);
}
