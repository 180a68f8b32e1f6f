using System.Net.Sockets;
using DesignRules.Run;
using DesignRules.Run.Serving;
using DesignRules.Server;
using TaskItem = Microsoft.Build.Utilities.TaskItem;

namespace DesignRules.Build.Tests;

/// <summary>
/// The warm evaluation server in this test process (the same code the packed server runs), reached by the task through
/// its socket: a served check must write and log exactly what an in-process one does, must never replay a stale result,
/// and must never be the reason a build fails, hangs or loses a finding.
/// </summary>
public sealed class EvaluationServerTests : IDisposable
{
    private static readonly TimeSpan Bound = TimeSpan.FromSeconds(30);
    private readonly string root = TestPaths.NewTempFolder("served");
    // Short: a Unix domain socket's path must stay under about 100 bytes.
    private readonly string sockets = Path.Combine(Path.GetTempPath(), "drs-" + Guid.NewGuid().ToString("N")[..8]);
    private readonly List<(EvaluationServer Server, Task<ServerExit> Run)> servers = [];

    public void Dispose()
    {
        foreach (var (server, run) in servers)
        {
            server.Stop();
            Assert.True(run.Wait(Bound), "a server must leave when asked to");
            server.Dispose();
        }

        Directory.Delete(root, recursive: true);
        if (Directory.Exists(sockets))
        {
            Directory.Delete(sockets, recursive: true);
        }
    }

    private ServerAddress Address(string salt) => ServerAddress.For(CheckDesigns.TaskFolder, salt) with { SocketFolder = sockets };

    /// <summary>Starts a server of <paramref name="salt"/>'s address in this process and waits until it listens.</summary>
    private (EvaluationServer Server, Task<ServerExit> Run) Serve(string salt, TimeSpan? idle = null, bool warmUp = false)
    {
        var address = Address(salt);
        var server = new EvaluationServer(address, idle ?? TimeSpan.FromMinutes(5), warmUp);
        var run = Task.Factory.StartNew(server.Run, TaskCreationOptions.LongRunning);
        var waited = System.Diagnostics.Stopwatch.StartNew();
        // Listening, not only bound: the socket file appears at the bind, and a connection before the listen is refused.
        while (!server.Listening.IsCompleted && !run.IsCompleted && waited.Elapsed < Bound)
        {
            Thread.Sleep(20);
        }

        Assert.True(server.Listening.IsCompleted && File.Exists(address.SocketPath), $"the server did not listen: {(run.IsCompleted ? run.Result.ToString() : "still starting")}");
        servers.Add((server, run));
        return (server, run);
    }

    private (CheckDesigns Task, RecordingEngine Engine) CheckTask(bool served, string salt = "served") => CheckTask(root, served, salt);

    private (CheckDesigns Task, RecordingEngine Engine) CheckTask(string root, bool served, string salt = "served")
    {
        var engine = new RecordingEngine();
        var task = new CheckDesigns
        {
            BuildEngine = engine,
            Files = [new TaskItem(Path.Combine(root, SampleRepository.DesignPath))],
            RepositoryRoot = root,
            StampFile = Path.Combine(root, "obj", "check.stamp"),
            LoadedFilesFile = Path.Combine(root, "obj", "loaded.files"),
            CacheFolder = Path.Combine(root, "obj", "cache"),
            SarifFile = Path.Combine(root, "out", "designrules.sarif"),
            JsonFile = Path.Combine(root, "out", "designrules.json"),
            PagesFolder = Path.Combine(root, "design-pages"),
            Today = "2026-12-01",
            Server = served,
            ServerSalt = salt,
            ServerSocketFolder = sockets,
        };
        return (task, engine);
    }

    private SortedDictionary<string, byte[]> Outputs() => Outputs(root);

    private static SortedDictionary<string, byte[]> Outputs(string root)
    {
        var files = new SortedDictionary<string, byte[]>(StringComparer.Ordinal);
        foreach (var folder in new[] { "out", "design-pages" })
        {
            foreach (var file in Directory.EnumerateFiles(Path.Combine(root, folder), "*", SearchOption.AllDirectories))
            {
                files[Path.GetRelativePath(root, file)] = File.ReadAllBytes(file);
            }
        }

        // The stamp's findings exist only after a check with no error: present in both or in neither (the keys are compared).
        foreach (var file in new[] { "check.stamp.findings.json", "loaded.files" })
        {
            var path = Path.Combine(root, "obj", file);
            if (File.Exists(path))
            {
                files["obj/" + file] = File.ReadAllBytes(path);
            }
        }

        return files;
    }

