using System.CommandLine;
using Photometallicity.Catalogues;
using Photometallicity.Errors;
using Photometallicity.Healpix;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'healpix' verb: the nested HEALPix pixel of every row of a table (the index survey tiling uses).</summary>
internal static class HealpixCommand
{
    public static Command Create(CliContext ctx)
    {
        var input = new Argument<string>("TABLE") { Description = $"Input table ({TableFormats.Known})." };
        var order = new Option<int>("--order") { Description = "HEALPix order k (Nside = 2^k), 0 to 29.", Required = true };
        var ra = new Option<string>("--ra") { Description = "Column with right ascension in degrees (ICRS).", DefaultValueFactory = _ => "ra" };
        var dec = new Option<string>("--dec") { Description = "Column with declination in degrees (ICRS).", DefaultValueFactory = _ => "dec" };
        var output = new Option<string>("--out") { Description = "Output table: the input's columns plus 'healpix_nested' (int64).", Required = true };
        var cmd = new Command("healpix", "Add the nested-scheme HEALPix pixel (Gorski et al. 2005) of every row's position, at a chosen order.") { input, order, ra, dec, output };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            int k = pr.GetValue(order);
            if (k < 0 || k > 29) throw new InputException($"--order {k} is outside the allowed range [0, 29]");
            string raCol = pr.GetValue(ra)!, decCol = pr.GetValue(dec)!, outPath = pr.GetValue(output)!;
            TableFormats.FromPath(outPath);
            var t = CatalogueIO.Read(pr.GetValue(input)!, new ReadOptions { NumericColumns = new HashSet<string> { raCol, decCol } });
            PositionValidation.Validate(t, raCol, decCol, null);
            double[] a = t.RequireDoubles(raCol), d = t.RequireDoubles(decCol);
            var h = new HealpixNested(k);
            var pix = new long[t.RowCount];
            Parallel.For(0, (t.RowCount + 65535) / 65536, c =>
            {
                for (int i = c * 65536, end = Math.Min(t.RowCount, i + 65536); i < end; i++) pix[i] = h.FromRaDec(a[i], d[i]);
            });
            t.Add(new Column<long>("healpix_nested", pix, description: $"HEALPix nested pixel at order {k} (Nside {h.Nside})"));
            CatalogueIO.Write(t, outPath);
            ctx.Error.WriteLine($"wrote {outPath}: {t.RowCount} rows, order {k} (Nside {h.Nside}), {pix.Distinct().Count()} distinct pixels");
            return 0;
        }));
        return cmd;
    }
}
