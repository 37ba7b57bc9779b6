using Photometallicity.Catalogues;
using Photometallicity.Configuration;

namespace Photometallicity.Pipeline;

/// <summary>
/// The input tables of a run, read once with the config's column names resolved and checked
/// (a missing column is reported with the columns that were found), plus each file's checksum. Only the columns the
/// config names are read (<see cref="ReadOptions.Columns"/>).
/// </summary>
public sealed class InputCatalogues
{
    public required Table Broadband { get; init; }
    public required Table Narrowband { get; init; }
    public required IReadOnlyList<Table> Standards { get; init; }

    /// <summary>The catalogue pair of each cluster field among the standards (config.ClusterStandards order).</summary>
    public IReadOnlyList<(Table Broadband, Table Narrowband)> ClusterFields { get; init; } = [];

    /// <summary>(path, SHA-256) for every input file, config included, in a fixed order.</summary>
    public required IReadOnlyList<(string Path, string Sha256)> Checksums { get; init; }

    public static InputCatalogues Load(PipelineConfig config)
    {
        var (broad, narrow) = ReadPair(config, config.Broadband, config.Narrowband, config.Reddening, "", mainField: true);
        var mc = config.Membership;
        foreach (var (col, key) in new[] { (mc.PmRaColumn, "pm_ra"), (mc.PmDecColumn, "pm_dec"), (mc.PmRaErrColumn, "pm_ra_err"), (mc.PmDecErrColumn, "pm_dec_err"),
                     (mc.ParallaxColumn, "parallax"), (mc.ParallaxErrColumn, "parallax_err") })
            if (col is not null) broad.Require(col, "membership." + key);

        var standards = new List<Table>();
        for (int i = 0; i < config.Standards.Count; i++)
        {
            var s = config.Standards[i];
            var numeric = new HashSet<string> { s.RaColumn, s.DecColumn, s.FehColumn, s.FehErrColumn };
            if (s.LogGColumn is not null) numeric.Add(s.LogGColumn);
            var text = new HashSet<string>();
            if (s.IdColumn is not null) text.Add(s.IdColumn);
            var t = CatalogueIO.Read(s.Path, new ReadOptions { NumericColumns = numeric, TextColumns = text, Columns = new HashSet<string>([.. numeric, .. text]) });
            string key = $"standards[{i}]";
            t.Require(s.RaColumn, key + ".ra");
            t.Require(s.DecColumn, key + ".dec");
            t.Require(s.FehColumn, key + ".feh");
            t.Require(s.FehErrColumn, key + ".feh_err");
            if (s.IdColumn is not null) t.Require(s.IdColumn, key + ".id");
            if (s.LogGColumn is not null) t.Require(s.LogGColumn, key + ".logg");
            PositionValidation.Validate(t, s.RaColumn, s.DecColumn, s.IdColumn);
            standards.Add(t);
        }

        var clusters = new List<(Table, Table)>();
        foreach (var c in config.ClusterStandards) clusters.Add(ReadPair(config, c.Broadband, c.Narrowband, c.Reddening, c.Key + ".", mainField: false));

        var sums = new List<(string, string)> { (config.ConfigPath, Pipeline.Checksums.Sha256(config.ConfigPath)) };
        sums.Add((config.Broadband.Path, Pipeline.Checksums.Sha256(config.Broadband.Path)));
        sums.Add((config.Narrowband.Path, Pipeline.Checksums.Sha256(config.Narrowband.Path)));
        foreach (var s in config.Standards) sums.Add((s.Path, Pipeline.Checksums.Sha256(s.Path)));
        foreach (var c in config.ClusterStandards)
        {
            sums.Add((c.Broadband.Path, Pipeline.Checksums.Sha256(c.Broadband.Path)));
            sums.Add((c.Narrowband.Path, Pipeline.Checksums.Sha256(c.Narrowband.Path)));
        }
        return new InputCatalogues { Broadband = broad, Narrowband = narrow, Standards = standards, ClusterFields = clusters, Checksums = sums };
    }

