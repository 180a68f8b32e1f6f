using System.Buffers.Binary;
using System.Net.Sockets;
using System.Text;

namespace DesignRules.Run.Serving;

/// <summary>
/// One message of the evaluation server's protocol on a local socket. The task sends <c>run</c> (or <c>stop</c>); the
/// server answers <c>accepted</c> or <c>refused</c>, then streams <c>progress</c> and <c>alive</c> (a heartbeat, so the
/// task can tell a long run from a hung server) and ends with <c>done</c>.
/// <para>
/// On the wire a frame is a 12-byte header — the bytes <c>DRSF</c>, the protocol version and the payload's length (both
/// 32-bit little-endian) — and the payload: the kind (one byte), then every field in a fixed order (<see cref="Encode"/>).
/// Hand-written rather than JSON: the task reads and writes frames in the build's own process on every build, where a
/// serializer's generic code (and the async plumbing around a line reader) is compiled just in time afresh each time,
/// since ReadyToRun cannot compile generic instantiations over our types across the framework's version boundary.
/// A frame that is truncated, longer than <see cref="MaxPayload"/>, of an unknown kind, or whose payload does not end
/// exactly where its length says is not a frame: the reader says so, and the task checks in-process instead.
/// </para>
/// </summary>
internal sealed record ServerFrame(string Kind)
{
    /// <summary>
    /// The protocol version both ends must speak; raised whenever a frame or <see cref="BuildCall"/> changes shape, so that
    /// a task never talks to a server that would read its request otherwise (it runs in-process instead). Protocol 1 was
    /// a line of JSON per frame; 2 is the binary frame described above.
    /// </summary>
    public const int CurrentProtocol = 2;

    /// <summary>The client's request to run.</summary>
    public const string Run = "run";

    /// <summary>The client's request that the server exit (tests, benchmarks, anyone who wants it gone now).</summary>
    public const string Stop = "stop";

    /// <summary>The server takes the run.</summary>
    public const string Accepted = "accepted";

    /// <summary>The server does not take the run (another protocol or identity); <see cref="Reason"/> says why.</summary>
    public const string Refused = "refused";

    /// <summary>A progress entry, logged at once.</summary>
    public const string ProgressKind = "progress";

    /// <summary>The run is still going.</summary>
    public const string Alive = "alive";

    /// <summary>The run ended: <see cref="Entries"/> and <see cref="Result"/>.</summary>
    public const string Done = "done";

    /// <summary>
    /// A frame of another protocol version (only its header read, the payload left undecoded): <see cref="Protocol"/> says
    /// which. Never sent.
    /// </summary>
    public const string Foreign = "foreign";

    /// <summary>The header's length: magic, protocol, payload length.</summary>
    public const int HeaderLength = 12;

    /// <summary>
    /// The longest payload either end reads (64 MiB): far above any real run's answer (a few hundred bytes per finding), and
    /// a bound, so a damaged length never makes a reader allocate or wait for gigabytes.
    /// </summary>
    public const int MaxPayload = 64 * 1024 * 1024;

    /// <summary>The first bytes of every frame ("DRSF"): a peer that is not this protocol's (another program, protocol 1's JSON) is told apart at once.</summary>
    private static ReadOnlySpan<byte> Magic => "DRSF"u8;

    // The kinds' codes on the wire, in the order of Kinds (index = code - 1).
    private static readonly string[] Kinds = [Run, Stop, Accepted, Refused, ProgressKind, Alive, Done];

    private static readonly UTF8Encoding Utf8 = new(encoderShouldEmitUTF8Identifier: false, throwOnInvalidBytes: true);

    /// <summary>The sender's protocol version.</summary>
    public int Protocol { get; init; } = CurrentProtocol;

    /// <summary>The tool identity the client expects or the server has (<see cref="ServerAddress.Identity"/>).</summary>
    public string? Identity { get; init; }

    /// <summary>The server's process id (in <c>accepted</c>), for the task's log line.</summary>
    public int ProcessId { get; init; }

    /// <summary>The run's inputs (in <c>run</c>).</summary>
    public BuildCall? Call { get; init; }

    /// <summary>One progress entry.</summary>
    public BuildLogEntry? Entry { get; init; }

    /// <summary>Every other entry, in the order the in-process run would have logged them (in <c>done</c>).</summary>
    public List<BuildLogEntry>? Entries { get; init; }

    /// <summary>The run's result (in <c>done</c>).</summary>
    public BuildCheckResult? Result { get; init; }

    /// <summary>Why a run was refused.</summary>
    public string? Reason { get; init; }

