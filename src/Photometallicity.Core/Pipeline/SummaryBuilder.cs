using System.Text.Json;
using System.Text.Json.Nodes;
using Photometallicity.Membership;

namespace Photometallicity.Pipeline;

/// <summary>
/// Builds summary.json: the key numbers of every stage with their uncertainties, warnings and provenance
/// (version, seeds, resolved config, input checksums, timings). Keys keep a fixed order; non-finite numbers are null.
/// Sections of stages the run did not reach are left out.
/// </summary>
public static class SummaryBuilder
{
    private static readonly JsonSerializerOptions ResolvedConfigOptions = new() { NumberHandling = System.Text.Json.Serialization.JsonNumberHandling.AllowNamedFloatingPointLiterals };

    public static JsonObject Build(PipelineResult r)
    {
        var c = r.Config;
        string dir = Path.GetDirectoryName(c.ConfigPath)!;
        string Rel(string p) => Path.GetRelativePath(dir, p);
        var summary = new JsonObject
        {
            ["tool"] = new JsonObject { ["name"] = "photometallicity", ["version"] = ToolVersion.Current },
            ["inputs"] = new JsonArray(r.Inputs.Checksums.Select(x => (JsonNode)new JsonObject { ["path"] = Rel(x.Path), ["sha256"] = x.Sha256 }).ToArray()),
            ["rows"] = new JsonObject
            {
                ["broadband"] = r.Inputs.Broadband.RowCount,
                ["narrowband"] = r.Inputs.Narrowband.RowCount,
                ["standards"] = r.Inputs.Standards.Sum(t => t.RowCount),
            },
            ["crossmatch"] = CrossMatch(r),
            ["photometry"] = Photometry(r),
            ["calibration"] = Calibration(r, Rel),
        };
        if (r.Dwarf is { } dw)
            summary["calibration_dwarf"] = new JsonObject
            {
                ["standards"] = dw.Standards,
                ["standards_used"] = dw.Calibration.Model.StandardsUsed,
                ["model"] = dw.Calibration.Model.Basis.Describe,
                ["rms_dex"] = N(dw.Calibration.Model.RmsDex),
                ["sigma_int_mag"] = N(dw.Calibration.Model.SigmaInt),
            };
        if (r.Metallicity is { } met)
            summary["metallicity"] = new JsonObject(met.Counts.OrderBy(kv => (int)kv.Key).Select(kv => new KeyValuePair<string, JsonNode?>(kv.Key.ToString(), kv.Value)));
        if (r.Membership is { } mem)
        {
            summary["members"] = Members(mem, c.Membership.MagnitudeBand);
            double cal = r.MdfCalibrationErrorDex, calSpread = r.MdfSpreadCalibrationErrorDex;
            summary["mdf"] = Mdf(mem.Mdf, cal, calSpread);
            if (r.Metallicity is { } fehResult)
                summary["depth"] = DepthTable.Build(r.Photometry.Index, fehResult, mem, c.Target.DistanceModulus, r.Match.RightIndex.Select(k => k >= 0).ToArray());
            summary["mdf_modes"] = new JsonObject
            {
                ["configured"] = c.Membership.UseMetallicity ? "with_metallicity_term" : "without_metallicity_term",
                ["with_metallicity_term"] = Mdf(mem.MdfWithMetallicityTerm, cal, calSpread),
                ["without_metallicity_term"] = Mdf(mem.MdfWithoutMetallicityTerm, cal, calSpread),
            };
        }
        if (r.Forecast is { } fc && r.ForecastRequest is { } fr) summary["forecast"] = ForecastStep.Summary(fc, fr);
        summary["warnings"] = new JsonArray(r.Warnings.Select(w => (JsonNode)JsonValue.Create(w)!).ToArray());
        summary["provenance"] = new JsonObject
        {
            ["version"] = ToolVersion.Current,
            ["seed"] = c.Seed,
            ["seeds"] = new JsonObject { ["calibration_bootstrap"] = c.Calibration.Seed, ["membership"] = Numerics.Seeds.Derive(c.Seed, "membership") },
            ["config"] = Rel(c.ConfigPath),
            ["scope"] = r.Scope.StopAfter.ToString().ToLowerInvariant(),
            ["resolved_config"] = JsonSerializer.SerializeToNode(c, ResolvedConfigOptions),
            ["timings_s"] = new JsonObject(r.Timings.Select(t => new KeyValuePair<string, JsonNode?>(t.Stage, t.Seconds))),
            ["peak_memory_mib"] = new JsonObject(r.PeakMemoryMiB.Select(t => new KeyValuePair<string, JsonNode?>(t.Stage, t.MiB))),
        };
        return summary;
    }

