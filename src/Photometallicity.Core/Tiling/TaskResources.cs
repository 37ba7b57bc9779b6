using System.Globalization;

namespace Photometallicity.Tiling;

/// <summary>
/// What one batch task asks the scheduler for: memory, CPUs and wall time, estimated from the rows it reads.
/// <para>
/// Model: peak memory = <see cref="OverheadMiB"/> + <see cref="BytesPerBroadbandRow"/> x broadband rows +
/// <see cref="BytesPerNarrowbandRow"/> x narrow-band rows; wall time = <see cref="OverheadSeconds"/> +
/// <see cref="SecondsPerBroadbandRow"/> x broadband rows + <see cref="SecondsPerNarrowbandRow"/> x narrow-band rows
/// on <see cref="BenchmarkCpus"/> CPUs (scaled up when fewer CPUs are given, never down: most of a run is not
/// parallel). The request is the estimate times a safety factor, rounded up, and at least a floor.
/// </para>
/// <para>
/// The coefficients were measured on this project's benchmark machine (2 cores, 24 GiB, .NET 10, Release build,
/// shared with other jobs, load average 8-10) with <c>/usr/bin/time -v photometallicity run</c> on the invented
/// demo field: 2.0e4, 2.0e5 and 1.0e6 broadband rows with their 0.82 narrow-band rows per broadband row, and
/// 1.0e6 broadband rows with every second narrow-band row dropped (4.1e5) to separate the two row kinds. A
/// least-squares fit of peak RSS and elapsed time to the model above gave 238 MiB + 1569 B x broadband +
/// 862 B x narrow-band (residuals within 42 MiB) and 5.0 s + 65 us x broadband + 25 us x narrow-band
/// (residuals within 1.6 s); the constants are those, rounded up. A whole 'run' (cross-match, photometry,
/// calibration, [Fe/H], membership, figures) is measured, so for one tile, which does less, they are an upper
/// bound; for the merge, which does the field-wide steps, they are the right scale. They are estimates: measure
/// on your cluster and pass explicit requests if they do not fit.
/// </para>
/// <para>
/// The safety factors (1.5 for memory, 3 for time) and the floors (512 MiB, 10 minutes) are common practice for
/// batch requests and this program's choice, not measured: a task that runs out of memory or time is killed
/// and has to be run again, while a generous request only waits a little longer in the queue.
/// </para>
/// </summary>
public sealed record TaskResources
{
    public const double OverheadMiB = 240;
    public const double BytesPerBroadbandRow = 1600;
    public const double BytesPerNarrowbandRow = 900;
    public const double OverheadSeconds = 5;
    public const double SecondsPerBroadbandRow = 65e-6;
    public const double SecondsPerNarrowbandRow = 25e-6;
    public const int BenchmarkCpus = 2;

    public const double MemorySafetyFactor = 1.5;
    public const double TimeSafetyFactor = 3;
    public const long MinimumMemoryMiB = 512;
    public const int MinimumWallMinutes = 10;

    /// <summary>Memory asked for, MiB (Slurm's --mem, whose unit M is 2^20 bytes).</summary>
    public required long MemoryMiB { get; init; }

    /// <summary>CPUs asked for (Slurm's --cpus-per-task).</summary>
    public required int Cpus { get; init; }

    /// <summary>Wall-time limit asked for, whole minutes.</summary>
    public required int WallMinutes { get; init; }

    /// <summary>Peak memory the model predicts before the safety factor, MiB (0 for an explicit request).</summary>
    public double EstimatedPeakMiB { get; init; }

    /// <summary>Run time the model predicts before the safety factor, seconds (0 for an explicit request).</summary>
    public double EstimatedSeconds { get; init; }

    /// <summary>The wall time as Slurm's --time takes it: "HH:MM:SS", or "D-HH:MM:SS" from one day up.</summary>
    public string SlurmTime
    {
        get
        {
            int d = WallMinutes / 1440, h = WallMinutes % 1440 / 60, m = WallMinutes % 60;
            return d > 0
                ? string.Create(CultureInfo.InvariantCulture, $"{d}-{h:00}:{m:00}:00")
                : string.Create(CultureInfo.InvariantCulture, $"{h:00}:{m:00}:00");
        }
    }

    /// <summary>The request for a task that reads <paramref name="broadbandRows"/> and <paramref name="narrowbandRows"/> on <paramref name="cpus"/> CPUs.</summary>
    public static TaskResources ForRows(long broadbandRows, long narrowbandRows, int cpus)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(broadbandRows);
        ArgumentOutOfRangeException.ThrowIfNegative(narrowbandRows);
        ArgumentOutOfRangeException.ThrowIfLessThan(cpus, 1);
        double peakMiB = OverheadMiB + (BytesPerBroadbandRow * broadbandRows + BytesPerNarrowbandRow * narrowbandRows) / (1 << 20);
        double seconds = (OverheadSeconds + SecondsPerBroadbandRow * broadbandRows + SecondsPerNarrowbandRow * narrowbandRows)
                         * Math.Max(1.0, (double)BenchmarkCpus / cpus);
        long mem = Math.Max(MinimumMemoryMiB, (long)Math.Ceiling(peakMiB * MemorySafetyFactor));
        double minutes = Math.Ceiling(seconds * TimeSafetyFactor / 60);
        int wall = (int)Math.Clamp(minutes, MinimumWallMinutes, int.MaxValue / 2);
        return new TaskResources { MemoryMiB = mem, Cpus = cpus, WallMinutes = wall, EstimatedPeakMiB = peakMiB, EstimatedSeconds = seconds };
    }

    /// <summary>The request every tile task of the array gets: that of the tile with the most rows (memory and time separately).</summary>
    public static TaskResources ForLargestTile(TilePlan plan, int cpus)
    {
        if (plan.Tiles.Count == 0) return ForRows(0, 0, cpus);
        var each = plan.Tiles.Select(t => ForRows(t.BroadbandRows, t.NarrowbandRows, cpus)).ToList();
        return new TaskResources
        {
            MemoryMiB = each.Max(r => r.MemoryMiB),
            Cpus = cpus,
            WallMinutes = each.Max(r => r.WallMinutes),
            EstimatedPeakMiB = each.Max(r => r.EstimatedPeakMiB),
            EstimatedSeconds = each.Max(r => r.EstimatedSeconds),
        };
    }

    /// <summary>The request of the merge job, which works on the whole field: the plan's total rows.</summary>
    public static TaskResources ForMerge(TilePlan plan, int cpus) => ForRows(plan.BroadbandRows, plan.NarrowbandRows, cpus);

    /// <summary>This request with the caller's explicit memory (MiB) and wall time (minutes) where given.</summary>
    public TaskResources Override(long? memoryMiB, int? wallMinutes) => this with
    {
        MemoryMiB = memoryMiB ?? MemoryMiB,
        WallMinutes = wallMinutes ?? WallMinutes,
    };
}
