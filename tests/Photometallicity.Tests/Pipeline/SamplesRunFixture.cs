using System.Diagnostics;
using Photometallicity.Tests.Support;

namespace Photometallicity.Tests.Pipeline;

/// <summary>
/// Runs the whole pipeline once on the committed invented field in samples/ (as a separate process, the way a
/// user runs it), and once more restricted to one core, for the end-to-end tests to read.
/// </summary>
public sealed class SamplesRunFixture : IDisposable
{
    public SamplesRunFixture()
    {
        Dir = new TempDir();
        Out = Path.Combine(Dir.Path, "out");
        OneCore = Path.Combine(Dir.Path, "one-core");
        var a = RunCli(["run", RepoPaths.Samples("config.json"), "--out", Out], null);
        var b = RunCli(["run", RepoPaths.Samples("config.json"), "--out", OneCore], "1");
        ExitCode = a.Code;
        OneCoreExitCode = b.Code;
        Log = a.Err;
    }

    public TempDir Dir { get; }
    public string Out { get; }
    public string OneCore { get; }
    public int ExitCode { get; }
    public int OneCoreExitCode { get; }
    public string Log { get; }

    /// <summary>Runs photometallicity.dll (copied beside the tests) with `dotnet`, optionally with DOTNET_PROCESSOR_COUNT set.</summary>
    public static (int Code, string Out, string Err) RunCli(string[] args, string? processorCount)
    {
        var psi = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        psi.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "photometallicity.dll"));
        foreach (var a in args) psi.ArgumentList.Add(a);
        if (processorCount is not null) psi.Environment["DOTNET_PROCESSOR_COUNT"] = processorCount;
        using var p = Process.Start(psi)!;
        var so = p.StandardOutput.ReadToEndAsync();
        var se = p.StandardError.ReadToEndAsync();
        if (!p.WaitForExit(TimeSpan.FromMinutes(5))) { p.Kill(true); throw new TimeoutException("photometallicity did not finish in 5 minutes"); }
        return (p.ExitCode, so.Result, se.Result);
    }

    public void Dispose() => Dir.Dispose();
}
