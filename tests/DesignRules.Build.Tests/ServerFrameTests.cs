using System.Buffers.Binary;
using System.Net.Sockets;
using System.Reflection;
using System.Text;
using DesignRules.Run;
using DesignRules.Run.Serving;

namespace DesignRules.Build.Tests;

/// <summary>
/// The evaluation server's binary frames: every field of every frame kind comes back as it was sent, and bytes that are
/// not one whole frame of this protocol (truncated, too long, of an unknown kind, foreign, damaged) are refused with a
/// reason, never read as a frame and never an exception, so the task can fall back to checking in the build process.
/// </summary>
public sealed class ServerFrameTests
{
    private static readonly TimeSpan Bound = TimeSpan.FromSeconds(30);

    /// <summary>A call with every property set to a value no other property has (found by reflection, so a property added later is covered).</summary>
    private static BuildCall EveryPropertySet()
    {
        var call = new BuildCall();
        foreach (var property in typeof(BuildCall).GetProperties(BindingFlags.Public | BindingFlags.Instance).Where(p => p.CanWrite))
        {
            property.SetValue(call, Distinct(property, property.GetValue(call)));
        }

        return call;
    }

    private static BuildLogEntry EveryEntryPropertySet(BuildLogKind kind)
    {
        var entry = new BuildLogEntry(kind, "message é ✓ " + kind);
        foreach (var property in typeof(BuildLogEntry).GetProperties(BindingFlags.Public | BindingFlags.Instance)
            .Where(p => p.CanWrite && p.Name is not (nameof(BuildLogEntry.Kind) or nameof(BuildLogEntry.Message))))
        {
            property.SetValue(entry, Distinct(property, property.GetValue(entry)));
        }

        return entry;
    }

    private static object Distinct(PropertyInfo property, object? current)
    {
        var type = Nullable.GetUnderlyingType(property.PropertyType) ?? property.PropertyType;
        return type switch
        {
            _ when type == typeof(string) => property.Name + " /tmp/ä ü/" + property.Name.Length,
            _ when type == typeof(bool) => !(bool)(current ?? false),
            _ when type == typeof(int) => property.Name.Length * 7919,
            _ when type == typeof(List<string>) => new List<string> { property.Name + "-1", string.Empty, property.Name + "-3" },
            _ when type == typeof(BuildLogImportance) => BuildLogImportance.Low,
            _ => throw new InvalidOperationException($"no distinct value for {property.Name} of {type}: teach the protocol (and this test) the new type"),
        };
    }

    private static void AssertSameProperties<T>(T expected, T actual)
    {
        foreach (var property in typeof(T).GetProperties(BindingFlags.Public | BindingFlags.Instance).Where(p => p.GetIndexParameters().Length == 0))
        {
            var (want, got) = (property.GetValue(expected), property.GetValue(actual));
            if (want is List<string> wantList)
            {
                Assert.Equal(wantList, Assert.IsType<List<string>>(got));
            }
            else
            {
                Assert.True(Equals(want, got), $"{typeof(T).Name}.{property.Name}: sent '{want}', read '{got}'");
            }
        }
    }

    private static ServerFrame RoundTrip(ServerFrame frame)
    {
        var read = ServerFrame.FromBytes(frame.ToBytes(), out var problem);
        Assert.True(read is not null, problem);
        return read;
    }

    [Fact]
    public void A_run_frame_brings_every_property_of_the_call_across_and_absent_ones_stay_absent()
    {
        var call = EveryPropertySet();
        var read = RoundTrip(new ServerFrame(ServerFrame.Run) { Identity = "ABC123", Call = call });

        Assert.Equal(ServerFrame.Run, read.Kind);
        Assert.Equal(ServerFrame.CurrentProtocol, read.Protocol);
        Assert.Equal("ABC123", read.Identity);
        AssertSameProperties(call, read.Call!);

        var empty = RoundTrip(new ServerFrame(ServerFrame.Run) { Call = new BuildCall() }).Call!;
        AssertSameProperties(new BuildCall(), empty);
        Assert.Null(empty.HostAsErrors);
        Assert.Null(empty.RuleSetFile);
    }

    [Fact]
    public void A_done_frame_brings_every_entry_in_order_with_every_field_and_the_result()
    {
        var entries = new List<BuildLogEntry>
        {
            EveryEntryPropertySet(BuildLogKind.Error),
            EveryEntryPropertySet(BuildLogKind.Warning),
            new(BuildLogKind.Message, "plain"),
        };
        var read = RoundTrip(new ServerFrame(ServerFrame.Done) { Entries = entries, Result = new BuildCheckResult(false, 3, 17) });

        Assert.Equal(ServerFrame.Done, read.Kind);
        Assert.Equal(new BuildCheckResult(false, 3, 17), read.Result);
        Assert.Equal(entries, read.Entries);
        Assert.Null(read.Entry);
        Assert.Null(read.Call);
    }

