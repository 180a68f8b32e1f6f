using System.Globalization;
using System.Net.Sockets;
using DesignRules.Run;
using DesignRules.Run.Serving;

namespace DesignRules.Server;

/// <summary>Why a server's <see cref="EvaluationServer.Run"/> ended (its process's exit code).</summary>
internal enum ServerExit
{
    /// <summary>No run for the idle time, or asked to stop.</summary>
    Idle = 0,

    /// <summary>Another server of the same address holds the lock: this one is not needed.</summary>
    AlreadyServed = 1,

    /// <summary>The socket folder cannot be made owner-only, or the socket cannot be bound.</summary>
    CannotListen = 3,

    /// <summary>The socket file or the task folder went away (stopped by hand, the package cache cleared).</summary>
    Gone = 4,
}

/// <summary>
/// Serves runs of the MSBuild task on a Unix domain socket: each connection is one run, given to <see cref="BuildCheck"/>
/// (the same code the task runs in-process), so a served build writes and logs what an in-process one would. Runs are
/// served concurrently; the results cache and the pages folder take turns through their own file locks, which hold
/// between two runs of one process as between two processes. No check logic lives here.
/// </summary>
internal sealed class EvaluationServer(ServerAddress address, TimeSpan idle, bool warmUp = false) : IDisposable
{
    /// <summary>How long after its first run a server waits before its warm-up: the build that started it is still ending.</summary>
    internal static readonly TimeSpan WarmUpDelay = TimeSpan.FromSeconds(1);

    private readonly CancellationTokenSource stopping = new();
    private readonly TaskCompletionSource listening = new(TaskCreationOptions.RunContinuationsAsynchronously);
    private readonly TaskCompletionSource<string?> warmedUp = new(TaskCreationOptions.RunContinuationsAsynchronously);
    private long lastActivity = Environment.TickCount64;
    private int active;
    private int warmUpStarted;

    /// <summary>
    /// Completes once the socket accepts connections (tests: its file appears at the bind, a moment before the listen, and a
    /// connection in between is refused; the task's client retries until it is accepted).
    /// </summary>
    internal Task Listening => listening.Task;

    /// <summary>Completes when the warm-up after the first build's own check has ended, with the design file it checked (tests).</summary>
    internal Task<string?> WarmedUp => warmedUp.Task;

    /// <summary>Listens until idle for <c>idle</c>, stopped, or its socket file or task folder is gone.</summary>
    public ServerExit Run()
    {
        // Also refuses a socket path too long for the platform, which the socket's constructor would throw on.
        if (!address.PrepareSocketFolder(out _) || address.EndPoint(out _) is not { } endPoint)
        {
            return ServerExit.CannotListen;
        }

        // One server per address: a second one started in a race (two builds at once) finds the lock taken and leaves.
        FileStream? held;
        try
        {
            held = new FileStream(address.LockPath, FileMode.OpenOrCreate, FileAccess.ReadWrite, FileShare.None);
        }
        catch (IOException)
        {
            return ServerExit.AlreadyServed;
        }

        using (held)
        using (var listener = new Socket(AddressFamily.Unix, SocketType.Stream, ProtocolType.Unspecified))
        {
            try
            {
                // A socket file left by a server that died is stale: under the lock no live server owns it.
                File.Delete(address.SocketPath);
                listener.Bind(endPoint);
                if (!OperatingSystem.IsWindows())
                {
                    File.SetUnixFileMode(address.SocketPath, UnixFileMode.UserRead | UnixFileMode.UserWrite);
                }

                listener.Listen(32);
                listening.TrySetResult();
            }
            catch (Exception ex) when (ex is SocketException or IOException or UnauthorizedAccessException)
            {
                return ServerExit.CannotListen;
            }

            var exit = Listen(listener);
            TryDelete(address.SocketPath);
            return exit;
        }
    }

    /// <summary>Asks a running <see cref="Run"/> to end (tests).</summary>
    public void Stop() => stopping.Cancel();

    public void Dispose() => stopping.Dispose();

    private ServerExit Listen(Socket listener)
    {
        var accepting = listener.AcceptAsync(stopping.Token).AsTask();
        while (true)
        {
            try
            {
                if (accepting.Wait(TimeSpan.FromMilliseconds(500)))
                {
                    var connection = accepting.Result;
                    Interlocked.Increment(ref active);
                    Touch();
                    _ = Task.Run(() => Serve(connection));
                    accepting = listener.AcceptAsync(stopping.Token).AsTask();
                    continue;
                }
            }
            catch (AggregateException ex) when (ex.InnerException is OperationCanceledException or SocketException or ObjectDisposedException)
            {
                return WaitForRuns(ServerExit.Idle);
            }

            if (stopping.IsCancellationRequested)
            {
                return WaitForRuns(ServerExit.Idle);
            }

            // Gone: the socket was removed (a user stopping servers by deleting their folder) or the package folder was
            // deleted (a cleared NuGet cache): nobody could start this server again, so it leaves.
            if (!File.Exists(address.SocketPath) || !Directory.Exists(address.Folder))
            {
                stopping.Cancel();
                return WaitForRuns(ServerExit.Gone);
            }

            if (Volatile.Read(ref active) == 0 && Environment.TickCount64 - Interlocked.Read(ref lastActivity) > (long)idle.TotalMilliseconds)
            {
                stopping.Cancel();
                return WaitForRuns(ServerExit.Idle);
            }
        }
    }

    /// <summary>Lets runs under way finish their writes (a run is never cut off halfway through writing its outputs).</summary>
    private ServerExit WaitForRuns(ServerExit exit)
    {
        var deadline = Environment.TickCount64 + (long)TimeSpan.FromMinutes(10).TotalMilliseconds;
        while (Volatile.Read(ref active) > 0 && Environment.TickCount64 < deadline)
        {
            Thread.Sleep(50);
        }

        return exit;
    }