    private static JsonObject CrossMatch(PipelineResult r)
    {
        var m = r.Match;
        return new JsonObject
        {
            ["matched"] = m.Matched,
            ["radius_arcsec"] = N(m.RadiusUsed.Arcseconds),
            ["radius_reason"] = m.RadiusReason,
            ["offset_arcsec"] = new JsonArray(N(m.Offset.DRaCosDecArcsec), N(m.Offset.DDecArcsec)),
            ["offset_err_arcsec"] = new JsonArray(N(m.OffsetError.DRaCosDecArcsec), N(m.OffsetError.DDecArcsec)),
            ["offset_solved"] = m.OffsetSolved,
            ["offset_note"] = m.OffsetReason,
            ["rotation_arcsec"] = m.RotationArcsec is { } rot ? N(rot) : null,
            ["scale"] = m.Scale is { } sc ? N(sc) : null,
            ["secure_pairs"] = m.SecurePairsUsed,
            ["possible_blends"] = m.BlendCount,
            ["false_match_rate_expected"] = N(m.ExpectedFalseMatchRate),
            ["false_match_rate_measured"] = N(m.MeasuredFalseMatchRate),
            ["false_match_rate_measured_err"] = N(m.MeasuredFalseMatchRateError),
            ["iterations"] = m.Iterations,
            ["converged"] = m.Converged,
        };
    }

    private static JsonObject Photometry(PipelineResult r) => new()
    {
        ["extinction_a_over_ebv"] = new JsonObject
        {
            ["blue"] = N(r.Photometry.ExtinctionCoefficients.Blue),
            ["red"] = N(r.Photometry.ExtinctionCoefficients.Red),
            ["narrow"] = N(r.Photometry.ExtinctionCoefficients.Narrow),
        },
        ["usable_for_index"] = r.Photometry.Result.Diagnostics.Usable,
        ["usable_colour"] = r.Photometry.Result.Diagnostics.UsableColour,
        ["error_models"] = new JsonArray(r.Photometry.ErrorModels.Select(e => (JsonNode)new JsonObject
        {
            ["band"] = e.Band, ["depth_5sigma_mag"] = N(e.Depth5Sigma), ["floor_mag"] = N(e.Floor),
        }).ToArray()),
        ["narrow_complete_to_blue0_mag"] = N(r.Completeness?.CompleteToMag ?? double.NaN),
    };

    private static JsonObject Calibration(PipelineResult r, Func<string, string> rel)
    {
        var model = r.Model;
        var cal = r.Calibration;
        return new JsonObject
        {
            ["source"] = r.Scope.CalibrationPath is { } cp ? rel(cp) : "fitted in this run",
            ["rms_dex"] = N(model.RmsDex),
            ["rms_index_mag"] = N(model.RmsIndex),
            ["cv_rms_dex"] = cal is null ? null : N(cal.CvRmsDex),
            ["sigma_int_mag"] = N(model.SigmaInt),
            ["model"] = model.Basis.Describe,
            ["model_reason"] = cal?.DegreeReason,
            ["outlier_fraction"] = N(model.OutlierFraction),
            ["extrapolation"] = model.Extrapolation is { } x ? new JsonObject
            {
                ["support_colour"] = new JsonArray(N(x.ColourLo), N(x.ColourHi)),
                ["support_feh"] = new JsonArray(N(x.FehLo), N(x.FehHi)),
                ["kappa_colour_mag_per_mag"] = N(x.KappaColour),
                ["kappa_colour2_mag_per_mag2"] = N(x.KappaColour2),
                ["kappa_feh_ln_sensitivity"] = N(x.KappaFeh),
                ["domain"] = r.Config.Metallicity.StrictDomain ? "hull" : "extrapolate",
            } : null,
            ["standards_total"] = r.Standards?.Total,
            ["standards_used"] = model.StandardsUsed,
            ["standards_rejected"] = model.StandardsRejected,
            ["standards_excluded_before_fit"] = r.Standards?.Excluded.Count,
            ["bootstrap"] = model.EnsembleCoefficients.Length,
            ["colour_range"] = new JsonArray(N(model.Domain.ColourMin), N(model.Domain.ColourMax)),
            ["feh_range"] = new JsonArray(N(model.Domain.FehMin), N(model.Domain.FehMax)),
            ["clusters"] = r.Standards is { Clusters.Count: > 0 } sp ? new JsonArray(sp.Clusters.Select(c => (JsonNode)new JsonObject
            {
                ["name"] = c.Name, ["feh"] = c.Feh, ["feh_err"] = c.FehErr, ["rows"] = c.Rows, ["members"] = c.Members, ["entered"] = c.Entered,
                ["off_ridge"] = c.OffRidge, ["outside_radius_or_no_colour"] = c.Rows - c.InsideRadius, ["members_without_index"] = c.MembersWithoutIndex,
                ["ridge_sigma_mag"] = N(c.RidgeSigmaMag), ["source"] = c.Source,
            }).ToArray()) : null,
            ["rejected"] = cal is null ? null : new JsonArray(cal.Rejected.Select(v => (JsonNode)new JsonObject { ["id"] = v.Id, ["reason"] = v.Reason }).ToArray()),
        };
    }