    [Fact]
    public void Answer_progress_heartbeat_refusal_and_stop_frames_come_back_as_sent()
    {
        var accepted = new ServerFrame(ServerFrame.Accepted) { ProcessId = 4242, Identity = "X" };
        Assert.Equal(accepted, RoundTrip(accepted));
        var progress = EveryEntryPropertySet(BuildLogKind.Message);
        Assert.Equal(progress, RoundTrip(new ServerFrame(ServerFrame.ProgressKind) { Entry = progress }).Entry);
        Assert.Equal(ServerFrame.Alive, RoundTrip(new ServerFrame(ServerFrame.Alive)).Kind);
        Assert.Equal("why not", RoundTrip(new ServerFrame(ServerFrame.Refused) { Reason = "why not" }).Reason);
        Assert.Equal(ServerFrame.Stop, RoundTrip(new ServerFrame(ServerFrame.Stop)).Kind);
    }

    [Fact]
    public void Every_truncation_of_a_frame_is_refused_with_a_reason()
    {
        var bytes = new ServerFrame(ServerFrame.Done) { Entries = [EveryEntryPropertySet(BuildLogKind.Warning)], Result = new BuildCheckResult(true, 0, 1) }.ToBytes();

        for (var length = 0; length < bytes.Length; length++)
        {
            Assert.Null(ServerFrame.FromBytes(bytes.AsSpan(0, length), out var problem));
            Assert.False(string.IsNullOrEmpty(problem), $"no reason for a frame cut at {length} bytes");
        }
    }

    [Fact]
    public void A_payload_cut_short_or_running_on_past_its_fields_is_refused_even_when_the_header_agrees()
    {
        var bytes = new ServerFrame(ServerFrame.Accepted) { ProcessId = 7, Identity = "X" }.ToBytes();

        // The header states the shorter (longer) length: the length checks pass, the fields must not.
        var cut = bytes[..^1];
        BinaryPrimitives.WriteInt32LittleEndian(cut.AsSpan(8), cut.Length - ServerFrame.HeaderLength);
        Assert.Null(ServerFrame.FromBytes(cut, out var cutProblem));
        Assert.Contains("truncated", cutProblem, StringComparison.Ordinal);

        byte[] longer = [.. bytes, 0];
        BinaryPrimitives.WriteInt32LittleEndian(longer.AsSpan(8), longer.Length - ServerFrame.HeaderLength);
        Assert.Null(ServerFrame.FromBytes(longer, out var longProblem));
        Assert.Contains("past its last field", longProblem, StringComparison.Ordinal);
    }

    [Fact]
    public void Foreign_bytes_an_unknown_kind_a_length_out_of_bounds_and_text_that_is_not_utf8_are_refused()
    {
        // Protocol 1's frame: a line of JSON.
        Assert.Null(ServerFrame.FromBytes("{\"Kind\":\"run\",\"Protocol\":1}\n"u8, out var json));
        Assert.Contains("does not speak", json, StringComparison.Ordinal);

        var bytes = new ServerFrame(ServerFrame.Refused) { Reason = "abc" }.ToBytes();
        var unknownKind = (byte[])bytes.Clone();
        unknownKind[ServerFrame.HeaderLength] = 200;
        Assert.Null(ServerFrame.FromBytes(unknownKind, out var kind));
        Assert.Contains("unknown kind", kind, StringComparison.Ordinal);

        var huge = (byte[])bytes.Clone();
        BinaryPrimitives.WriteInt32LittleEndian(huge.AsSpan(8), ServerFrame.MaxPayload + 1);
        Assert.Null(ServerFrame.FromBytes(huge, out var bound));
        Assert.Contains("out of bounds", bound, StringComparison.Ordinal);

        // The reason's text is the last field but the result's marker: its three bytes "abc" made two lone continuation bytes and a 'c'.
        var notUtf8 = (byte[])bytes.Clone();
        var at = Encoding.ASCII.GetString(notUtf8).LastIndexOf("abc", StringComparison.Ordinal);
        notUtf8[at] = 0x80;
        notUtf8[at + 1] = 0xBF;
        Assert.Null(ServerFrame.FromBytes(notUtf8, out var text));
        Assert.Contains("damaged", text, StringComparison.Ordinal);
    }