    /// <summary>The frame's bytes: header and payload.</summary>
    public byte[] ToBytes()
    {
        var code = Array.IndexOf(Kinds, Kind) + 1;
        if (code == 0)
        {
            throw new InvalidOperationException($"'{Kind}' is not a frame kind that is sent");
        }

        using var payload = new MemoryStream();
        payload.Position = HeaderLength;
        using (var writer = new BinaryWriter(payload, Utf8, leaveOpen: true))
        {
            writer.Write((byte)code);
            Encode(writer);
        }

        var bytes = payload.ToArray();
        Magic.CopyTo(bytes);
        BinaryPrimitives.WriteInt32LittleEndian(bytes.AsSpan(4), Protocol);
        BinaryPrimitives.WriteInt32LittleEndian(bytes.AsSpan(8), bytes.Length - HeaderLength);
        return bytes;
    }

    /// <summary>
    /// Reads a frame from its bytes (header and payload, nothing after); null when they are not one frame of this protocol
    /// (<paramref name="problem"/> says why), a <see cref="Foreign"/> frame for another protocol's.
    /// </summary>
    public static ServerFrame? FromBytes(ReadOnlySpan<byte> bytes, out string? problem)
    {
        if (bytes.Length < HeaderLength)
        {
            problem = "the frame is shorter than its header";
            return null;
        }

        if (!TryHeader(bytes[..HeaderLength], out var protocol, out var length, out problem))
        {
            return null;
        }

        if (protocol != CurrentProtocol)
        {
            return new ServerFrame(Foreign) { Protocol = protocol };
        }

        if (bytes.Length - HeaderLength != length)
        {
            problem = "the frame's length is not the length its header states";
            return null;
        }

        return Decode(bytes[HeaderLength..].ToArray(), out problem);
    }

    /// <summary>Reads a header: false (and why) when it is not one of this protocol family's.</summary>
    private static bool TryHeader(ReadOnlySpan<byte> header, out int protocol, out int length, out string? problem)
    {
        protocol = BinaryPrimitives.ReadInt32LittleEndian(header[4..]);
        length = BinaryPrimitives.ReadInt32LittleEndian(header[8..]);
        problem = !header[..4].SequenceEqual(Magic) ? "the peer does not speak the evaluation server's protocol"
            : length is < 1 or > MaxPayload ? "the frame's stated length is out of bounds"
            : null;
        return problem is null;
    }

    private static ServerFrame? Decode(byte[] payload, out string? problem)
    {
        try
        {
            using var stream = new MemoryStream(payload, writable: false);
            using var reader = new BinaryReader(stream, Utf8);
            var code = reader.ReadByte();
            if (code < 1 || code > Kinds.Length)
            {
                problem = "the frame is of an unknown kind";
                return null;
            }

            var frame = Decode(Kinds[code - 1], reader);
            if (stream.Position != stream.Length)
            {
                problem = "the frame's payload goes on past its last field";
                return null;
            }

            problem = null;
            return frame;
        }
        // BinaryReader: EndOfStreamException (an IOException) past the end, IOException for a negative string length,
        // FormatException for a damaged length, DecoderFallbackException for bytes that are not UTF-8.
        catch (Exception ex) when (ex is IOException or InvalidDataException or DecoderFallbackException or FormatException)
        {
            problem = "the frame is truncated or damaged";
            return null;
        }
    }

    /// <summary>
    /// Writes every field in a fixed order, whatever the kind (absent ones as a single byte): one shape, so the reader has
    /// no case to get out of step with the writer.
    /// </summary>
    private void Encode(BinaryWriter writer)
    {
        WriteText(writer, Identity);
        writer.Write(ProcessId);
        WriteText(writer, Reason);
        writer.Write(Call is not null);
        if (Call is not null)
        {
            WriteCall(writer, Call);
        }

        writer.Write(Entry is not null);
        if (Entry is not null)
        {
            WriteEntry(writer, Entry);
        }

        writer.Write(Entries?.Count ?? -1);
        foreach (var entry in Entries ?? [])
        {
            WriteEntry(writer, entry);
        }

        writer.Write(Result is not null);
        if (Result is not null)
        {
            writer.Write(Result.Success);
            writer.Write(Result.ErrorCount);
            writer.Write(Result.WarningCount);
        }
    }

    private static ServerFrame Decode(string kind, BinaryReader reader)
    {
        var identity = ReadText(reader);
        var processId = reader.ReadInt32();
        var reason = ReadText(reader);
        var call = reader.ReadBoolean() ? ReadCall(reader) : null;
        var entry = reader.ReadBoolean() ? ReadEntry(reader) : null;
        List<BuildLogEntry>? entries = null;
        if (ReadCount(reader) is { } count)
        {
            entries = new List<BuildLogEntry>(count);
            for (var i = 0; i < count; i++)
            {
                entries.Add(ReadEntry(reader));
            }
        }

        var result = reader.ReadBoolean() ? new BuildCheckResult(reader.ReadBoolean(), reader.ReadInt32(), reader.ReadInt32()) : null;
        return new ServerFrame(kind)
        {
            Identity = identity,
            ProcessId = processId,
            Reason = reason,
            Call = call,
            Entry = entry,
            Entries = entries,
            Result = result,
        };
    }

