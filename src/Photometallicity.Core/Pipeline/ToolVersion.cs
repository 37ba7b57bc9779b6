using System.Reflection;

namespace Photometallicity.Pipeline;

/// <summary>The program's version, recorded in every output's provenance.</summary>
public static class ToolVersion
{
    public static string Current { get; } =
        typeof(ToolVersion).Assembly.GetCustomAttribute<AssemblyInformationalVersionAttribute>()?.InformationalVersion.Split('+')[0]
        ?? typeof(ToolVersion).Assembly.GetName().Version?.ToString() ?? "unknown";
}
