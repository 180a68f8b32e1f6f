using System.Diagnostics;
using System.Globalization;
using System.Net.Sockets;
using DesignRules.Run;
using DesignRules.Run.Serving;

namespace DesignRules.Build;

/// <summary>
/// The task's side of the warm evaluation server: finds (or starts) the server of this task folder, hands it the run, logs
/// what it sends. Every wait is bounded; whenever the server cannot serve (cannot start, does not answer, dies, speaks
/// another protocol, belongs to another tool build) <see cref="TryRun"/> returns null and says why, and the task runs
/// in-process: a server can make a build faster, never wrong, lost or hung.
/// </summary>
internal static class ServerClient
{
    /// <summary>The server's assembly, beside the task's.</summary>
    public const string ServerAssembly = "DesignRules.Server.dll";

    /// <summary>
    /// Runs <paramref name="call"/> on the server; null (and <paramref name="whyNot"/>) when it could not be served, and
    /// nothing but progress lines has been logged then. With <paramref name="handOverOnly"/> the task leaves as soon as
    /// the server accepted the run (a head start): the server finishes it alone, and nothing is logged.
    /// </summary>
    public static BuildCheckResult? TryRun(BuildCall call, IBuildLog log, ServerOptions options, CancellationToken cancellation, out string? whyNot,
        bool handOverOnly = false)
    {
        try
        {
            var (result, reason) = TryRunAsync(call, log, options, handOverOnly, cancellation).GetAwaiter().GetResult();
            whyNot = reason;
            return result;
        }
        catch (OperationCanceledException) when (cancellation.IsCancellationRequested)
        {
            throw;
        }
        catch (Exception ex) when (ex is IOException or SocketException or OperationCanceledException or ObjectDisposedException
            or UnauthorizedAccessException or System.ComponentModel.Win32Exception or InvalidOperationException)
        {
            whyNot = "the evaluation server failed (" + ex.Message.TrimEnd('.') + ")";
            return null;
        }
    }

    private static async Task<(BuildCheckResult? Result, string? WhyNot)> TryRunAsync(BuildCall call, IBuildLog log, ServerOptions options,
        bool handOverOnly, CancellationToken cancellation)
    {
        var server = Path.Combine(options.TaskFolder, ServerAssembly);
        if (!File.Exists(server))
        {
            return (null, $"there is no {ServerAssembly} beside the task");
        }

        var address = ServerAddress.For(options.TaskFolder, options.Salt);
        if (options.SocketFolder is not null)
        {
            address = address with { SocketFolder = options.SocketFolder };
        }

        if (!address.PrepareSocketFolder(out var folderProblem))
        {
            return (null, folderProblem);
        }

        var (connected, startProblem) = await ConnectOrStart(address, options, cancellation).ConfigureAwait(false);
        using var socket = connected;
        if (socket is null)
        {
            return (null, startProblem);
        }

        // Cancelling the build closes the connection: the server stops sending and abandons the run's result.
        await using var closeOnCancel = cancellation.Register(socket.Dispose).ConfigureAwait(false);
        using var stream = new NetworkStream(socket, ownsSocket: false);
        using var reader = ServerFrame.Reader(stream);
        await stream.WriteAsync(new ServerFrame(ServerFrame.Run) { Identity = address.Identity, Call = call }.ToLine(), cancellation).ConfigureAwait(false);
        var answer = await Read(reader, ServerSettings.AnswerLimit, cancellation).ConfigureAwait(false);
        if (answer is null)
        {
            return (null, string.Create(CultureInfo.InvariantCulture, $"the evaluation server did not answer within {ServerSettings.AnswerLimit.TotalSeconds:0} s"));
        }

        if (answer.Kind != ServerFrame.Accepted)
        {
            return (null, "the evaluation server refused the run: " + (answer.Reason ?? answer.Kind));
        }

        if (handOverOnly)
        {
            // Closing the connection now leaves the run to the server, which finishes it (writing only the results cache).
            return (new BuildCheckResult(true, 0, 0), null);
        }

        while (true)
        {
            var frame = await Read(reader, ServerSettings.SilenceLimit, cancellation).ConfigureAwait(false);
            switch (frame?.Kind)
            {
                case null:
                    return (null, "the evaluation server stopped answering in the middle of the run");
                case ServerFrame.ProgressKind when frame.Entry is not null:
                    log.Write(frame.Entry);
                    break;
                case ServerFrame.Done when frame.Result is not null && frame.Entries is not null:
                    foreach (var entry in frame.Entries)
                    {
                        log.Write(entry);
                    }

                    log.Write(new BuildLogEntry(BuildLogKind.Message, string.Create(CultureInfo.InvariantCulture,
                        $"DesignRules: checked by the evaluation server (process {answer.ProcessId}); DesignRulesServer=false checks in the build process."))
                    { Importance = BuildLogImportance.Low });
                    return (frame.Result, null);
                default:
                    // Heartbeats, and frames a later protocol might add within the same version: nothing to log.
                    break;
            }
        }
    }

