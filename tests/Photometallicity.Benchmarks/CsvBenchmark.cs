using System.Diagnostics;
using Photometallicity.Catalogues;
using Photometallicity.Numerics;

namespace Photometallicity.Benchmarks;

/// <summary>
/// CSV write and read of an invented table: 10^6 rows x 10 Double columns (or the row count given as the first
/// argument), through <see cref="CatalogueIO"/> so the atomic write and the file checks are included. A 1000-row
/// pass first warms up the JIT.
/// </summary>
internal static class CsvBenchmark
{
    [Benchmark("csv")]
    public static void Run(string[] args) => TableBenchmark.Run("csv", args);
}

/// <summary>The shared body of the table I/O benchmarks.</summary>
internal static class TableBenchmark
{
    public static void Run(string extension, string[] args)
    {
        int rows = args.Length > 0 ? int.Parse(args[0], System.Globalization.CultureInfo.InvariantCulture) : 1_000_000;
        Measure(extension, 1000, quiet: true); // warm-up: JIT compilation is not part of the figures
        Measure(extension, rows, quiet: false);
    }

    private static void Measure(string extension, int rows, bool quiet)
    {
        const int columns = 10;
        var table = Invented(rows, columns);
        string dir = Path.Combine(Path.GetTempPath(), "pm-bench-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(dir);
        string path = Path.Combine(dir, "table." + extension);
        try
        {
            var sw = Stopwatch.StartNew();
            CatalogueIO.Write(table, path);
            double write = sw.Elapsed.TotalSeconds;
            long bytes = new FileInfo(path).Length;
            GC.Collect();
            sw.Restart();
            var back = CatalogueIO.Read(path);
            double read = sw.Elapsed.TotalSeconds;
            if (back.RowCount != rows || back.Columns.Count != columns) throw new InvalidOperationException("read back a different shape");
            for (int c = 0; c < columns; c++)
                if (back.Columns[c].GetDouble(rows - 1) != table.Columns[c].GetDouble(rows - 1)) throw new InvalidOperationException("values differ");
            if (quiet) return;
            Console.WriteLine($"{extension}: {rows} rows x {columns} double columns, {bytes / 1e6:F1} MB");
            Console.WriteLine($"{extension} write: {write:F2} s, {rows / write:F0} rows/s");
            Console.WriteLine($"{extension} read:  {read:F2} s, {rows / read:F0} rows/s");
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }

    /// <summary>Invented magnitude-like values, uniform in [15, 25), 16-17 significant digits each.</summary>
    private static Table Invented(int rows, int columns)
    {
        var rng = new Rng(Seeds.Derive(20261202, "bench-table"));
        var t = new Table(rows);
        for (int c = 0; c < columns; c++)
        {
            var v = new double[rows];
            for (int i = 0; i < rows; i++) v[i] = 15.0 + 10.0 * rng.NextDouble();
            t.Add(new Column<double>("col" + c, v));
        }
        return t;
    }
}
