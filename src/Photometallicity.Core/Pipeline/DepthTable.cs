using System.Text.Json.Nodes;
using Photometallicity.Membership;
using Photometallicity.Metallicity;
using Photometallicity.Photometry;

namespace Photometallicity.Pipeline;

/// <summary>
/// How deep the [Fe/H] values reach, in one-magnitude bins of dereddened red magnitude relative to the target's distance
/// modulus (red0 - mu, from mu - 4 to mu + 4): the expected number of members (sum of p_member), the share of them with a
/// narrow-band partner, and of those the shares given a value, a one-sided limit or no value, the share of values that are
/// extrapolated beyond the standards, and the members' median 16-84% half-width (dex). Weighted by p_member. The bins a user
/// should trust are the ones where values are given and the widths are what the science needs; the validation fields
/// (`validate`) show how bias and coverage behave per bin on invented fields with known truth.
/// </summary>
public static class DepthTable
{
    public const double FirstBin = -4, LastBin = 4;

    public static JsonArray Build(IndexPhotometry phot, MetallicityResult feh, MembershipResult mem, double distanceModulus, bool[] narrowMatched)
    {
        int nb = (int)(LastBin - FirstBin);
        var members = new double[nb];
        var narrow = new double[nb];
        var value = new double[nb];
        var limit = new double[nb];
        var extrapolated = new double[nb];
        var widths = Enumerable.Range(0, nb).Select(_ => new List<(double W, double P)>()).ToArray();
        for (int i = 0; i < phot.Count; i++)
        {
            double p = mem.PMember[i], m = phot.Red0[i] - distanceModulus;
            if (!(p > 0) || !double.IsFinite(m) || m < FirstBin || m >= LastBin) continue;
            int b = (int)Math.Floor(m - FirstBin);
            members[b] += p;
            if (!narrowMatched[i]) continue;
            narrow[b] += p;
            var s = feh.Status[i];
            if (double.IsFinite(feh.Feh[i]))
            {
                value[b] += p;
                if (s == MetallicityStatus.Extrapolated) extrapolated[b] += p;
                widths[b].Add((0.5 * (feh.FehHi[i] - feh.FehLo[i]), p));
            }
            else if (s is MetallicityStatus.IndexAboveRange or MetallicityStatus.IndexBelowRange) limit[b] += p;
        }
        var rows = new JsonArray();
        for (int b = 0; b < nb; b++)
        {
            if (members[b] < 0.5) continue;
            rows.Add(new JsonObject
            {
                ["red0_minus_mu"] = new JsonArray(FirstBin + b, FirstBin + b + 1),
                ["members_expected"] = Math.Round(members[b], 1),
                ["share_narrow_detected"] = Share(narrow[b], members[b]),
                ["share_with_value"] = Share(value[b], narrow[b]),
                ["share_with_limit"] = Share(limit[b], narrow[b]),
                ["share_extrapolated"] = Share(extrapolated[b], value[b]),
                ["median_half_width_dex"] = WeightedMedian(widths[b]) is { } w && double.IsFinite(w) ? Math.Round(w, 3) : null,
            });
        }
        return rows;
    }

    private static JsonNode? Share(double part, double whole) => whole > 0 ? Math.Round(part / whole, 3) : null;

    private static double WeightedMedian(List<(double W, double P)> items)
    {
        if (items.Count == 0) return double.NaN;
        var sorted = items.Where(x => double.IsFinite(x.W)).OrderBy(x => x.W).ToArray();
        double total = sorted.Sum(x => x.P), acc = 0;
        foreach (var (w, p) in sorted) { acc += p; if (acc >= 0.5 * total) return w; }
        return double.NaN;
    }
}
