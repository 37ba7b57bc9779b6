using System.Text.RegularExpressions;
using Photometallicity.Errors;

namespace Photometallicity.Tiling;

/// <summary>
/// How the Slurm scripts of a tile plan run: the program, where the merge writes, the scheduler's partition and
/// account, and explicit resource requests that replace the estimates of <see cref="TaskResources"/>.
/// </summary>
public sealed partial record SlurmOptions
{
    /// <summary>The command that runs this program on the cluster's nodes: an executable and any leading arguments (e.g. dotnet and the assembly).</summary>
    public required IReadOnlyList<string> Executable { get; init; }

    /// <summary>Where the merge job writes the run's outputs (absolute); null: the plan's output directory.</summary>
    public string? MergeOutputDirectory { get; init; }

    public string? Partition { get; init; }
    public string? Account { get; init; }

    /// <summary>CPUs per task, tiles and merge alike.</summary>
    public int CpusPerTask { get; init; } = TaskResources.BenchmarkCpus;

    /// <summary>Explicit memory per tile task, MiB; null: estimated.</summary>
    public long? TileMemoryMiB { get; init; }

    /// <summary>Explicit wall time per tile task, minutes; null: estimated.</summary>
    public int? TileWallMinutes { get; init; }

    /// <summary>Explicit memory of the merge job, MiB; null: estimated.</summary>
    public long? MergeMemoryMiB { get; init; }

    /// <summary>Explicit wall time of the merge job, minutes; null: estimated.</summary>
    public int? MergeWallMinutes { get; init; }

    /// <summary>Job name prefix: the jobs are NAME-tiles and NAME-merge.</summary>
    public string JobName { get; init; } = "photometallicity";

    /// <summary>Checks every value; the message names the option (as the 'batch' verb spells it) and what is allowed.</summary>
    public void Validate()
    {
        if (Executable.Count == 0 || Executable.Any(string.IsNullOrEmpty)) throw new InputException("--exe: the program to run on the nodes is empty");
        foreach (var word in Executable) CheckScriptSafe(word, "--exe");
        if (!Path.IsPathFullyQualified(Executable[0])) throw new InputException($"--exe: '{Executable[0]}' must be an absolute path (the tasks run in the work directory, on other machines)");
        if (MergeOutputDirectory is not null)
        {
            CheckScriptSafe(MergeOutputDirectory, "--out");
            if (!Path.IsPathFullyQualified(MergeOutputDirectory)) throw new InputException($"--out: '{MergeOutputDirectory}' must be an absolute path");
        }
        if (Partition is not null && !SchedulerName().IsMatch(Partition)) throw new InputException($"--partition '{Partition}': use letters, digits and . _ - (a comma separates several partitions)");
        if (Account is not null && (!SchedulerName().IsMatch(Account) || Account.Contains(','))) throw new InputException($"--account '{Account}': use letters, digits and . _ -");
        if (!JobNamePattern().IsMatch(JobName)) throw new InputException($"--job-name '{JobName}': use 1 to 64 letters, digits and . _ -");
        if (CpusPerTask < 1 || CpusPerTask > 4096) throw new InputException($"--cpus-per-task {CpusPerTask} is outside [1, 4096]");
        CheckMemory(TileMemoryMiB, "--mem-per-task");
        CheckMemory(MergeMemoryMiB, "--mem-merge");
        CheckMinutes(TileWallMinutes, "--time-per-task");
        CheckMinutes(MergeWallMinutes, "--time-merge");
    }

    /// <summary>
    /// Paths go into #SBATCH lines in double quotes and into bash in single quotes: both handle spaces and any
    /// other character except these, which are refused rather than half-escaped.
    /// </summary>
    public static void CheckScriptSafe(string path, string what)
    {
        foreach (char c in path)
            if (c == '"' || c == '\\' || char.IsControl(c))
                throw new InputException($"{what}: the path '{path.ReplaceLineEndings(" ")}' holds a double quote, backslash or control character, which the Slurm scripts cannot carry; use a path without them");
    }

    private static void CheckMemory(long? mib, string option)
    {
        if (mib is { } m && (m < 16 || m > 1L << 30)) throw new InputException($"{option} {m} is outside [16, {1L << 30}] MiB");
    }

    private static void CheckMinutes(int? minutes, string option)
    {
        if (minutes is { } m && (m < 1 || m > 525_600)) throw new InputException($"{option} {m} is outside [1, 525600] minutes (one year)");
    }

    [GeneratedRegex("^[A-Za-z0-9._-]+(,[A-Za-z0-9._-]+)*$")]
    private static partial Regex SchedulerName();

    [GeneratedRegex("^[A-Za-z0-9._-]{1,64}$")]
    private static partial Regex JobNamePattern();
}
