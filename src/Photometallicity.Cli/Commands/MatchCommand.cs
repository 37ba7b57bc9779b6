using System.CommandLine;
using Microsoft.Extensions.Logging;
using System.Globalization;
using System.Text;
using Photometallicity.Catalogues;
using Photometallicity.Catalogues.Csv;
using Photometallicity.CrossMatch;
using Photometallicity.Errors;
using Photometallicity.Units;

namespace Photometallicity.Cli.Commands;

/// <summary>
/// The 'match' verb: sky cross-match of a broadband (LEFT) and a narrow-band (RIGHT) table. Every LEFT row is
/// written once, in input order, with the LEFT columns, the prefixed RIGHT columns of its partner (empty when
/// none), sep_arcsec and match_flag (0 none, 1 matched, 2 matched and possible blend).
/// </summary>
internal static class MatchCommand
{
    public static Command Create(CliContext ctx)
    {
        var leftArg = new Argument<string>("LEFT") { Description = $"Broadband table, every row of which is written once ({TableFormats.Known})." };
        var rightArg = new Argument<string>("RIGHT") { Description = $"Narrow-band table whose rows are paired with LEFT rows, each at most once ({TableFormats.Known})." };
        var radius = new Option<string>("--radius")
        {
            Description = "Match radius in arcsec (for example 1.0), or 'auto' to choose it from the separation distribution after the offset correction (the result says what it chose and why).",
            Required = true,
        };
        var output = new Option<string?>("--out") { Description = $"Output table; its extension picks the format ({TableFormats.Known}). Default: CSV on standard output." };
        var leftRa = new Option<string>("--left-ra") { Description = "LEFT column with right ascension in degrees (ICRS).", DefaultValueFactory = _ => "ra" };
        var leftDec = new Option<string>("--left-dec") { Description = "LEFT column with declination in degrees (ICRS).", DefaultValueFactory = _ => "dec" };
        var rightRa = new Option<string>("--right-ra") { Description = "RIGHT column with right ascension in degrees (ICRS).", DefaultValueFactory = _ => "ra" };
        var rightDec = new Option<string>("--right-dec") { Description = "RIGHT column with declination in degrees (ICRS).", DefaultValueFactory = _ => "dec" };
        var prefix = new Option<string>("--right-prefix") { Description = "Prefix put before every RIGHT column name in the output.", DefaultValueFactory = _ => "r_" };
        var noOffset = new Option<bool>("--no-offset") { Description = "Do not solve or apply the astrometric offset (narrow-band minus broadband, arcsec); match the positions as given." };
        var rotation = new Option<bool>("--solve-rotation") { Description = "Also solve a small rotation (arcsec) and scale of RIGHT relative to LEFT, besides the offset." };
        var cmd = new Command("match", "Cross-match a broadband (LEFT) and a narrow-band (RIGHT) table on the sky, one-to-one, after solving their astrometric offset. "
                                       + "Output: every LEFT row once, in input order; LEFT columns, prefixed RIGHT columns of the partner, sep_arcsec (arcsec) and "
                                       + "match_flag (0 no partner, 1 matched, 2 matched and possible blend: another RIGHT source inside the radius). "
                                       + "A summary (matched count, offset, radius and why, false-match rates) goes to standard error.")
        {
            leftArg, rightArg, radius, output, leftRa, leftDec, rightRa, rightDec, prefix, noOffset, rotation,
        };
        cmd.SetAction(pr => CommandRunner.Execute(ctx, () =>
        {
            string leftPath = pr.GetValue(leftArg)!, rightPath = pr.GetValue(rightArg)!;
            string? outPath = pr.GetValue(output);
            if (outPath is not null) TableFormats.FromPath(outPath);
            var options = ParseRadius(pr.GetValue(radius)!) with
            {
                SolveOffset = !pr.GetValue(noOffset),
                SolveRotationScale = pr.GetValue(rotation),
            };
            var log = new WarningsOnly(ctx.Logger("match"));
            var clock = System.Diagnostics.Stopwatch.StartNew();
            // The two tables are read at the same time (each reader works alone on its own file); a problem in
            // LEFT is still the one reported first.
            var rightRead = Task.Run(() => CatalogueIO.Read(rightPath));
            Table left;
            try
            {
                left = CatalogueIO.Read(leftPath);
            }
            catch
            {
                rightRead.ContinueWith(t => _ = t.Exception, TaskScheduler.Default);
                throw;
            }
            var right = rightRead.GetAwaiter().GetResult();
            log.LogDebug("match: read {Ms} ms", clock.ElapsedMilliseconds);
            var (lra, ldec) = Positions(left, pr.GetValue(leftRa)!, pr.GetValue(leftDec)!);
            var (rra, rdec) = Positions(right, pr.GetValue(rightRa)!, pr.GetValue(rightDec)!);
            log.LogDebug("match: positions checked {Ms} ms", clock.ElapsedMilliseconds);
            // The stage's own information lines repeat the summary below; keep only its warnings.
            var result = CrossMatcher.Run(lra, ldec, rra, rdec, options, log);
            log.LogDebug("match: matched {Ms} ms", clock.ElapsedMilliseconds);
            var table = MatchedTable.Join(left, right, result, pr.GetValue(prefix)!);
            log.LogDebug("match: joined {Ms} ms", clock.ElapsedMilliseconds);
            if (outPath is null)
            {
                using var ms = new MemoryStream();
                CsvTableWriter.Write(table, ms);
                ctx.Out.Write(Encoding.UTF8.GetString(ms.ToArray()));
            }
            else
            {
                CatalogueIO.Write(table, outPath);
            }
            log.LogDebug("match: written {Ms} ms", clock.ElapsedMilliseconds);
            WriteSummary(ctx.Error, result, outPath);
            return 0;
        }));
        return cmd;
    }