    private void ForgetOutputs() => ForgetOutputs(root);

    private static void ForgetOutputs(string root)
    {
        foreach (var folder in new[] { "out", "design-pages", "obj" })
        {
            Directory.Delete(Path.Combine(root, folder), recursive: true);
        }
    }

    // Progress and summary lines state how long a design took: the one part of the log that may differ.
    private static string Log(RecordingEngine engine) => System.Text.RegularExpressions.Regex.Replace(Lines(engine), @"\d+(\.\d+)? (s|ms)\b", "# s");

    private static string Lines(RecordingEngine engine) =>
        string.Join("\n", engine.Errors.Select(e => $"error {e.Code} {e.File}({e.LineNumber},{e.ColumnNumber},{e.EndLineNumber},{e.EndColumnNumber}) {e.HelpLink}: {e.Message}")
            .Concat(engine.Warnings.Select(w => $"warning {w.Code} {w.File}({w.LineNumber},{w.ColumnNumber},{w.EndLineNumber},{w.EndColumnNumber}) {w.HelpLink}: {w.Message}"))
            .Concat(engine.Messages.Where(m => m.Importance != Microsoft.Build.Framework.MessageImportance.Low)
                .Select(m => $"message {m.Importance} {m.Code} {m.File}({m.LineNumber},{m.ColumnNumber}): {m.Message}")));

