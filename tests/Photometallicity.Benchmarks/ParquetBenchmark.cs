namespace Photometallicity.Benchmarks;

/// <summary>
/// Parquet (Snappy) write and read of the same invented table as the CSV benchmark: 10^6 rows x 10 Double
/// columns, or the row count given as the first argument.
/// </summary>
internal static class ParquetBenchmark
{
    [Benchmark("parquet")]
    public static void Run(string[] args) => TableBenchmark.Run("parquet", args);
}