    /// <summary>
    /// Once, after the first build's own check: <see cref="ServerWarmUp"/> on a thread of its own, counted as a run under way so that a
    /// stopping server waits for it (it stops between its checks); it does not count as activity for the idle time.
    /// </summary>
    private void StartWarmUp(BuildCall call)
    {
        Interlocked.Increment(ref active);
        new Thread(() =>
        {
            string? checkedFile = null;
            try
            {
                CultureInfo.CurrentCulture = CultureInfo.InvariantCulture;
                CultureInfo.CurrentUICulture = CultureInfo.InvariantCulture;
                if (!stopping.Token.WaitHandle.WaitOne(WarmUpDelay))
                {
                    checkedFile = ServerWarmUp.Run(call, stopping.Token);
                }
            }
            catch (Exception ex) when (ex is not (OutOfMemoryException or StackOverflowException or AccessViolationException))
            {
                // A warm-up that fails leaves the server as cold as it was; every build's run reports its own failures.
            }
            finally
            {
                Interlocked.Decrement(ref active);
                warmedUp.TrySetResult(checkedFile);
            }
        })
        { IsBackground = true, Name = "DesignRules warm-up" }.Start();
    }

    private void Touch() => Interlocked.Exchange(ref lastActivity, Environment.TickCount64);

    private void Serve(Socket connection)
    {
        try
        {
            using (connection)
            {
                var request = ServerFrame.Receive(connection, ServerSettings.AnswerLimit, stopping.Token, out _, out var problem);
                // A task that stops reading (a build killed without closing) must not hold a writer forever.
                connection.SendTimeout = (int)ServerSettings.SilenceLimit.TotalMilliseconds;
                var channel = new Channel(connection);
                if (request?.Kind == ServerFrame.Stop)
                {
                    channel.Send(new ServerFrame(ServerFrame.Accepted) { ProcessId = Environment.ProcessId, Identity = address.Identity });
                    stopping.Cancel();
                    return;
                }

                if (request is null || request.Kind != ServerFrame.Run || request.Call is null || request.Protocol != ServerFrame.CurrentProtocol
                    || request.Identity != address.Identity)
                {
                    channel.Send(new ServerFrame(ServerFrame.Refused)
                    {
                        Identity = address.Identity,
                        Reason = request is null ? "the request was not a frame of this server's protocol" + (problem is null ? string.Empty : " (" + problem + ")")
                            : request.Protocol != ServerFrame.CurrentProtocol ? string.Create(CultureInfo.InvariantCulture, $"the server speaks protocol {ServerFrame.CurrentProtocol}, the task {request.Protocol}")
                            : request.Identity != address.Identity ? "the server belongs to another build of the tool"
                            : "the request was not a run",
                    });
                    return;
                }

                channel.Send(new ServerFrame(ServerFrame.Accepted) { ProcessId = Environment.ProcessId, Identity = address.Identity });
                var call = request.Call;
                var log = new CollectingLog(channel);
                var run = Task.Run(() =>
                {
                    CultureInfo.CurrentCulture = CultureInfo.InvariantCulture;
                    CultureInfo.CurrentUICulture = CultureInfo.InvariantCulture;
                    return BuildCheck.Execute(call, log, hostAsError: null);
                });
                // A heartbeat while the run goes on; once the task has gone (a cancelled build), sends fail and the run's
                // result is abandoned, but the run itself finishes its writes, so no output is left half-written.
                while (!run.Wait(ServerSettings.Heartbeat))
                {
                    channel.Send(new ServerFrame(ServerFrame.Alive));
                }

                channel.Send(new ServerFrame(ServerFrame.Done) { Entries = log.Entries, Result = run.Result });
                // After a build's own check, not a head start's: the build that handed over a head start is still under way.
                if (warmUp && !call.HeadStart && Interlocked.Exchange(ref warmUpStarted, 1) == 0)
                {
                    StartWarmUp(call);
                }
            }
        }
        catch (Exception ex) when (ex is IOException or SocketException or OperationCanceledException or ObjectDisposedException)
        {
            // The task went away or never spoke: nothing to answer.
        }
        finally
        {
            Touch();
            Interlocked.Decrement(ref active);
        }
    }

    private static void TryDelete(string path)
    {
        try
        {
            File.Delete(path);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            // Stale socket files are removed by the next server of the address.
        }
    }

    /// <summary>Writes frames one at a time (progress comes from worker threads, heartbeats from the serving loop).</summary>
    private sealed class Channel(Socket socket)
    {
        private readonly Lock gate = new();
        private bool broken;

        public void Send(ServerFrame frame)
        {
            lock (gate)
            {
                if (broken)
                {
                    return;
                }

                try
                {
                    frame.Send(socket);
                }
                catch (Exception ex) when (ex is IOException or SocketException or ObjectDisposedException)
                {
                    broken = true;
                }
            }
        }
    }

    /// <summary>Streams progress entries at once and keeps the others for the run's end, in order.</summary>
    private sealed class CollectingLog(Channel channel) : IBuildLog
    {
        private readonly Lock gate = new();
        private readonly List<BuildLogEntry> entries = [];

        public List<BuildLogEntry> Entries
        {
            get
            {
                lock (gate)
                {
                    return [.. entries];
                }
            }
        }

        public void Write(BuildLogEntry entry)
        {
            if (entry.Progress)
            {
                channel.Send(new ServerFrame(ServerFrame.ProgressKind) { Entry = entry });
                return;
            }

            lock (gate)
            {
                entries.Add(entry);
            }
        }
    }
}