    /// <summary>Reads one frame, waiting at most <paramref name="limit"/>; null for silence, the stream's end or a line that is no frame.</summary>
    private static async Task<ServerFrame?> Read(StreamReader reader, TimeSpan limit, CancellationToken cancellation)
    {
        using var bounded = CancellationTokenSource.CreateLinkedTokenSource(cancellation);
        bounded.CancelAfter(limit);
        try
        {
            return await ServerFrame.ReadAsync(reader, bounded.Token).ConfigureAwait(false);
        }
        catch (OperationCanceledException) when (!cancellation.IsCancellationRequested)
        {
            return null;
        }
    }

    /// <summary>Connects to the server of <paramref name="address"/>, starting it when none listens; no socket (and why) when none came up in time.</summary>
    private static async Task<(Socket? Socket, string? Problem)> ConnectOrStart(ServerAddress address, ServerOptions options, CancellationToken cancellation)
    {
        if (await TryConnect(address, cancellation).ConfigureAwait(false) is { } running)
        {
            return (running, null);
        }

        using var started = Start(address, options);
        var deadline = Stopwatch.StartNew();
        while (deadline.Elapsed < ServerSettings.StartLimit)
        {
            await Task.Delay(TimeSpan.FromMilliseconds(40), cancellation).ConfigureAwait(false);
            if (await TryConnect(address, cancellation).ConfigureAwait(false) is { } socket)
            {
                return (socket, null);
            }

            // A server that exited at once (another one won a race and took the lock: try once more to reach that one;
            // or it could not listen) is not waited for.
            if (started.HasExited)
            {
                return await TryConnect(address, cancellation).ConfigureAwait(false) is { } winner
                    ? (winner, null)
                    : (null, string.Create(CultureInfo.InvariantCulture, $"the evaluation server exited at once (exit code {started.ExitCode})"));
            }
        }

        return (null, string.Create(CultureInfo.InvariantCulture, $"the evaluation server did not start listening within {ServerSettings.StartLimit.TotalSeconds:0} s"));
    }

    private static async Task<Socket?> TryConnect(ServerAddress address, CancellationToken cancellation)
    {
        if (!File.Exists(address.SocketPath) || address.EndPoint(out _) is not { } endPoint)
        {
            return null;
        }

        var socket = new Socket(AddressFamily.Unix, SocketType.Stream, ProtocolType.Unspecified);
        try
        {
            using var bounded = CancellationTokenSource.CreateLinkedTokenSource(cancellation);
            bounded.CancelAfter(ServerSettings.AnswerLimit);
            await socket.ConnectAsync(endPoint, bounded.Token).ConfigureAwait(false);
            return socket;
        }
        catch (Exception ex) when (ex is SocketException or OperationCanceledException && !cancellation.IsCancellationRequested)
        {
            socket.Dispose();
            return null;
        }
    }

    /// <summary>
    /// Starts the server as a background process of the same dotnet the build runs on, with standard streams of its own
    /// (redirected, then closed here): a build whose caller reads its output to the end must not wait on the server's
    /// lifetime. Its working folder is the socket folder, so it keeps no repository folder busy.
    /// </summary>
    private static Process Start(ServerAddress address, ServerOptions options)
    {
        var host = Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") is { Length: > 0 } given && File.Exists(given) ? given : "dotnet";
        var start = new ProcessStartInfo(host)
        {
            UseShellExecute = false,
            RedirectStandardInput = true,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            CreateNoWindow = true,
            WorkingDirectory = address.SocketFolder,
        };
        var runtimeConfig = Path.Combine(options.TaskFolder, "DesignRules.Server.runtimeconfig.json");
        var deps = Path.Combine(options.TaskFolder, "DesignRules.Server.deps.json");
        start.ArgumentList.Add("exec");
        if (File.Exists(runtimeConfig))
        {
            start.ArgumentList.Add("--runtimeconfig");
            start.ArgumentList.Add(runtimeConfig);
        }

        if (File.Exists(deps))
        {
            start.ArgumentList.Add("--depsfile");
            start.ArgumentList.Add(deps);
        }

        start.ArgumentList.Add(Path.Combine(options.TaskFolder, ServerAssembly));
        start.ArgumentList.Add("--idle");
        start.ArgumentList.Add(options.IdleSeconds.ToString("R", CultureInfo.InvariantCulture));
        start.ArgumentList.Add("--socket-folder");
        start.ArgumentList.Add(address.SocketFolder);
        if (options.Salt is not null)
        {
            start.ArgumentList.Add("--salt");
            start.ArgumentList.Add(options.Salt);
        }

        var process = Process.Start(start) ?? throw new InvalidOperationException("the evaluation server process did not start");
        process.StandardInput.Close();
        process.StandardOutput.Close();
        process.StandardError.Close();
        return process;
    }
}

/// <summary>How the task reaches its server.</summary>
/// <param name="TaskFolder">The task's folder, where the server's assembly is.</param>
/// <param name="IdleSeconds">How long a started server waits for runs before it exits.</param>
/// <param name="Salt">Tells test servers of one folder apart; null normally.</param>
/// <param name="SocketFolder">The socket folder, or null for the per-user default.</param>
internal sealed record ServerOptions(string TaskFolder, double IdleSeconds, string? Salt, string? SocketFolder);
