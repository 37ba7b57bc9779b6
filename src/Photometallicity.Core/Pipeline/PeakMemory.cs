using System.Diagnostics;

namespace Photometallicity.Pipeline;

/// <summary>
/// Peak resident memory of this process between two calls of <see cref="TakeMiB"/>: on Linux the kernel's high-water
/// mark (VmHWM in /proc/self/status), reset after each reading by writing 5 to /proc/self/clear_refs (proc(5)); elsewhere,
/// or where the reset is refused, the process's peak working set so far (then a stage's figure is the run's peak up to it).
/// </summary>
public static class PeakMemory
{
    private const string Status = "/proc/self/status";
    private const string ClearRefs = "/proc/self/clear_refs";

    /// <summary>The peak since the last call (MiB), and resets the mark.</summary>
    public static double TakeMiB()
    {
        double mib = ReadHighWaterKiB() is { } kib ? kib / 1024.0 : Process.GetCurrentProcess().PeakWorkingSet64 / (1024.0 * 1024.0);
        try
        {
            if (File.Exists(ClearRefs)) File.WriteAllText(ClearRefs, "5");
        }
        catch (IOException) { }
        catch (UnauthorizedAccessException) { }
        return Math.Round(mib, 1);
    }

    private static long? ReadHighWaterKiB()
    {
        try
        {
            if (!File.Exists(Status)) return null;
            foreach (var line in File.ReadLines(Status))
            {
                if (!line.StartsWith("VmHWM:", StringComparison.Ordinal)) continue;
                var parts = line.Split(' ', StringSplitOptions.RemoveEmptyEntries);
                return long.TryParse(parts[1], out long kib) ? kib : null;
            }
        }
        catch (IOException) { }
        return null;
    }
}