    private static JsonObject Members(MembershipResult mem, string magnitudeBand)
    {
        var s = mem.Structure;
        return new JsonObject
        {
            ["expected"] = N(mem.ExpectedMembers),
            ["significant"] = mem.Significant,
            ["no_target_p_value"] = N(mem.NoTargetPValue),
            ["centre_ra_deg"] = N(s.Centre.RaDegrees),
            ["centre_dec_deg"] = N(s.Centre.DecDegrees),
            ["centre_err_arcmin"] = new JsonArray(N(s.CentreRaCosDecErrArcmin), N(s.CentreDecErrArcmin)),
            ["half_light_arcmin"] = N(s.HalfLightArcmin),
            ["half_light_err_arcmin"] = N(s.HalfLightErrArcmin),
            ["ellipticity"] = N(s.Ellipticity),
            ["ellipticity_err"] = N(s.EllipticityErr),
            ["position_angle_deg"] = N(s.PositionAngleDeg),
            ["position_angle_err_deg"] = N(s.PositionAngleErrDeg),
            ["profile"] = s.Profile.ToString().ToLowerInvariant(),
            ["footprint_area_arcmin2"] = N(mem.FootprintAreaArcmin2),
            ["magnitude_band"] = magnitudeBand,
            ["ridge_mag"] = new JsonArray(mem.RidgeMag.Select(v => N(v)).ToArray()),
            ["ridge_colour"] = new JsonArray(mem.RidgeColour.Select(v => N(v)).ToArray()),
            ["ridge_width_mag"] = N(mem.RidgeWidth),
            ["iterations"] = mem.Iterations,
            ["converged"] = mem.Converged,
        };
    }

    /// <summary>
    /// An MDF fit; mean_err and sigma_err combine in quadrature the statistical error (likelihood curvature) and the
    /// calibration's common error (both also given apart).
    /// </summary>
    public static JsonNode? Mdf(MdfFit? f, double calibrationErr, double spreadCalibrationErr = double.NaN) => f is null ? null : new JsonObject
    {
        ["mean"] = N(f.Mean),
        ["mean_err"] = N(double.IsFinite(calibrationErr) ? Math.Sqrt(f.MeanErr * f.MeanErr + calibrationErr * calibrationErr) : f.MeanErr),
        ["mean_err_statistical"] = N(f.MeanErr),
        ["mean_err_calibration"] = N(calibrationErr),
        ["sigma"] = N(f.Sigma),
        ["sigma_err"] = N(double.IsFinite(spreadCalibrationErr) ? Math.Sqrt(f.SigmaErr * f.SigmaErr + spreadCalibrationErr * spreadCalibrationErr) : f.SigmaErr),
        ["sigma_err_statistical"] = N(f.SigmaErr),
        ["sigma_err_calibration"] = N(spreadCalibrationErr),
        ["weight_sum"] = N(f.WeightSum),
        ["stars"] = f.StarCount,
        ["sigma_at_floor"] = f.SigmaAtFloor,
        ["converged"] = f.Converged,
    };

    public static JsonNode? N(double v) => double.IsFinite(v) ? JsonValue.Create(v) : null;
}
