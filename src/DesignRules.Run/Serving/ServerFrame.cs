using System.Text;
using System.Text.Json;
using System.Text.Json.Serialization;

namespace DesignRules.Run.Serving;

/// <summary>
/// One message of the evaluation server's protocol: a line of JSON on a local socket. The task sends <c>run</c> (or
/// <c>stop</c>); the server answers <c>accepted</c> or <c>refused</c>, then streams <c>progress</c> and <c>alive</c>
/// (a heartbeat, so the task can tell a long run from a hung server) and ends with <c>done</c>.
/// </summary>
internal sealed record ServerFrame(string Kind)
{
    /// <summary>
    /// The protocol version both ends must speak; raised whenever a frame or <see cref="BuildCall"/> changes shape, so that
    /// a task never talks to a server that would read its request otherwise (it runs in-process instead).
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

    /// <summary>The frame as one line of UTF-8 JSON, newline included.</summary>
    public byte[] ToLine()
    {
        var json = JsonSerializer.SerializeToUtf8Bytes(this, ServerFrameJson.Default.ServerFrame);
        var line = new byte[json.Length + 1];
        json.CopyTo(line, 0);
        line[^1] = (byte)'\n';
        return line;
    }

    /// <summary>Reads a frame from one line; null when the line is not a frame (another program, a damaged line).</summary>
    public static ServerFrame? FromLine(string line)
    {
        try
        {
            return JsonSerializer.Deserialize(line, ServerFrameJson.Default.ServerFrame);
        }
        catch (JsonException)
        {
            return null;
        }
    }

    /// <summary>Reads the next frame from <paramref name="reader"/>; null at the end of the stream or for a line that is not a frame.</summary>
    public static async Task<ServerFrame?> ReadAsync(StreamReader reader, CancellationToken cancellation)
    {
        ArgumentNullException.ThrowIfNull(reader);
        var line = await reader.ReadLineAsync(cancellation).ConfigureAwait(false);
        return line is null ? null : FromLine(line);
    }

    /// <summary>A reader of frames over <paramref name="stream"/> (UTF-8, lines).</summary>
    public static StreamReader Reader(Stream stream) => new(stream, new UTF8Encoding(false), detectEncodingFromByteOrderMarks: false, bufferSize: 65536, leaveOpen: true);
}

/// <summary>The frames' JSON, generated at compile time: the task reads it in the build process, where reflection would JIT cold.</summary>
[JsonSourceGenerationOptions(DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull, UseStringEnumConverter = true)]
[JsonSerializable(typeof(ServerFrame))]
internal sealed partial class ServerFrameJson : JsonSerializerContext;
