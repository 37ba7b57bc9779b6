namespace Photometallicity.Benchmarks;

/// <summary>The benchmarks by name. Each stage adds its own entry (one file per benchmark).</summary>
internal static partial class BenchmarkRegistry
{
    public static readonly Dictionary<string, Action<string[]>> All = new(StringComparer.Ordinal);

    static BenchmarkRegistry()
    {
        foreach (var m in typeof(BenchmarkRegistry).Assembly.GetTypes()
                     .SelectMany(t => t.GetMethods(System.Reflection.BindingFlags.Static | System.Reflection.BindingFlags.Public | System.Reflection.BindingFlags.NonPublic))
                     .Where(m => m.GetCustomAttributes(typeof(BenchmarkAttribute), false).Length > 0))
        {
            var name = ((BenchmarkAttribute)m.GetCustomAttributes(typeof(BenchmarkAttribute), false)[0]).Name;
            All[name] = a => m.Invoke(null, [a]);
        }
    }
}

/// <summary>Marks a static method taking string[] as a benchmark with the given name.</summary>
[AttributeUsage(AttributeTargets.Method)]
internal sealed class BenchmarkAttribute(string name) : Attribute
{
    public string Name { get; } = name;
}
