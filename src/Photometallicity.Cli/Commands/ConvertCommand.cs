using System.CommandLine;
using Photometallicity.Catalogues;

namespace Photometallicity.Cli.Commands;

/// <summary>The 'convert' verb: table format conversion by file extension.</summary>
internal static class ConvertCommand
{
    public static Command Create(CliContext ctx)
    {
        var input = new Argument<string>("IN") { Description = $"Input table ({TableFormats.Known})." };
        var output = new Argument<string>("OUT") { Description = $"Output table; its extension picks the format ({TableFormats.Known})." };
        var ext = new Option<string?>("--extension") { Description = "FITS input only: EXTNAME of the table extension to read (default: the first table extension)." };
        var sentinel = new Option<double[]>("--missing") { Description = "Numeric value(s) that mean 'no measurement' (for example 99.999); written as missing.", AllowMultipleArgumentsPerToken = true };
        var cmd = new Command("convert", "Convert a table between CSV, FITS binary table and Parquet, by file extension.") { input, output, ext, sentinel };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            string inPath = pr.GetValue(input)!, outPath = pr.GetValue(output)!;
            TableFormats.FromPath(outPath);
            var table = CatalogueIO.Read(inPath, new ReadOptions { Extension = pr.GetValue(ext), MissingSentinels = pr.GetValue(sentinel) ?? [] });
            CatalogueIO.Write(table, outPath);
            ctx.Error.WriteLine($"wrote {outPath}: {table.RowCount} rows, {table.Columns.Count} columns");
            return 0;
        }));
        return cmd;
    }
}
