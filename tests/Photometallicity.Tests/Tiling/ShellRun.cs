using System.Diagnostics;

namespace Photometallicity.Tests.Tiling;

/// <summary>Runs a script with /bin/bash, with extra environment variables, and captures what it prints.</summary>
[System.Runtime.Versioning.UnsupportedOSPlatform("windows")]
internal static class ShellRun
{
    public sealed record Result(int ExitCode, string Out, string Error);

    public static Result Bash(string script, IReadOnlyDictionary<string, string> env, params string[] args)
    {
        var psi = new ProcessStartInfo("/bin/bash") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        psi.ArgumentList.Add(script);
        foreach (var a in args) psi.ArgumentList.Add(a);
        foreach (var kv in env) psi.Environment[kv.Key] = kv.Value;
        using var p = Process.Start(psi)!;
        var stdout = p.StandardOutput.ReadToEndAsync();
        var stderr = p.StandardError.ReadToEndAsync();
        if (!p.WaitForExit(30_000)) { p.Kill(true); throw new TimeoutException($"bash {script} did not end in 30 s"); }
        return new Result(p.ExitCode, stdout.Result, stderr.Result);
    }

    /// <summary>Writes an executable bash script.</summary>
    public static string WriteScript(string path, string body)
    {
        File.WriteAllText(path, "#!/bin/bash\n" + body);
        File.SetUnixFileMode(path, UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute);
        return path;
    }
}