    [Fact]
    public void A_served_check_writes_the_same_reports_pages_and_stamp_and_logs_the_same_lines_as_an_in_process_one()
    {
        // A design with an error (an unknown part) and the findings a working design has, so the log has every kind of line.
        SampleRepository.Write(root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var (inProcess, inProcessEngine) = CheckTask(served: false);
        Assert.False(inProcess.Execute());
        SampleRepository.Write(root, SampleRepository.Design());
        var (inProcessClean, inProcessCleanEngine) = CheckTask(served: false);
        Assert.True(inProcessClean.Execute(), Log(inProcessCleanEngine));
        var expected = Outputs();
        ForgetOutputs();

        Serve("served");
        SampleRepository.Write(root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var (served, servedEngine) = CheckTask(served: true);
        Assert.False(served.Execute());
        SampleRepository.Write(root, SampleRepository.Design());
        var (servedClean, servedCleanEngine) = CheckTask(served: true);
        Assert.True(servedClean.Execute(), Log(servedCleanEngine));

        Assert.Contains(servedCleanEngine.Messages, m => m.Message!.Contains("checked by the evaluation server", StringComparison.Ordinal));
        Assert.DoesNotContain(servedCleanEngine.Messages, m => m.Message!.Contains("checking in the build process", StringComparison.Ordinal));
        Assert.Equal(Log(inProcessEngine), Log(servedEngine));
        Assert.Equal(Log(inProcessCleanEngine), Log(servedCleanEngine));
        Assert.Equal((inProcess.ErrorCount, inProcess.WarningCount), (served.ErrorCount, served.WarningCount));
        var actual = Outputs();
        Assert.Equal(expected.Keys, actual.Keys);
        foreach (var (file, bytes) in expected)
        {
            Assert.True(bytes.AsSpan().SequenceEqual(actual[file]), $"{file} differs between the served and the in-process check");
        }
    }

    [Fact]
    public async Task A_new_server_warms_up_once_after_the_first_check_and_leaves_every_output_of_it_and_of_the_next_check_as_they_were()
    {
        var (server, _) = Serve("served", warmUp: true);
        SampleRepository.Write(root, SampleRepository.Design());
        var (first, firstEngine) = CheckTask(served: true);
        Assert.True(first.Execute(), Log(firstEngine));
        Assert.Equal(Path.GetFullPath(Path.Combine(root, SampleRepository.DesignPath)), await server.WarmedUp.WaitAsync(Bound));
        var afterFirst = Outputs();

        var (second, secondEngine) = CheckTask(served: true);
        Assert.True(second.Execute(), Log(secondEngine));

        Assert.Contains(secondEngine.Messages, m => m.Message!.Contains("checked by the evaluation server", StringComparison.Ordinal));
        var afterSecond = Outputs();
        Assert.Equal(afterFirst.Keys, afterSecond.Keys);
        foreach (var (file, bytes) in afterFirst)
        {
            Assert.True(bytes.AsSpan().SequenceEqual(afterSecond[file]), $"{file} differs between the check before the warm-up and the one after it");
        }

        Assert.Empty(Directory.GetDirectories(Path.GetTempPath(), $"designrules-warm-up-{Environment.ProcessId}-*"));
    }

    [Fact]
    public void An_edited_design_checked_by_a_warm_server_reports_its_new_finding_and_its_fix()
    {
        Serve("served");
        SampleRepository.Write(root, SampleRepository.Design());
        var (first, firstEngine) = CheckTask(served: true);
        Assert.True(first.Execute(), Log(firstEngine));
        Assert.DoesNotContain(firstEngine.Errors, e => e.Code == "DR906");

        // The same server, warm, the same results cache: the edited design must be judged afresh, never replayed green.
        SampleRepository.Write(root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var (edited, editedEngine) = CheckTask(served: true);
        Assert.False(edited.Execute());
        Assert.Single(editedEngine.Errors, e => e.Code == "DR906");
        Assert.Contains(editedEngine.Messages, m => m.Message!.Contains("checked by the evaluation server", StringComparison.Ordinal));

        SampleRepository.Write(root, SampleRepository.Design());
        var (fixedAgain, fixedEngine) = CheckTask(served: true);
        Assert.True(fixedAgain.Execute(), Log(fixedEngine));
        Assert.DoesNotContain(fixedEngine.Errors, e => e.Code == "DR906");
    }

    [Fact]
    public void Two_repositories_checked_by_one_warm_server_at_the_same_time_each_get_exactly_their_in_process_outputs()
    {
        // One repository with an error, one with another feedback value: runs of two builds served side by side must not
        // mix their designs, caches, reports or pages.
        var other = TestPaths.NewTempFolder("served-other");
        try
        {
            SampleRepository.Write(root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
            SampleRepository.Write(other, SampleRepository.Design(feedback: "22k"));
            var (one, oneEngine) = CheckTask(root, served: false);
            var (two, twoEngine) = CheckTask(other, served: false);
            Assert.False(one.Execute());
            Assert.True(two.Execute(), Log(twoEngine));
            var (expectedOne, expectedTwo) = (Outputs(root), Outputs(other));
            ForgetOutputs(root);
            ForgetOutputs(other);

            Serve("served");
            var (servedOne, servedOneEngine) = CheckTask(root, served: true);
            var (servedTwo, servedTwoEngine) = CheckTask(other, served: true);
            var results = new bool[2];
            Parallel.Invoke(() => results[0] = servedOne.Execute(), () => results[1] = servedTwo.Execute());

            Assert.Equal([false, true], results);
            foreach (var engine in new[] { servedOneEngine, servedTwoEngine })
            {
                Assert.Contains(engine.Messages, m => m.Message!.Contains("checked by the evaluation server", StringComparison.Ordinal));
            }

            Assert.Equal(Log(oneEngine), Log(servedOneEngine));
            Assert.Equal(Log(twoEngine), Log(servedTwoEngine));
            foreach (var (expected, actual) in new[] { (expectedOne, Outputs(root)), (expectedTwo, Outputs(other)) })
            {
                Assert.Equal(expected.Keys, actual.Keys);
                foreach (var (file, bytes) in expected)
                {
                    Assert.True(bytes.AsSpan().SequenceEqual(actual[file]), $"{file} differs between the served and the in-process check");
                }
            }
        }
        finally
        {
            Directory.Delete(other, recursive: true);
        }
    }

    [Fact]
    public void Servers_of_two_tool_identities_have_two_addresses_and_a_server_refuses_a_run_meant_for_another_identity()
    {
        Assert.NotEqual(Address("one").SocketPath, Address("two").SocketPath);
        Assert.NotEqual(Address("one").Identity, Address("two").Identity);
        Serve("one");

        var answer = Ask(Address("one").SocketPath, new ServerFrame(ServerFrame.Run) { Identity = Address("two").Identity, Call = new BuildCall() });

        Assert.Equal(ServerFrame.Refused, answer?.Kind);
        Assert.Contains("another build of the tool", answer!.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void The_task_and_the_server_find_the_same_address_however_the_folder_is_spelt()
    {
        var folder = CheckDesigns.TaskFolder;

        Assert.Equal(ServerAddress.For(folder, null).SocketPath, ServerAddress.For(folder + Path.DirectorySeparatorChar, null).SocketPath);
        Assert.Equal(ServerAddress.For(folder, null).SocketPath, ServerAddress.For(AppContext.BaseDirectory, null).SocketPath);
    }

    [Fact]
    public void A_server_refuses_a_run_in_another_protocol_version()
    {
        Serve("served");

        var answer = Ask(Address("served").SocketPath,
            new ServerFrame(ServerFrame.Run) { Identity = Address("served").Identity, Call = new BuildCall(), Protocol = ServerFrame.CurrentProtocol + 1 });

        Assert.Equal(ServerFrame.Refused, answer?.Kind);
        Assert.Contains("protocol", answer!.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_server_that_dies_in_the_middle_of_a_run_leaves_the_check_to_the_build_process_which_still_reports_the_finding()
    {
        var address = Address("dying");
        Assert.True(address.PrepareSocketFolder(out _));
        using var listener = new Socket(AddressFamily.Unix, SocketType.Stream, ProtocolType.Unspecified);
        listener.Bind(new UnixDomainSocketEndPoint(address.SocketPath));
        listener.Listen(4);
        // A server that takes the run and then dies before it ends.
        var dying = Task.Run(async () =>
        {
            using var connection = await listener.AcceptAsync();
            Assert.Equal(ServerFrame.Run, ServerFrame.Receive(connection, Bound, CancellationToken.None, out _, out _)?.Kind);
            new ServerFrame(ServerFrame.Accepted) { ProcessId = 1 }.Send(connection);
            new ServerFrame(ServerFrame.Alive).Send(connection);
        });
        SampleRepository.Write(root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var (task, engine) = CheckTask(served: true, salt: "dying");

        Assert.False(task.Execute());

        await dying.WaitAsync(Bound);
        Assert.Single(engine.Errors, e => e.Code == "DR906");
        Assert.Contains(engine.Messages, m => m.Message!.Contains("checking in the build process: the evaluation server stopped answering", StringComparison.Ordinal));
        Assert.True(File.Exists(Path.Combine(root, "out", "designrules.sarif")));
    }

    [Theory]
    [InlineData("foreign", "the evaluation server's answer is not a frame of its protocol")]
    [InlineData("other-version", "the evaluation server speaks protocol")]
    [InlineData("truncated", "the evaluation server sent something that is not a frame of its protocol in the middle of the run")]
    [InlineData("second-answer", "the evaluation server sent a 'accepted' frame in the middle of the run")]
    public async Task A_server_whose_frames_are_foreign_truncated_or_out_of_step_leaves_the_check_to_the_build_process(string how, string said)
    {
        var address = Address("odd-" + how);
        Assert.True(address.PrepareSocketFolder(out _));
        using var listener = new Socket(AddressFamily.Unix, SocketType.Stream, ProtocolType.Unspecified);
        listener.Bind(new UnixDomainSocketEndPoint(address.SocketPath));
        listener.Listen(4);
        var odd = Task.Run(async () =>
        {
            using var connection = await listener.AcceptAsync();
            Assert.Equal(ServerFrame.Run, ServerFrame.Receive(connection, Bound, CancellationToken.None, out _, out _)?.Kind);
            var done = new ServerFrame(ServerFrame.Done) { Entries = [], Result = new BuildCheckResult(true, 0, 0) }.ToBytes();
            try
            {
                switch (how)
                {
                    case "foreign":
                        connection.Send("{\"Kind\":\"accepted\"}\n"u8.ToArray());
                        break;
                    case "other-version":
                        new ServerFrame(ServerFrame.Accepted) { ProcessId = 1, Protocol = ServerFrame.CurrentProtocol + 1 }.Send(connection);
                        break;
                    case "truncated":
                        // A green result cut off before its end must never be taken for one.
                        new ServerFrame(ServerFrame.Accepted) { ProcessId = 1 }.Send(connection);
                        connection.Send(done.AsSpan(0, done.Length - 2));
                        break;
                    default:
                        new ServerFrame(ServerFrame.Accepted) { ProcessId = 1 }.Send(connection);
                        new ServerFrame(ServerFrame.Accepted) { ProcessId = 1 }.Send(connection);
                        connection.Send(done);
                        break;
                }

                connection.Shutdown(SocketShutdown.Send);
            }
            catch (SocketException)
            {
                // The task may hang up as soon as it has judged a frame (a second 'accepted' ends the run for it): the
                // sends after that meet a closed connection, which is not what is tested.
            }
        });
        SampleRepository.Write(root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var (task, engine) = CheckTask(served: true, salt: "odd-" + how);

        Assert.False(task.Execute());

        await odd.WaitAsync(Bound);
        Assert.Single(engine.Errors, e => e.Code == "DR906");
        Assert.Contains(engine.Messages, m => m.Message!.Contains("checking in the build process: " + said, StringComparison.Ordinal));
        Assert.True(File.Exists(Path.Combine(root, "out", "designrules.sarif")));
    }

    [Fact]
    public void A_server_refuses_bytes_that_are_not_a_frame_of_its_protocol_with_a_reason()
    {
        Serve("served");
        using var socket = new Socket(AddressFamily.Unix, SocketType.Stream, ProtocolType.Unspecified);
        socket.Connect(new UnixDomainSocketEndPoint(Address("served").SocketPath));

        // Protocol 1's request: a line of JSON.
        socket.Send("{\"Kind\":\"run\",\"Protocol\":1}\n"u8.ToArray());
        var answer = ServerFrame.Receive(socket, Bound, CancellationToken.None, out _, out _);

        Assert.Equal(ServerFrame.Refused, answer?.Kind);
        Assert.Contains("not a frame of this server's protocol", answer!.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_server_leaves_after_its_idle_time_and_removes_its_socket()
    {
        var (_, run) = Serve("idle", TimeSpan.FromSeconds(1));

        Assert.Equal(ServerExit.Idle, await run.WaitAsync(Bound));
        Assert.False(File.Exists(Address("idle").SocketPath));
    }

    [Fact]
    public async Task A_server_whose_socket_is_deleted_leaves_so_deleting_the_socket_folder_stops_every_server()
    {
        var (_, run) = Serve("gone");

        File.Delete(Address("gone").SocketPath);

        Assert.Equal(ServerExit.Gone, await run.WaitAsync(Bound));
    }

    [Fact]
    public void A_second_server_of_the_same_address_leaves_at_once()
    {
        Serve("one");
        using var second = new EvaluationServer(Address("one"), TimeSpan.FromMinutes(5));

        Assert.Equal(ServerExit.AlreadyServed, second.Run());
    }

    [Fact]
    public void A_socket_folder_too_long_for_a_socket_path_means_no_server_and_a_check_in_the_build_process_that_says_why()
    {
        // Linux allows a Unix domain socket's path 108 bytes, macOS 104 (the sun_path field of sockaddr_un): a folder of
        // 150 characters is beyond both. The server must refuse to listen (not die of the end point's exception), and the
        // task must not start one, but check in-process and say why.
        var tooLong = Path.Combine(sockets, new string('x', 150));
        var address = Address("long") with { SocketFolder = tooLong };
        using var server = new EvaluationServer(address, TimeSpan.FromMinutes(5));

        Assert.Equal(ServerExit.CannotListen, server.Run());

        SampleRepository.Write(root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
        var (task, engine) = CheckTask(served: true, salt: "long");
        task.ServerSocketFolder = tooLong;
        Assert.False(task.Execute());
        Assert.Single(engine.Errors, e => e.Code == "DR906");
        Assert.Contains(engine.Messages, m => m.Message!.Contains("is longer than this platform allows a socket's path", StringComparison.Ordinal));
        Assert.DoesNotContain(engine.Messages, m => m.Message!.Contains("checked by the evaluation server", StringComparison.Ordinal));
    }

    /// <summary>Sends one frame and reads the answer (bounded).</summary>
    private static ServerFrame? Ask(string socketPath, ServerFrame frame)
    {
        using var socket = new Socket(AddressFamily.Unix, SocketType.Stream, ProtocolType.Unspecified);
        socket.Connect(new UnixDomainSocketEndPoint(socketPath));
        frame.Send(socket);
        return ServerFrame.Receive(socket, Bound, CancellationToken.None, out _, out _);
    }
}
