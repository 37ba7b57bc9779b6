using Photometallicity.Catalogues;
using Photometallicity.Configuration;

namespace Photometallicity.Pipeline;

/// <summary>
/// The input tables of a run, read once with the config's column names resolved and checked
/// (a missing column is reported with the columns that were found), plus each file's checksum.
/// </summary>
public sealed class InputCatalogues
{
    public required Table Broadband { get; init; }
    public required Table Narrowband { get; init; }
    public required IReadOnlyList<Table> Standards { get; init; }

    /// <summary>(path, SHA-256) for every input file, config included, in a fixed order.</summary>
    public required IReadOnlyList<(string Path, string Sha256)> Checksums { get; init; }

    public static InputCatalogues Load(PipelineConfig config)
    {
        var broad = ReadCatalogue(config.Broadband, NumericColumns(config, CatalogueSide.Broadband));
        var narrow = ReadCatalogue(config.Narrowband, NumericColumns(config, CatalogueSide.Narrowband));
        foreach (var band in new[] { config.Blue, config.Red, config.Narrow })
        {
            var t = band.From == CatalogueSide.Broadband ? broad : narrow;
            t.Require(band.MagColumn, $"bands.{band.Name}.mag");
            t.Require(band.ErrColumn, $"bands.{band.Name}.err");
        }
        if (config.Reddening.Column is { } ec) broad.Require(ec, "reddening.column");
        if (config.Reddening.ErrorColumn is { } eec) broad.Require(eec, "reddening.error_column");
        if (config.Broadband.FlagColumn is { } fc) broad.Require(fc, "broadband.flag");
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
            var t = CatalogueIO.Read(s.Path, new ReadOptions { NumericColumns = numeric, TextColumns = text });
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

        var sums = new List<(string, string)> { (config.ConfigPath, Pipeline.Checksums.Sha256(config.ConfigPath)) };
        sums.Add((config.Broadband.Path, Pipeline.Checksums.Sha256(config.Broadband.Path)));
        sums.Add((config.Narrowband.Path, Pipeline.Checksums.Sha256(config.Narrowband.Path)));
        foreach (var s in config.Standards) sums.Add((s.Path, Pipeline.Checksums.Sha256(s.Path)));
        return new InputCatalogues { Broadband = broad, Narrowband = narrow, Standards = standards, Checksums = sums };
    }

    private static Table ReadCatalogue(CatalogueConfig c, HashSet<string> numeric)
    {
        numeric.Add(c.RaColumn);
        numeric.Add(c.DecColumn);
        var text = new HashSet<string>();
        if (c.IdColumn is not null) text.Add(c.IdColumn);
        var t = CatalogueIO.Read(c.Path, new ReadOptions { MissingSentinels = c.MissingValues, Extension = c.Extension, NumericColumns = numeric, TextColumns = text });
        t.Require(c.RaColumn);
        t.Require(c.DecColumn);
        if (c.IdColumn is not null) t.Require(c.IdColumn);
        PositionValidation.Validate(t, c.RaColumn, c.DecColumn, c.IdColumn);
        return t;
    }

    private static HashSet<string> NumericColumns(PipelineConfig config, CatalogueSide side)
    {
        var set = new HashSet<string>();
        foreach (var b in new[] { config.Blue, config.Red, config.Narrow })
            if (b.From == side) { set.Add(b.MagColumn); set.Add(b.ErrColumn); }
        if (side == CatalogueSide.Broadband)
        {
            var m = config.Membership;
            foreach (var c in new[] { m.PmRaColumn, m.PmDecColumn, m.PmRaErrColumn, m.PmDecErrColumn, m.ParallaxColumn, m.ParallaxErrColumn })
                if (c is not null) set.Add(c);
            if (config.Reddening.Column is { } e) set.Add(e);
            if (config.Reddening.ErrorColumn is { } ee) set.Add(ee);
        }
        return set;
    }
}
