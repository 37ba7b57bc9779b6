using System.Diagnostics;
using Photometallicity.Catalogues;
using Photometallicity.Catalogues.Fits;

namespace Photometallicity.Benchmarks;

/// <summary>
/// FITS binary-table speed: writes and reads 10^6 rows x 10 Double columns (arguments: rows, repeats) and compares
/// the read time with a plain File.Copy of the same file (the floor set by the disk and page cache).
/// Best of the repeats is reported for each.
/// </summary>
internal static class FitsBenchmark
{
    [Benchmark("fits")]
    public static void Run(string[] args)
    {
        int rows = args.Length > 0 ? int.Parse(args[0]) : 1_000_000;
        int repeats = args.Length > 1 ? int.Parse(args[1]) : 5;
        const int columns = 10;
        var table = new Table(rows);
        for (int c = 0; c < columns; c++)
        {
            var v = new double[rows];
            for (int i = 0; i < rows; i++) v[i] = i * 0.001 + c; // invented values
            table.Add(new Column<double>("c" + c, v, unit: "mag"));
        }
        string dir = Path.Combine(Path.GetTempPath(), "pm-fits-bench-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(dir);
        string path = Path.Combine(dir, "bench.fits"), copy = Path.Combine(dir, "copy.fits");
        try
        {
            // The measurements are interleaved (write, read, copy, read-all in each round) so that all of them see the same
            // machine load; best wall time and best process CPU time (user + kernel, so File.Copy's kernel work counts) are kept.
            var write = new Timing();
            var read = new Timing();
            var fileCopy = new Timing();
            var readAll = new Timing();
            for (int r = 0; r < repeats; r++)
            {
                write.Measure(() => CatalogueIO.Write(table, path));
                read.Measure(() => FitsTableReader.Read(path, ReadOptions.Default));
                fileCopy.Measure(() => File.Copy(path, copy, overwrite: true));
                readAll.Measure(() => File.ReadAllBytes(path));
            }
            var back = FitsTableReader.Read(path, ReadOptions.Default);
            if (back.RowCount != rows || ((Column<double>)back["c9"]).Values[rows - 1] != (rows - 1) * 0.001 + 9)
                throw new InvalidOperationException("read-back mismatch");
            long bytes = new FileInfo(path).Length;
            Console.WriteLine($"fits: {rows} rows x {columns} double columns, file {bytes / 1e6:F1} MB, best of {repeats}, {Environment.ProcessorCount} cores");
            Console.WriteLine($"fits write: {write} -> {rows / write.Wall:E3} rows/s (wall)");
            Console.WriteLine($"fits read:  {read} -> {rows / read.Wall:E3} rows/s (wall)");
            Console.WriteLine($"File.Copy:  {fileCopy}");
            Console.WriteLine($"File.ReadAllBytes: {readAll}");
            Console.WriteLine($"read / File.Copy = {read.Wall / fileCopy.Wall:F2} (wall), {read.Cpu / fileCopy.Cpu:F2} (CPU)");
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }

    private sealed class Timing
    {
        public double Wall { get; private set; } = double.MaxValue;
        public double Cpu { get; private set; } = double.MaxValue;

        public void Measure(Action action)
        {
            GC.Collect();
            GC.WaitForPendingFinalizers();
            var process = Process.GetCurrentProcess();
            var cpu0 = process.TotalProcessorTime;
            var sw = Stopwatch.StartNew();
            action();
            double wall = sw.Elapsed.TotalSeconds;
            process.Refresh();
            double cpu = (process.TotalProcessorTime - cpu0).TotalSeconds;
            Wall = Math.Min(Wall, wall);
            Cpu = Math.Min(Cpu, cpu);
        }

        public override string ToString() => $"{Wall * 1e3:F1} ms wall, {Cpu * 1e3:F1} ms CPU";
    }
}
