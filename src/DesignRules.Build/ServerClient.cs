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
    /// nothing but progress lines has been logged then. Synchronous throughout (blocking socket calls, each wait bounded):
    /// this runs in the build's own process on every build, where async state machines would be compiled just in time.
    /// With <paramref name="handOverOnly"/> the task leaves as soon as the server accepted the run (a head start): the
    /// server finishes it alone, and nothing is logged.
    /// </summary>
    public static BuildCheckResult? TryRun(BuildCall call, IBuildLog log, ServerOptions options, TaskStart started, bool handOverOnly,
        CancellationToken cancellation, out string? whyNot)
    {
        try
        {
            return Run(call, log, options, started, handOverOnly, cancellation, out whyNot);
        }
        catch (OperationCanceledException) when (cancellation.IsCancellationRequested)
        {
            throw;
        }
        catch (Exception ex) when (cancellation.IsCancellationRequested && ex is SocketException or ObjectDisposedException)
        {
            // Cancelling closes the socket under a wait: that is the cancellation, not a failing server.
            throw new OperationCanceledException("the build was cancelled", ex, cancellation);
        }
        catch (Exception ex) when (ex is IOException or SocketException or OperationCanceledException or ObjectDisposedException
            or UnauthorizedAccessException or System.ComponentModel.Win32Exception or InvalidOperationException)
        {
            whyNot = "the evaluation server failed (" + ex.Message.TrimEnd('.') + ")";
            return null;
        }
    }

    private static BuildCheckResult? Run(BuildCall call, IBuildLog log, ServerOptions options, TaskStart started, bool handOverOnly,
        CancellationToken cancellation, out string? whyNot)
    {
        var sending = Stopwatch.GetTimestamp();
        var server = Path.Combine(options.TaskFolder, ServerAssembly);
        if (!File.Exists(server))
        {
            whyNot = $"there is no {ServerAssembly} beside the task";
            return null;
        }

        var address = ServerAddress.For(options.TaskFolder, options.Salt);
        if (options.SocketFolder is not null)
        {
            address = address with { SocketFolder = options.SocketFolder };
        }

        if (!address.PrepareSocketFolder(out whyNot))
        {
            return null;
        }

        using var socket = ConnectOrStart(address, options, cancellation, out whyNot);
        if (socket is null)
        {
            return null;
        }

        var connected = Stopwatch.GetTimestamp();
        // Cancelling the build closes the connection: the server stops sending and abandons the run's result.
        using var closeOnCancel = cancellation.Register(socket.Dispose);
        // A server that does not read its request is as hung as one that does not answer.
        socket.SendTimeout = (int)ServerSettings.AnswerLimit.TotalMilliseconds;
        new ServerFrame(ServerFrame.Run) { Identity = address.Identity, Call = call }.Send(socket);
        var answer = ServerFrame.Receive(socket, ServerSettings.AnswerLimit, cancellation, out var fault, out var problem);
        if (answer is null)
        {
            whyNot = fault == FrameFault.Damaged ? "the evaluation server's answer is not a frame of its protocol (" + problem + ")"
                : string.Create(CultureInfo.InvariantCulture, $"the evaluation server did not answer within {ServerSettings.AnswerLimit.TotalSeconds:0} s");
            return null;
        }

        if (answer.Kind != ServerFrame.Accepted)
        {
            whyNot = answer.Kind == ServerFrame.Foreign
                ? string.Create(CultureInfo.InvariantCulture, $"the evaluation server speaks protocol {answer.Protocol}, the task {ServerFrame.CurrentProtocol}")
                : "the evaluation server refused the run: " + (answer.Reason ?? answer.Kind);
            return null;
        }

        if (handOverOnly)
        {
            // Closing the connection now leaves the run to the server, which finishes it (writing only the results cache).
            return new BuildCheckResult(true, 0, 0);
        }

        while (true)
        {
            var frame = ServerFrame.Receive(socket, ServerSettings.SilenceLimit, cancellation, out fault, out problem);
            switch (frame?.Kind)
            {
                case null:
                    whyNot = fault == FrameFault.Damaged
                        ? "the evaluation server sent something that is not a frame of its protocol in the middle of the run (" + problem + ")"
                        : "the evaluation server stopped answering in the middle of the run";
                    return null;
                case ServerFrame.ProgressKind when frame.Entry is not null:
                    log.Write(frame.Entry);
                    break;
                case ServerFrame.Done when frame.Result is not null && frame.Entries is not null:
                    var answered = Stopwatch.GetTimestamp();
                    foreach (var entry in frame.Entries)
                    {
                        log.Write(entry);
                    }

                    // Where the task's own time went, beside the server's account of its run ("run took", -v:detailed).
                    var logged = Stopwatch.GetTimestamp();
                    log.Write(new BuildLogEntry(BuildLogKind.Message, string.Create(CultureInfo.InvariantCulture,
                        $"DesignRules: checked by the evaluation server (process {answer.ProcessId}); DesignRulesServer=false checks in the build process. The task took {Milliseconds(started.Timestamp, logged)} ms: {Milliseconds(started.Timestamp, sending)} ms for the call, {Milliseconds(sending, connected)} ms to reach the server, {Milliseconds(connected, answered)} ms for the request and the run, {Milliseconds(answered, logged)} ms logging {frame.Entries.Count} entries; meanwhile this process compiled {System.Runtime.JitInfo.GetCompiledMethodCount() - started.CompiledMethods} method(s) just in time."))
                    { Importance = BuildLogImportance.Low });
                    whyNot = null;
                    return frame.Result;
                case ServerFrame.Alive:
                    break;
                default:
                    // Any other frame in the middle of a run (a second answer, a foreign one, a done without its result)
                    // is a server out of step: its result cannot be trusted.
                    whyNot = "the evaluation server sent a '" + frame.Kind + "' frame in the middle of the run";
                    return null;
            }
        }
    }

    /// <summary>Connects to the server of <paramref name="address"/>, starting it when none listens; no socket (and why) when none came up in time.</summary>
    private static Socket? ConnectOrStart(ServerAddress address, ServerOptions options, CancellationToken cancellation, out string? problem)
    {
        problem = null;
        if (TryConnect(address, cancellation) is { } running)
        {
            return running;
        }

        using var started = Start(address, options);
        var deadline = Stopwatch.StartNew();
        while (deadline.Elapsed < ServerSettings.StartLimit)
        {
            if (cancellation.WaitHandle.WaitOne(TimeSpan.FromMilliseconds(40)))
            {
                cancellation.ThrowIfCancellationRequested();
            }

            if (TryConnect(address, cancellation) is { } socket)
            {
                return socket;
            }

            // A server that exited at once (another one won a race and took the lock: try once more to reach that one;
            // or it could not listen) is not waited for.
            if (started.HasExited)
            {
                if (TryConnect(address, cancellation) is { } winner)
                {
                    return winner;
                }

                problem = string.Create(CultureInfo.InvariantCulture, $"the evaluation server exited at once (exit code {started.ExitCode})");
                return null;
            }
        }

        problem = string.Create(CultureInfo.InvariantCulture, $"the evaluation server did not start listening within {ServerSettings.StartLimit.TotalSeconds:0} s");
        return null;
    }

    /// <summary>
    /// A connection to the server's socket, or null when nobody listens there. The connect is a task of the framework's
    /// own (compiled ahead in it) waited on with a bound: a listener whose queue is full must not hold the build.
    /// </summary>
    private static Socket? TryConnect(ServerAddress address, CancellationToken cancellation)
    {
        if (!File.Exists(address.SocketPath) || address.EndPoint(out _) is not { } endPoint)
        {
            return null;
        }

        var socket = new Socket(AddressFamily.Unix, SocketType.Stream, ProtocolType.Unspecified);
        try
        {
            var connecting = socket.ConnectAsync(endPoint);
            if (connecting.Wait((int)ServerSettings.AnswerLimit.TotalMilliseconds, cancellation))
            {
                return socket;
            }
        }
        catch (AggregateException ex) when (ex.InnerException is SocketException)
        {
            // Nobody listens there (a stale socket file): start one.
        }
        catch (OperationCanceledException)
        {
            socket.Dispose();
            throw;
        }

        socket.Dispose();
        return null;
    }

    private static long Milliseconds(long from, long to) => (long)Stopwatch.GetElapsedTime(from, to).TotalMilliseconds;

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

/// <summary>When the task began (for its account of where its time went, at -v:detailed).</summary>
internal readonly struct TaskStart
{
    private TaskStart(long timestamp, long compiledMethods) => (Timestamp, CompiledMethods) = (timestamp, compiledMethods);

    /// <summary>The <see cref="Stopwatch"/> timestamp.</summary>
    public long Timestamp { get; }

    /// <summary>The methods the process had compiled just in time by then.</summary>
    public long CompiledMethods { get; }

    /// <summary>Now.</summary>
    public static TaskStart Now() => new(Stopwatch.GetTimestamp(), System.Runtime.JitInfo.GetCompiledMethodCount());
}

/// <summary>How the task reaches its server.</summary>
/// <param name="TaskFolder">The task's folder, where the server's assembly is.</param>
/// <param name="IdleSeconds">How long a started server waits for runs before it exits.</param>
/// <param name="Salt">Tells test servers of one folder apart; null normally.</param>
/// <param name="SocketFolder">The socket folder, or null for the per-user default.</param>
internal sealed record ServerOptions(string TaskFolder, double IdleSeconds, string? Salt, string? SocketFolder);