    internal static CrossMatchOptions ParseRadius(string text)
    {
        if (string.Equals(text.Trim(), "auto", StringComparison.OrdinalIgnoreCase))
            return new CrossMatchOptions { AutoRadius = true, Radius = Angle.FromArcseconds(1.0) };
        if (!double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double r) || !double.IsFinite(r) || r <= 0 || r > 36000)
            throw new InputException($"--radius: expected a radius in arcsec in (0, 36000] or 'auto', got '{text}'");
        return new CrossMatchOptions { Radius = Angle.FromArcseconds(r) };
    }

    /// <summary>RA and Dec as doubles, after the catalogue layer's checks (file, row, column and value on failure).</summary>
    internal static (double[] Ra, double[] Dec) Positions(Table table, string raName, string decName)
    {
        // Fast path for the usual double columns: one copy each (NaN where masked) and one scan. When the scan
        // finds a bad row, the catalogue layer's own check runs and reports it (same rule, same message).
        if (table.TryGet(raName, out var raColumn) && raColumn is Column<double> raD
            && table.TryGet(decName, out var decColumn) && decColumn is Column<double> decD)
        {
            var ra = Copy(raD);
            var dec = Copy(decD);
            bool ok = true;
            for (int i = 0; i < ra.Length && ok; i++)
                ok = ra[i] >= 0.0 && ra[i] < 360.0 && dec[i] >= -90.0 && dec[i] <= 90.0;
            if (ok) return (ra, dec);
        }
        PositionValidation.Validate(table, raName, decName, idColumn: null);
        return (PositionValidation.RequireNumeric(table, raName), PositionValidation.RequireNumeric(table, decName));
    }

    /// <summary>
    /// The values of a double column with NaN where it is masked (what <see cref="Column.ToDoubleArray"/> gives): the
    /// column's own array when nothing is masked (the match only reads it), otherwise a copy.
    /// </summary>
    private static double[] Copy(Column<double> c)
    {
        if (c.Missing is null) return c.Values;
        var v = (double[])c.Values.Clone();
        if (c.Missing is { } m)
            for (int i = 0; i < v.Length; i++)
                if (m[i]) v[i] = double.NaN;
        return v;
    }

    private static void WriteSummary(TextWriter w, CrossMatchResult r, string? outPath)
    {
        var inv = CultureInfo.InvariantCulture;
        w.WriteLine(string.Create(inv, $"match: {r.Matched} of {r.LeftCount} LEFT rows matched ({100.0 * r.Matched / Math.Max(1, r.LeftCount):0.0}%) to {r.RightCount} RIGHT rows; {r.BlendCount} possible blends (match_flag 2), {r.LostContention} lost their candidates to closer pairs"));
        w.WriteLine($"match: {r.OffsetReason}");
        w.WriteLine(string.Create(inv, $"match: radius {r.RadiusUsed.Arcseconds:0.###} arcsec ({r.RadiusReason})"));
        w.WriteLine(string.Create(inv, $"match: false-match rate expected {r.ExpectedFalseMatchRate:0.0000} (local density), measured {r.MeasuredFalseMatchRate:0.0000} +/- {r.MeasuredFalseMatchRateError:0.0000} (shifted positions)"));
        if (outPath is not null) w.WriteLine($"wrote {outPath}: {r.LeftCount} rows");
    }

    private sealed class WarningsOnly(Microsoft.Extensions.Logging.ILogger inner) : Microsoft.Extensions.Logging.ILogger
    {
        public IDisposable? BeginScope<TState>(TState state) where TState : notnull => inner.BeginScope(state);

        public bool IsEnabled(Microsoft.Extensions.Logging.LogLevel logLevel) =>
            (logLevel >= Microsoft.Extensions.Logging.LogLevel.Warning || logLevel == Microsoft.Extensions.Logging.LogLevel.Debug) && inner.IsEnabled(logLevel);

        public void Log<TState>(Microsoft.Extensions.Logging.LogLevel logLevel, Microsoft.Extensions.Logging.EventId eventId, TState state, Exception? exception, Func<TState, Exception?, string> formatter)
        {
            if (IsEnabled(logLevel)) inner.Log(logLevel, eventId, state, exception, formatter);
        }
    }
}
