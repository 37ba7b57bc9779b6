using Photometallicity.Catalogues;

namespace Photometallicity.Pipeline;

/// <summary>Builds the stars table of a run (stars.csv / .fits / .parquet) with units and descriptions.</summary>
public static class StarsTable
{
    public static Table Build(StarRows r)
    {
        var t = new Table(r.Count, "stars");
        t.Add(Text(r.Id, "id", "broadband source id"));
        t.Add(new Column<double>("ra", r.Ra, unit: "deg", description: "right ascension (ICRS), broadband"));
        t.Add(new Column<double>("dec", r.Dec, unit: "deg", description: "declination (ICRS), broadband"));
        t.Add(Text(r.NarrowId, "narrow_id", "id of the narrow-band partner"));
        t.Add(new Column<double>("match_sep_arcsec", r.MatchSepArcsec, unit: "arcsec", description: "separation to the narrow-band partner after the offset correction"));
        t.Add(new Column<int>("match_flag", r.MatchFlag, description: "0 no partner, 1 matched, 2 matched with a second candidate inside the radius (possible blend)"));
        t.Add(new Column<double>("blue0", r.Blue0, unit: "mag", description: "dereddened blue magnitude"));
        t.Add(new Column<double>("red0", r.Red0, unit: "mag", description: "dereddened red magnitude"));
        t.Add(new Column<double>("narrow0", r.Narrow0, unit: "mag", description: "dereddened narrow-band magnitude"));
        t.Add(new Column<double>("colour0", r.Colour0, unit: "mag", description: "C0 = blue0 - red0"));
        t.Add(new Column<double>("colour0_err", r.Colour0Err, unit: "mag", description: "1-sigma error of C0"));
        t.Add(new Column<double>("index0", r.Index0, unit: "mag", description: "X0 = (narrow0 - blue0) - k C0"));
        t.Add(new Column<double>("index0_err", r.Index0Err, unit: "mag", description: "1-sigma error of X0"));
        t.Add(new Column<double>("cov_index_colour", r.CovIndexColour, unit: "mag2", description: "Cov(X0, C0)"));
        t.Add(new Column<double>("feh", r.Feh, unit: "dex", description: "[Fe/H] posterior median"));
        t.Add(new Column<double>("feh_lo", r.FehLo, unit: "dex", description: "16th percentile of the [Fe/H] posterior (or an upper limit, see status)"));
        t.Add(new Column<double>("feh_hi", r.FehHi, unit: "dex", description: "84th percentile of the [Fe/H] posterior (or a lower limit, see status)"));
        if (r.FehDwarf is { } fd && r.FehDwarfLo is { } fdl && r.FehDwarfHi is { } fdh)
        {
            t.Add(new Column<double>("feh_dwarf", fd, unit: "dex", description: "[Fe/H] posterior median under the dwarf calibration"));
            t.Add(new Column<double>("feh_dwarf_lo", fdl, unit: "dex", description: "16th percentile under the dwarf calibration"));
            t.Add(new Column<double>("feh_dwarf_hi", fdh, unit: "dex", description: "84th percentile under the dwarf calibration"));
        }
        t.Add(new Column<double>("p_member", r.PMember, description: "probability of belonging to the target"));
        t.Add(new Column<string>("status", r.Status, description: "status code (see README)"));
        return t;
    }

    /// <summary>A text column of the star rows under its output name, without copying its values.</summary>
    private static Column Text(Column c, string name, string description)
    {
        var t = c.Rename(name);
        t.Unit = null;
        t.Description = description;
        return t;
    }
}
