namespace Photometallicity.Tests.Support;

/// <summary>
/// A fact that needs Debian's /usr/bin/python3 (standard library only); reported as skipped, not failed, where it
/// is absent. xunit 2 decides skipping when the attribute is built, so the check lives in the constructor.
/// </summary>
public sealed class NeedsPython3FactAttribute : FactAttribute
{
    public const string Python = "/usr/bin/python3";

    public NeedsPython3FactAttribute()
    {
        if (!File.Exists(Python)) Skip = $"{Python} is not installed";
    }
}
