using System.Text.Json;
using System.Text.Json.Nodes;
using Photometallicity.Catalogues;
using Photometallicity.CrossMatch;
using Photometallicity.Errors;
using Photometallicity.Units;

namespace Photometallicity.Tiling;

/// <summary>
/// The whole-field cross-match of a split survey without its per-row arrays: the solution every tile applies and
/// the diagnostics the merged run reports (global/crossmatch.json). Doubles are written in the shortest form that
/// reads back to the same value (System.Text.Json's default), NaN as null, so the tiles use the very same numbers.
/// </summary>
public static class CrossMatchSolutionJson
{
    public const string FileName = "crossmatch.json";

    public static void Write(CrossMatchResult m, string path)
    {
        var s = m.Solution ?? throw new ArgumentException("the cross-match carries no solution", nameof(m));
        var o = new JsonObject
        {
            ["solution"] = new JsonObject
            {
                ["corrected"] = s.Corrected,
                ["centre_unit_vector"] = new JsonArray(s.CentreX, s.CentreY, s.CentreZ),
                ["transform_a"] = s.Transform.A, ["transform_b"] = s.Transform.B,
                ["transform_dxi_rad"] = s.Transform.DXi, ["transform_deta_rad"] = s.Transform.DEta,
                ["radius_rad"] = s.Radius.Radians,
            },
            ["left_count"] = m.LeftCount, ["right_count"] = m.RightCount, ["matched"] = m.Matched, ["blends"] = m.BlendCount,
            ["lost_contention"] = m.LostContention, ["radius_reason"] = m.RadiusReason,
            ["field_centre_deg"] = m.FieldCentre is { } c ? new JsonArray(c.RaDegrees, c.DecDegrees) : null,
            ["offset_solved"] = m.OffsetSolved, ["offset_reason"] = m.OffsetReason,
            ["offset_arcsec"] = Pair(m.Offset), ["offset_error_arcsec"] = Pair(m.OffsetError), ["offset_scatter_arcsec"] = Pair(m.OffsetScatter),
            ["secure_pairs"] = m.SecurePairs, ["secure_pairs_used"] = m.SecurePairsUsed,
            ["rotation_arcsec"] = Num(m.RotationArcsec), ["scale"] = Num(m.Scale),
            ["expected_false_match_rate"] = Num(m.ExpectedFalseMatchRate), ["measured_false_match_rate"] = Num(m.MeasuredFalseMatchRate),
            ["measured_false_match_rate_error"] = Num(m.MeasuredFalseMatchRateError),
            ["iterations"] = m.Iterations, ["converged"] = m.Converged,
        };
        AtomicFile.WriteAllText(path, o.ToJsonString(new JsonSerializerOptions { WriteIndented = true }) + "\n");
    }

    /// <summary>The diagnostics and solution, with the given per-row arrays (from the tiles) filled in.</summary>
    public static CrossMatchResult Read(string path, int[] rightIndex, double[] separationArcsec, bool[] blend)
    {
        JsonObject o;
        try
        {
            o = JsonNode.Parse(File.ReadAllText(path))?.AsObject() ?? throw new InputException("empty file", file: path);
        }
        catch (Exception e) when (e is JsonException or InvalidOperationException or IOException)
        {
            throw new InputException($"cannot read the split's cross-match solution: {e.Message}", file: path);
        }
        try
        {
            var s = o["solution"]!.AsObject();
            var centre = s["centre_unit_vector"]!.AsArray();
            var solution = new AstrometricSolution((bool)s["corrected"]!, (double)centre[0]!, (double)centre[1]!, (double)centre[2]!,
                new AstrometricTransform((double)s["transform_a"]!, (double)s["transform_b"]!, (double)s["transform_dxi_rad"]!, (double)s["transform_deta_rad"]!),
                Angle.FromRadians((double)s["radius_rad"]!));
            var fc = o["field_centre_deg"]?.AsArray();
            return new CrossMatchResult
            {
                RightIndex = rightIndex, SeparationArcsec = separationArcsec, Blend = blend,
                LeftCount = (int)o["left_count"]!, RightCount = (int)o["right_count"]!, Matched = (int)o["matched"]!, BlendCount = (int)o["blends"]!,
                LostContention = (int)o["lost_contention"]!, RadiusUsed = solution.Radius, RadiusReason = (string)o["radius_reason"]!,
                FieldCentre = fc is null ? null : SkyPosition.FromDegrees((double)fc[0]!, (double)fc[1]!),
                OffsetSolved = (bool)o["offset_solved"]!, OffsetReason = (string)o["offset_reason"]!,
                Offset = ReadPair(o["offset_arcsec"]), OffsetError = ReadPair(o["offset_error_arcsec"]), OffsetScatter = ReadPair(o["offset_scatter_arcsec"]),
                SecurePairs = (int)o["secure_pairs"]!, SecurePairsUsed = (int)o["secure_pairs_used"]!,
                RotationArcsec = (double?)o["rotation_arcsec"], Scale = (double?)o["scale"],
                ExpectedFalseMatchRate = (double?)o["expected_false_match_rate"] ?? double.NaN,
                MeasuredFalseMatchRate = (double?)o["measured_false_match_rate"] ?? double.NaN,
                MeasuredFalseMatchRateError = (double?)o["measured_false_match_rate_error"] ?? double.NaN,
                Iterations = (int)o["iterations"]!, Converged = (bool)o["converged"]!,
                Solution = solution,
            };
        }
        catch (Exception e) when (e is NullReferenceException or InvalidOperationException or FormatException)
        {
            throw new InputException($"the split's cross-match solution is incomplete or malformed ({e.Message}); run 'split' again", file: path);
        }
    }

    /// <summary>The solution alone.</summary>
    public static AstrometricSolution ReadSolution(string path) => Read(path, [], [], []).Solution!;

    private static JsonNode? Num(double? v) => v is { } x && double.IsFinite(x) ? JsonValue.Create(x) : null;

    private static JsonArray Pair((double A, double B) p) => new(Num(p.A), Num(p.B));

    private static (double, double) ReadPair(JsonNode? n) =>
        n is JsonArray a ? ((double?)a[0] ?? double.NaN, (double?)a[1] ?? double.NaN) : (double.NaN, double.NaN);
}
