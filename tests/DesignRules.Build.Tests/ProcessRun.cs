using System.Diagnostics;
using System.Text;

namespace DesignRules.Build.Tests;

/// <summary>Runs a child process with a bounded time and returns its exit code and combined output.</summary>
public sealed record ProcessRun(int ExitCode, string Output)
{
    /// <summary>Standard output alone (<see cref="Output"/> holds both streams as they came).</summary>
    public string StandardOutput { get; init; } = string.Empty;

    // Variables a test host inherits from `dotnet test` that would point a child build at the wrong MSBuild or SDK.
    private static readonly string[] Inherited =
    [
        "MSBuildExtensionsPath", "MSBuildSDKsPath", "MSBUILD_EXE_PATH", "MSBuildLoadMicrosoftTargetsReadOnly",
        "DOTNET_HOST_PATH", "DR_ARTIFACTS", "VSTEST_HOST_DEBUG", "TERM",
    ];

    public static ProcessRun Dotnet(string workingDirectory, IReadOnlyDictionary<string, string?> environment, TimeSpan limit, params string[] args)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            WorkingDirectory = workingDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var arg in args)
        {
            start.ArgumentList.Add(arg);
        }

        foreach (var name in Inherited)
        {
            start.Environment.Remove(name);
        }

        start.Environment["DOTNET_CLI_TELEMETRY_OPTOUT"] = "1";
        start.Environment["DOTNET_NOLOGO"] = "1";
        start.Environment["DOTNET_SKIP_FIRST_TIME_EXPERIENCE"] = "1";
        start.Environment["MSBUILDDISABLENODEREUSE"] = "1";
        start.Environment["NO_COLOR"] = "1";
        foreach (var (name, value) in environment)
        {
            start.Environment[name] = value;
        }

        var output = new StringBuilder();
        var standardOutput = new StringBuilder();
        using var process = new Process { StartInfo = start };
        process.OutputDataReceived += (_, e) => { if (e.Data is not null) { lock (output) { output.AppendLine(e.Data); standardOutput.AppendLine(e.Data); } } };
        process.ErrorDataReceived += (_, e) => { if (e.Data is not null) { lock (output) { output.AppendLine(e.Data); } } };
        process.Start();
        process.BeginOutputReadLine();
        process.BeginErrorReadLine();
        if (!process.WaitForExit(limit))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"dotnet {string.Join(' ', args)} ran longer than {limit}:\n{output}");
        }

        process.WaitForExit();
        lock (output)
        {
            return new ProcessRun(process.ExitCode, output.ToString()) { StandardOutput = standardOutput.ToString() };
        }
    }

    public override string ToString() => $"exit {ExitCode}\n{Output}";
}