    [Fact]
    public void A_frame_of_another_protocol_version_is_told_apart_without_reading_its_payload()
    {
        var bytes = new ServerFrame(ServerFrame.Run) { Protocol = ServerFrame.CurrentProtocol + 5, Call = new BuildCall() }.ToBytes();
        bytes[ServerFrame.HeaderLength] = 250;   // its payload may be anything

        var read = ServerFrame.FromBytes(bytes, out _);

        Assert.Equal(ServerFrame.Foreign, read?.Kind);
        Assert.Equal(ServerFrame.CurrentProtocol + 5, read!.Protocol);
    }

    [Fact]
    public void Any_one_byte_changed_in_a_frame_reads_as_a_frame_or_is_refused_never_an_exception()
    {
        var bytes = new ServerFrame(ServerFrame.Run) { Identity = "ID", Call = EveryPropertySet() }.ToBytes();

        for (var i = 0; i < bytes.Length; i++)
        {
            foreach (var flip in new byte[] { 0x01, 0x80, 0xFF })
            {
                var changed = (byte[])bytes.Clone();
                changed[i] ^= flip;
                var read = ServerFrame.FromBytes(changed, out var problem);
                Assert.True(read is not null || !string.IsNullOrEmpty(problem), $"byte {i} ^ {flip:X2}: neither a frame nor a reason");
            }
        }
    }

    [Fact]
    public async Task Frames_sent_over_a_socket_arrive_whole_one_after_another_and_the_peer_closing_is_the_end()
    {
        using var pair = new SocketPair();
        var entries = Enumerable.Range(0, 2000).Select(i => new BuildLogEntry(BuildLogKind.Warning, new string('w', i % 300)) { Line = i }).ToList();
        var sender = Task.Run(() =>
        {
            new ServerFrame(ServerFrame.Accepted) { ProcessId = 9 }.Send(pair.One);
            new ServerFrame(ServerFrame.Done) { Entries = entries, Result = new BuildCheckResult(true, 0, 2000) }.Send(pair.One);
            pair.One.Shutdown(SocketShutdown.Send);
        });

        Assert.Equal(9, ServerFrame.Receive(pair.Two, Bound, CancellationToken.None, out _, out _)?.ProcessId);
        Assert.Equal(entries, ServerFrame.Receive(pair.Two, Bound, CancellationToken.None, out _, out _)?.Entries);
        Assert.Null(ServerFrame.Receive(pair.Two, Bound, CancellationToken.None, out var fault, out _));
        Assert.Equal(FrameFault.End, fault);
        await sender.WaitAsync(Bound);
    }

    [Fact]
    public void A_frame_cut_off_by_the_peer_closing_is_damaged_and_silence_is_silence()
    {
        using (var pair = new SocketPair())
        {
            var bytes = new ServerFrame(ServerFrame.Alive).ToBytes();
            pair.One.Send(bytes.AsSpan(0, bytes.Length - 1));
            pair.One.Shutdown(SocketShutdown.Send);

            Assert.Null(ServerFrame.Receive(pair.Two, Bound, CancellationToken.None, out var fault, out var problem));
            Assert.Equal(FrameFault.Damaged, fault);
            Assert.Contains("truncated", problem, StringComparison.Ordinal);
        }

        using (var quiet = new SocketPair())
        {
            Assert.Null(ServerFrame.Receive(quiet.Two, TimeSpan.FromMilliseconds(300), CancellationToken.None, out var fault, out _));
            Assert.Equal(FrameFault.Silence, fault);
        }
    }

    [Fact]
    public void A_cancelled_wait_for_a_frame_ends_with_the_cancellation()
    {
        using var pair = new SocketPair();
        using var cancellation = new CancellationTokenSource(TimeSpan.FromMilliseconds(300));

        Assert.ThrowsAny<OperationCanceledException>(() => ServerFrame.Receive(pair.Two, Bound, cancellation.Token, out _, out _));
    }

    /// <summary>Two connected ends of a Unix domain socket in a short temporary folder.</summary>
    private sealed class SocketPair : IDisposable
    {
        private readonly string folder = Path.Combine(Path.GetTempPath(), "drf-" + Guid.NewGuid().ToString("N")[..8]);

        public SocketPair()
        {
            Directory.CreateDirectory(folder);
            var endPoint = new UnixDomainSocketEndPoint(Path.Combine(folder, "s"));
            using var listener = new Socket(AddressFamily.Unix, SocketType.Stream, ProtocolType.Unspecified);
            listener.Bind(endPoint);
            listener.Listen(1);
            One = new Socket(AddressFamily.Unix, SocketType.Stream, ProtocolType.Unspecified);
            One.Connect(endPoint);
            Two = listener.Accept();
        }

        public Socket One { get; }

        public Socket Two { get; }

        public void Dispose()
        {
            One.Dispose();
            Two.Dispose();
            Directory.Delete(folder, recursive: true);
        }
    }
}
