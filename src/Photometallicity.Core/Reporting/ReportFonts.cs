using System.Security.Cryptography;
using Photometallicity.Catalogues;

namespace Photometallicity.Reporting;

/// <summary>
/// The fonts of every figure: DejaVu Sans regular and bold, shipped inside this assembly (licence in
/// Reporting/Fonts/LICENSE-DejaVu.txt). ScottPlot draws no text at all where it finds no system font, so the
/// bundled files are extracted once per process to a cache file, registered with ScottPlot and made its
/// default font. Call <see cref="EnsureRegistered"/> before any ScottPlot <c>Plot</c> is created: labels take
/// the default font name when they are constructed. Thread-safe; the work is done once.
/// </summary>
public static class ReportFonts
{
    /// <summary>The family name under which the bundled fonts are registered with ScottPlot.</summary>
    public const string FamilyName = "Photometallicity DejaVu Sans";

    /// <summary>The typeface family name inside the bundled TTF files (what an SVG names).</summary>
    public const string TypefaceFamily = "DejaVu Sans";

    private const string ResourcePrefix = "Photometallicity.Reporting.Fonts.";

    private static readonly Lazy<FontRegistration> Registration = new(Register, LazyThreadSafetyMode.ExecutionAndPublication);

    /// <summary>Where the bundled fonts were extracted and registered from.</summary>
    public sealed record FontRegistration(string RegularPath, string BoldPath);

    /// <summary>Registers the bundled fonts with ScottPlot (first call only) and returns the extracted files.</summary>
    public static FontRegistration EnsureRegistered() => Registration.Value;

    private static FontRegistration Register()
    {
        string regular = Extract("DejaVuSans.ttf");
        string bold = Extract("DejaVuSans-Bold.ttf");
        ScottPlot.Fonts.AddFontFile(FamilyName, regular, bold: false, italic: false);
        ScottPlot.Fonts.AddFontFile(FamilyName, bold, bold: true, italic: false);
        ScottPlot.Fonts.Default = FamilyName;

        foreach (bool isBold in new[] { false, true })
        {
            var typeface = ScottPlot.Fonts.GetTypeface(FamilyName, isBold, false);
            if (typeface is null || typeface.FamilyName != TypefaceFamily || typeface.GlyphCount < 1000)
                throw new InvalidOperationException(
                    $"The bundled font {TypefaceFamily} ({(isBold ? "bold" : "regular")}) could not be registered with ScottPlot; " +
                    $"it resolved to '{typeface?.FamilyName ?? "nothing"}'. Figures would have no text.");
        }
        return new FontRegistration(regular, bold);
    }

    /// <summary>The bytes of one bundled resource (a font or the licence text).</summary>
    internal static byte[] ReadResource(string fileName)
    {
        using var stream = typeof(ReportFonts).Assembly.GetManifestResourceStream(ResourcePrefix + fileName)
            ?? throw new InvalidOperationException($"Embedded resource '{ResourcePrefix + fileName}' is missing from the assembly.");
        using var copy = new MemoryStream();
        stream.CopyTo(copy);
        return copy.ToArray();
    }

    /// <summary>
    /// Writes the resource to a cache file named by its content hash, so that processes never see a file of
    /// other content; an existing file is reused only if its bytes match.
    /// </summary>
    private static string Extract(string fileName)
    {
        byte[] bytes = ReadResource(fileName);
        string hash = Convert.ToHexStringLower(SHA256.HashData(bytes))[..16];
        string name = $"{Path.GetFileNameWithoutExtension(fileName)}-{hash}{Path.GetExtension(fileName)}";
        var failures = new List<string>();
        foreach (string dir in CacheDirectories())
        {
            string path = Path.Combine(dir, name);
            try
            {
                if (!File.Exists(path) || !File.ReadAllBytes(path).AsSpan().SequenceEqual(bytes))
                    AtomicFile.WriteAllBytes(path, bytes);
                return path;
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                failures.Add($"{dir}: {e.Message}");
            }
        }
        throw new IOException($"Could not write the bundled font {fileName} to any cache directory: {string.Join("; ", failures)}");
    }

    private static IEnumerable<string> CacheDirectories()
    {
        string local = Environment.GetFolderPath(Environment.SpecialFolder.LocalApplicationData);
        if (!string.IsNullOrEmpty(local)) yield return Path.Combine(local, "photometallicity", "fonts");
        yield return Path.Combine(Path.GetTempPath(), $"photometallicity-fonts-{Environment.UserName}");
    }
}
