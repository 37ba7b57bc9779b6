using Photometallicity.Calibration;
using Photometallicity.Errors;
using Photometallicity.Units;

namespace Photometallicity.Configuration;

// The "kind": "cluster" entries of the "standards" list: a cluster field whose red-giant members share one
// literature [Fe/H]. Centre, [Fe/H] and E(B-V) may be given, or are looked up by name in the reference cluster
// table (calibration/globular_clusters.csv: Harris 1996, AJ 112, 1487, 2010 edition; or the entry's "cluster_table"),
// by name or alias with case and spaces ignored.
public static partial class ConfigLoader
{
    /// <summary>
    /// [Fe/H] error (dex) given to a cluster whose [Fe/H] comes from the reference table, which lists none:
    /// 0.1 dex, the size usually quoted for globular-cluster [Fe/H] on one scale (common practice; recalled from memory).
    /// </summary>
    public const double DefaultClusterFehErr = 0.10;

    private static ClusterStandardConfig ClusterStandard(ConfigNode s, string dir)
    {
        var nameNode = s.Required("name");
        string name = nameNode.AsString();
        var broad = Catalogue(s.Required("broadband"), dir);
        var narrow = Catalogue(s.Required("narrowband"), dir);
        double radius = s.Required("radius_arcmin").AsNumber(0.05, 120); // arcmin; no default: it depends on the cluster and the field

        SkyPosition? centre = null;
        if (s.Optional("centre") is { } cn)
        {
            cn.RequireObject();
            double ra = cn.Required("ra").AsNumber(0, 360);
            if (ra >= 360) throw cn.Required("ra").Error("RA must be below 360 deg");
            centre = SkyPosition.FromDegrees(ra, cn.Required("dec").AsNumber(-90, 90));
            cn.RejectUnknown();
        }
        var fehNode = s.Optional("feh");
        var fehErrNode = s.Optional("feh_err");
        double? feh = fehNode?.AsNumber(-5, 1);
        double? fehErr = fehErrNode?.AsNumber(0, 2);
        if (feh is not null && fehErr is null)
            throw s.Error("\"feh\" is given without \"feh_err\"; give the literature [Fe/H] error (dex) as well");
        var redNode = s.Optional("reddening");
        ReddeningConfig? reddening = redNode is null ? null : Reddening(redNode);
        var tableNode = s.Optional("cluster_table");
        string? tablePath = tableNode is null ? null : ExistingFile(tableNode, dir);

        int ridgeDegree = s.Optional("ridge_degree")?.AsInt(1, 3) ?? 2;        // default 2 (ClusterSelectionOptions)
        double keepSigma = s.Optional("keep_sigma")?.AsNumber(1, 10) ?? 2.5;  // default 2.5 robust sigmas (ClusterSelectionOptions)
        double? bright = null, faint = null;
        if (s.Optional("blue0_range") is { } br)
        {
            var v = br.Items().Select(i => i.AsNumber(-10, 40)).ToArray();
            if (v.Length != 2 || !(v[0] < v[1])) throw br.Error("expected [bright, faint] dereddened blue magnitudes with bright < faint (mag)");
            bright = v[0]; faint = v[1];
        }
        s.RejectUnknown();

        string source = "config";
        if (centre is null || feh is null || reddening is null)
        {
            tablePath ??= GlobularClusterCatalogue.DefaultPath()
                ?? throw s.Error($"cluster '{name}': the reference cluster table (calibration/globular_clusters.csv) was not found; give \"centre\", \"feh\", \"feh_err\" and \"reddening\", or \"cluster_table\"");
            var known = GlobularClusterCatalogue.Find(GlobularClusterCatalogue.Load(tablePath), name)
                ?? throw nameNode.Error($"cluster '{name}' is not in the cluster table {tablePath}; give \"centre\", \"feh\", \"feh_err\" and \"reddening\" yourself");
            var taken = new List<string>();
            if (centre is null) { centre = known.Centre; taken.Add("centre"); }
            if (feh is null) { feh = known.Feh; fehErr ??= DefaultClusterFehErr; taken.Add("[Fe/H]"); }
            if (reddening is null)
            {
                if (double.IsNaN(known.Ebv))
                    throw nameNode.Error($"cluster '{name}' ({known.Name}) has no E(B-V) in the cluster table {tablePath}; give \"reddening\" yourself");
                reddening = new ReddeningConfig(null, known.Ebv, null, null); taken.Add("E(B-V)");
            }
            source = $"{string.Join(", ", taken)} from {System.IO.Path.GetFileName(tablePath)} ({known.Name}{(known.Note.Length > 0 ? "; " + known.Note : "")})";
        }
        return new ClusterStandardConfig(s.Path, name, broad, narrow, centre.Value, radius, feh.Value, fehErr!.Value, reddening,
            ridgeDegree, keepSigma, bright, faint, source);
    }
}
