namespace Photometallicity.Tests.Support;

/// <summary>Locates the repository (the folder holding Photometallicity.sln) and its fixtures.</summary>
public static class RepoPaths
{
    private static readonly Lazy<string> RootLazy = new(() =>
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "Photometallicity.sln"))) dir = dir.Parent;
        return dir?.FullName ?? throw new InvalidOperationException("Photometallicity.sln not found above " + AppContext.BaseDirectory);
    });

    public static string Root => RootLazy.Value;

    /// <summary>A path under tests/fixtures.</summary>
    public static string Fixture(params string[] parts) => Path.Combine([Root, "tests", "fixtures", .. parts]);

    public static string Samples(params string[] parts) => Path.Combine([Root, "samples", .. parts]);

    public static string Calibration(params string[] parts) => Path.Combine([Root, "calibration", .. parts]);
}