    // BuildCall's properties in declaration order; a property added there and not here fails the round-trip test
    // (ServerFrameTests), and changes the protocol version.
    private static void WriteCall(BinaryWriter writer, BuildCall call)
    {
        WriteTexts(writer, call.Files);
        WriteText(writer, call.RepositoryRoot);
        WriteText(writer, call.RuleSetFile);
        WriteText(writer, call.SarifFile);
        WriteText(writer, call.JsonFile);
        WriteText(writer, call.PagesFolder);
        WriteText(writer, call.TemplateFolder);
        WriteText(writer, call.HelpUriBase);
        WriteText(writer, call.HelpFolder);
        WriteText(writer, call.StampFile);
        WriteText(writer, call.LoadedFilesFile);
        WriteText(writer, call.ProjectFile);
        WriteText(writer, call.TaskProjectFile);
        WriteText(writer, call.Searched);
        WriteText(writer, call.Today);
        WriteText(writer, call.Levels);
        writer.Write(call.TreatWarningsAsErrors);
        WriteText(writer, call.WarningsNotAsErrors);
        WriteText(writer, call.NoWarn);
        WriteText(writer, call.WarningsAsErrors);
        WriteTexts(writer, call.HostAsErrors);
        WriteText(writer, call.ReportRoot);
        writer.Write(call.EndPositions);
        WriteText(writer, call.CacheFolder);
        WriteText(writer, call.BaselineFile);
        writer.Write(call.NewOnly);
        writer.Write(call.HeadStart);
    }

    private static BuildCall ReadCall(BinaryReader reader) => new()
    {
        Files = ReadTexts(reader) ?? throw new InvalidDataException("a run without its file list"),
        RepositoryRoot = ReadText(reader),
        RuleSetFile = ReadText(reader),
        SarifFile = ReadText(reader),
        JsonFile = ReadText(reader),
        PagesFolder = ReadText(reader),
        TemplateFolder = ReadText(reader),
        HelpUriBase = ReadText(reader),
        HelpFolder = ReadText(reader),
        StampFile = ReadText(reader),
        LoadedFilesFile = ReadText(reader),
        ProjectFile = ReadText(reader),
        TaskProjectFile = ReadText(reader),
        Searched = ReadText(reader),
        Today = ReadText(reader),
        Levels = ReadText(reader),
        TreatWarningsAsErrors = reader.ReadBoolean(),
        WarningsNotAsErrors = ReadText(reader),
        NoWarn = ReadText(reader),
        WarningsAsErrors = ReadText(reader),
        HostAsErrors = ReadTexts(reader),
        ReportRoot = ReadText(reader),
        EndPositions = reader.ReadBoolean(),
        CacheFolder = ReadText(reader),
        BaselineFile = ReadText(reader),
        NewOnly = reader.ReadBoolean(),
        HeadStart = reader.ReadBoolean(),
    };

    private static void WriteEntry(BinaryWriter writer, BuildLogEntry entry)
    {
        writer.Write((byte)entry.Kind);
        writer.Write(entry.Message);
        writer.Write((byte)entry.Importance);
        WriteText(writer, entry.Code);
        WriteText(writer, entry.HelpLink);
        WriteText(writer, entry.File);
        writer.Write(entry.Line);
        writer.Write(entry.Column);
        writer.Write(entry.EndLine);
        writer.Write(entry.EndColumn);
        writer.Write(entry.Progress);
    }

    private static BuildLogEntry ReadEntry(BinaryReader reader)
    {
        var kind = reader.ReadByte();
        var message = reader.ReadString();
        var importance = reader.ReadByte();
        if (kind > (byte)BuildLogKind.Message || importance > (byte)BuildLogImportance.Low)
        {
            throw new InvalidDataException("an entry of an unknown kind or importance");
        }

        return new BuildLogEntry((BuildLogKind)kind, message)
        {
            Importance = (BuildLogImportance)importance,
            Code = ReadText(reader),
            HelpLink = ReadText(reader),
            File = ReadText(reader),
            Line = reader.ReadInt32(),
            Column = reader.ReadInt32(),
            EndLine = reader.ReadInt32(),
            EndColumn = reader.ReadInt32(),
            Progress = reader.ReadBoolean(),
        };
    }

    private static void WriteText(BinaryWriter writer, string? text)
    {
        writer.Write(text is not null);
        if (text is not null)
        {
            writer.Write(text);
        }
    }

    private static string? ReadText(BinaryReader reader) => reader.ReadBoolean() ? reader.ReadString() : null;

