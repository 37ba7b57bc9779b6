using Photometallicity.Benchmarks;

// Benchmark harness (not timed unit tests): `dotnet run -c Release --project tests/Photometallicity.Benchmarks -- NAME [args]`.
// Each benchmark prints its figures to stdout. Run with no arguments for the list.
var benchmarks = BenchmarkRegistry.All;
if (args.Length == 0 || !benchmarks.TryGetValue(args[0], out var bench))
{
    Console.WriteLine("benchmarks: " + string.Join(", ", benchmarks.Keys.Order()));
    return args.Length == 0 ? 0 : 2;
}
bench(args[1..]);
return 0;