    /// <summary>
    /// Reads a broadband + narrow-band pair with the bands' columns (the main field's, or a cluster field's, which
    /// uses the same band columns); <paramref name="keyPrefix"/> ("" or "standards[1].") names the config keys in messages;
    /// the membership's proper-motion and parallax columns are read as numbers in the main field only.
    /// </summary>
    private static (Table Broad, Table Narrow) ReadPair(PipelineConfig config, CatalogueConfig broadCfg, CatalogueConfig narrowCfg,
        ReddeningConfig reddening, string keyPrefix, bool mainField)
    {
        var broad = ReadCatalogue(broadCfg, NumericColumns(config, CatalogueSide.Broadband, reddening, mainField));
        var narrow = ReadCatalogue(narrowCfg, NumericColumns(config, CatalogueSide.Narrowband, reddening, mainField));
        foreach (var band in new[] { config.Blue, config.Red, config.Narrow })
        {
            var t = band.From == CatalogueSide.Broadband ? broad : narrow;
            t.Require(band.MagColumn, $"bands.{band.Name}.mag");
            t.Require(band.ErrColumn, $"bands.{band.Name}.err");
        }
        if (reddening.Column is { } ec) broad.Require(ec, keyPrefix + "reddening.column");
        if (reddening.ErrorColumn is { } eec) broad.Require(eec, keyPrefix + "reddening.error_column");
        if (broadCfg.FlagColumn is { } fc) broad.Require(fc, keyPrefix + "broadband.flag");
        return (broad, narrow);
    }

    private static Table ReadCatalogue(CatalogueConfig c, HashSet<string> numeric)
    {
        numeric.Add(c.RaColumn);
        numeric.Add(c.DecColumn);
        var text = new HashSet<string>();
        if (c.IdColumn is not null) text.Add(c.IdColumn);
        // Only the columns the config names are kept: a wide catalogue's other columns are skipped while it is read.
        // Numbers stay doubles. RA/Dec must: a float's 24-bit significand resolves 360 deg / 2^24 ~ 2e-5 deg = 0.08 arcsec
        // at RA near 360, comparable to match radii and astrometric offsets. Magnitudes and errors would fit a float
        // (1e-6 mag at 20 mag), but a value read as 20.3196 would become 20.319599151611328 in every later double, so every
        // derived output would change in its last digits; at 4 bytes a row per column that is not worth it.
        var keep = new HashSet<string>(numeric);
        keep.UnionWith(text);
        if (c.FlagColumn is not null) keep.Add(c.FlagColumn);
        var t = CatalogueIO.Read(c.Path, new ReadOptions
        {
            MissingSentinels = c.MissingValues, Extension = c.Extension, NumericColumns = numeric, TextColumns = text, Columns = keep,
            CompactText = true, // ids as UTF-8 bytes (Utf8Column): ~13 bytes a row instead of ~48 as strings
        });
        t.Require(c.RaColumn);
        t.Require(c.DecColumn);
        if (c.IdColumn is not null) t.Require(c.IdColumn);
        PositionValidation.Validate(t, c.RaColumn, c.DecColumn, c.IdColumn);
        return t;
    }

    private static HashSet<string> NumericColumns(PipelineConfig config, CatalogueSide side, ReddeningConfig reddening, bool mainField)
    {
        var set = new HashSet<string>();
        foreach (var b in new[] { config.Blue, config.Red, config.Narrow })
            if (b.From == side) { set.Add(b.MagColumn); set.Add(b.ErrColumn); }
        if (side == CatalogueSide.Broadband)
        {
            if (mainField)
            {
                var m = config.Membership;
                foreach (var c in new[] { m.PmRaColumn, m.PmDecColumn, m.PmRaErrColumn, m.PmDecErrColumn, m.ParallaxColumn, m.ParallaxErrColumn })
                    if (c is not null) set.Add(c);
            }
            if (reddening.Column is { } e) set.Add(e);
            if (reddening.ErrorColumn is { } ee) set.Add(ee);
        }
        return set;
    }
}
