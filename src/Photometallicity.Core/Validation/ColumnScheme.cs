namespace Photometallicity.Validation;

/// <summary>
/// The column names of one validation field's catalogues (invented layouts; the config names them, so the pipeline
/// must not depend on the demo's names).
/// </summary>
public sealed record ColumnScheme(
    string Name,
    string BroadId, string BroadRa, string BroadDec, string Blue, string BlueErr, string Red, string RedErr, string Ebv,
    string NarrowId, string NarrowRa, string NarrowDec, string Narrow, string NarrowErr,
    string StdId, string StdRa, string StdDec, string StdFeh, string StdFehErr)
{
    /// <summary>The demo's own names.</summary>
    public static readonly ColumnScheme Demo = new("demo", "src", "ra", "dec", "b480", "b480_err", "r770", "r770_err", "ebv",
        "nid", "ra", "dec", "n395", "n395_err", "star", "ra", "dec", "feh_spec", "feh_spec_err");

    public static readonly ColumnScheme Alpha = new("alpha", "objid", "RA_deg", "Dec_deg", "mag_b", "emag_b", "mag_r", "emag_r", "E_BV",
        "cid", "RAJ", "DEJ", "mag_hk", "emag_hk", "name", "RAdeg", "DEdeg", "FeH", "e_FeH");

    public static readonly ColumnScheme Beta = new("beta", "ID", "alpha", "delta", "B", "B_sig", "R", "R_sig", "reddening",
        "ID", "alpha", "delta", "HK", "HK_sig", "target", "alpha", "delta", "metallicity", "metallicity_sig");

    /// <summary>Demo column name to this scheme's, per table.</summary>
    public IReadOnlyDictionary<string, string> BroadMap => new Dictionary<string, string>
    {
        ["src"] = BroadId, ["ra"] = BroadRa, ["dec"] = BroadDec, ["b480"] = Blue, ["b480_err"] = BlueErr, ["r770"] = Red, ["r770_err"] = RedErr, ["ebv"] = Ebv,
    };

    public IReadOnlyDictionary<string, string> NarrowMap => new Dictionary<string, string>
    {
        ["nid"] = NarrowId, ["ra"] = NarrowRa, ["dec"] = NarrowDec, ["n395"] = Narrow, ["n395_err"] = NarrowErr,
    };

    public IReadOnlyDictionary<string, string> StandardsMap => new Dictionary<string, string>
    {
        ["star"] = StdId, ["ra"] = StdRa, ["dec"] = StdDec, ["feh_spec"] = StdFeh, ["feh_spec_err"] = StdFehErr,
    };
}
