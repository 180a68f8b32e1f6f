using System.Diagnostics;

namespace DesignRules.Benchmarks;

/// <summary>
/// A child process as the whole-process benchmarks run it: the benchmark's own build variables kept out of it, its output
/// read while it runs, and a bounded wait that kills the whole process tree when the limit passes.
/// </summary>
internal static class ChildProcess
{
    /// <summary>Variables of the benchmark's own build that must not leak into the user's build or the tool's process.</summary>
    private static readonly string[] Scrubbed = ["DR_ARTIFACTS", "MSBuildExtensionsPath", "MSBuildSDKsPath", "MSBUILD_EXE_PATH", "DOTNET_HOST_PATH"];

    /// <summary>Runs <paramref name="file"/> to its end, or throws <see cref="TimeoutException"/> after <paramref name="limit"/>.</summary>
    /// <param name="file">The program.</param>
    /// <param name="arguments">Its arguments, each passed as one.</param>
    /// <param name="directory">The working folder, or null for this process's.</param>
    /// <param name="limit">The longest the run may take.</param>
    /// <param name="environment">Variables to set besides the scrubbing, or null.</param>
    /// <returns>The exit code and what the process wrote to its standard output and error.</returns>
    public static (int ExitCode, string Output, string Error) Run(
        string file, IReadOnlyList<string> arguments, string? directory, TimeSpan limit, IReadOnlyDictionary<string, string>? environment = null)
    {
        var start = new ProcessStartInfo(file) { UseShellExecute = false, RedirectStandardOutput = true, RedirectStandardError = true };
        if (directory is not null)
        {
            start.WorkingDirectory = directory;
        }

        foreach (var argument in arguments)
        {
            start.ArgumentList.Add(argument);
        }

        foreach (var name in Scrubbed)
        {
            start.Environment.Remove(name);
        }

        start.Environment["DOTNET_CLI_TELEMETRY_OPTOUT"] = "1";
        start.Environment["DOTNET_NOLOGO"] = "1";
        foreach (var (name, value) in environment ?? new Dictionary<string, string>())
        {
            start.Environment[name] = value;
        }

        using var process = Process.Start(start)!;
        var output = process.StandardOutput.ReadToEndAsync();
        var error = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(limit))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"{file} {string.Join(' ', arguments)} in {directory ?? "."} ran longer than {limit}.");
        }

        return (process.ExitCode, output.Result, error.Result);
    }
}