    private static void WriteTexts(BinaryWriter writer, List<string>? texts)
    {
        writer.Write(texts?.Count ?? -1);
        foreach (var text in texts ?? [])
        {
            writer.Write(text);
        }
    }

    private static List<string>? ReadTexts(BinaryReader reader)
    {
        if (ReadCount(reader) is not { } count)
        {
            return null;
        }

        var texts = new List<string>(count);
        for (var i = 0; i < count; i++)
        {
            texts.Add(reader.ReadString());
        }

        return texts;
    }

    /// <summary>A list's count, or null for an absent list; a count the rest of the payload cannot hold is damage.</summary>
    private static int? ReadCount(BinaryReader reader)
    {
        var count = reader.ReadInt32();
        if (count < -1 || count > reader.BaseStream.Length - reader.BaseStream.Position)
        {
            throw new InvalidDataException("a list's count is out of bounds");
        }

        return count < 0 ? null : count;
    }

    /// <summary>
    /// Sends one frame, all of it or an exception (the socket's <see cref="Socket.SendTimeout"/> bounds a peer that does
    /// not read).
    /// </summary>
    public void Send(Socket socket)
    {
        ArgumentNullException.ThrowIfNull(socket);
        var bytes = ToBytes();
        var sent = 0;
        while (sent < bytes.Length)
        {
            sent += socket.Send(bytes, sent, bytes.Length - sent, SocketFlags.None);
        }
    }

    /// <summary>
    /// Receives the next frame, waiting at most <paramref name="limit"/> for all of it: null, and in <paramref name="fault"/>
    /// and <paramref name="problem"/> why, for silence, the end of the stream, or bytes that are not a frame of this
    /// protocol; a <see cref="Foreign"/> frame for another version's. Synchronous (a readiness wait, then a read, until the
    /// frame is whole): no async machinery to compile in the build's process. <paramref name="cancellation"/> is looked at
    /// every quarter second at least (whoever cancels may also close the socket, which ends the wait at once).
    /// </summary>
    public static ServerFrame? Receive(Socket socket, TimeSpan limit, CancellationToken cancellation, out FrameFault fault, out string? problem)
    {
        ArgumentNullException.ThrowIfNull(socket);
        var deadline = Environment.TickCount64 + (long)limit.TotalMilliseconds;
        var header = new byte[HeaderLength];
        if ((fault = ReceiveExactly(socket, header, deadline, atFrameStart: true, cancellation)) != FrameFault.None)
        {
            problem = fault == FrameFault.Damaged ? "the frame is truncated" : null;
            return null;
        }

        if (!TryHeader(header, out var protocol, out var length, out problem))
        {
            fault = FrameFault.Damaged;
            return null;
        }

        if (protocol != CurrentProtocol)
        {
            // Another version's payload is not read: the connection ends after this frame's answer.
            return new ServerFrame(Foreign) { Protocol = protocol };
        }

        var payload = new byte[length];
        if ((fault = ReceiveExactly(socket, payload, deadline, atFrameStart: false, cancellation)) != FrameFault.None)
        {
            problem = fault == FrameFault.Damaged ? "the frame is truncated" : null;
            return null;
        }

        var frame = Decode(payload, out problem);
        fault = frame is null ? FrameFault.Damaged : FrameFault.None;
        return frame;
    }

    private static FrameFault ReceiveExactly(Socket socket, byte[] buffer, long deadline, bool atFrameStart, CancellationToken cancellation)
    {
        var received = 0;
        while (received < buffer.Length)
        {
            cancellation.ThrowIfCancellationRequested();
            var left = deadline - Environment.TickCount64;
            if (left <= 0)
            {
                return FrameFault.Silence;
            }

            // At most a quarter second per wait, so a cancelled build is seen even when nobody closes the socket.
            if (!socket.Poll(TimeSpan.FromMilliseconds(Math.Min(left, 250)), SelectMode.SelectRead))
            {
                continue;
            }

            var count = socket.Receive(buffer, received, buffer.Length - received, SocketFlags.None);
            if (count == 0)
            {
                // The peer closed the connection: between frames that is its end, inside one a truncated frame.
                return atFrameStart && received == 0 ? FrameFault.End : FrameFault.Damaged;
            }

            received += count;
        }

        return FrameFault.None;
    }
}

/// <summary>Why <see cref="ServerFrame.Receive"/> returned no frame.</summary>
internal enum FrameFault
{
    /// <summary>A frame was read.</summary>
    None,

    /// <summary>Nothing (or not all of a frame) came within the limit.</summary>
    Silence,

    /// <summary>The peer closed the connection between frames.</summary>
    End,

    /// <summary>Bytes that are not a frame of this protocol: another program, a truncated or damaged frame.</summary>
    Damaged,
}
