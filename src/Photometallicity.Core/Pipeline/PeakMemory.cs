using System.Diagnostics;

namespace Photometallicity.Pipeline;

/// <summary>
/// Peak resident memory of this process so far: on Linux the kernel's high-water mark (VmHWM in /proc/self/status,
/// proc(5)), elsewhere the process's peak working set. Read at the end of every stage, so a stage's figure is the peak
/// up to and including it. The mark is never reset: outside tools (GNU time, a batch system's accounting) see the same
/// peak the program reports.
/// </summary>
public static class PeakMemory
{
    private const string Status = "/proc/self/status";

    /// <summary>The peak so far, MiB.</summary>
    public static double SoFarMiB()
    {
        double mib = ReadHighWaterKiB() is { } kib ? kib / 1024.0 : Process.GetCurrentProcess().PeakWorkingSet64 / (1024.0 * 1024.0);
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
