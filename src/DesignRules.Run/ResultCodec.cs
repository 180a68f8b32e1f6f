using System.Text.Json;
using System.Text.Json.Serialization;
using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Rules;

namespace DesignRules.Run;

/// <summary>
/// The results cache's own encoding of one design's result, independent of the JSON report's format. Every change to
/// what it writes must raise <see cref="FormatVersion"/>: an entry of another version is foreign and re-evaluated.
/// </summary>
internal static class ResultCodec
{
    /// <summary>
    /// The version of this encoding, part of every entry's key. 3: a figure keeps its temperature; 4: a finding keeps its fix
    /// hint; 5: a stage's plots keep their loop-gain and step plots (an entry of 4 would replay a page without them), and a
    /// plot its noise densities, a stage its noise figures; 6: a fix hint keeps its alternatives; 7: a plot's numbers as
    /// bytes (<see cref="DoublesAsBytes"/>).
    /// </summary>
    public const int FormatVersion = 7;

    // Source-generated (de)serializers: the build's MSBuild process reads entries cold on every build, and the reflection
    // serializer would first emit and JIT its accessors there; the JSON written is the same.
    private static readonly ResultCodecJson Json = ResultCodecJson.Default;

    public static byte[] Encode(DesignResult result)
    {
        var s = result.Summary;
        var stored = new StoredResult(
            result.Findings.Select(FindingCodec.ToStored).ToList(),
            s.DesignFigures.Select(FigureCodec.ToStored).ToList(),
            s.StageFigures.Select(p => new StoredStageFigures(p.Key, p.Value.Select(FigureCodec.ToStored).ToList())).ToList(),
            s.Plots.ToList(),
            s.Yields.ToList(),
            s.Requirements.ToList());
        return JsonSerializer.SerializeToUtf8Bytes(stored, Json.StoredResult);
    }

    /// <summary>The result stored in <paramref name="bytes"/>, for <paramref name="design"/> as loaded now.</summary>
    public static DesignResult Decode(ReadOnlySpan<byte> bytes, Design design) => Decode(Read(bytes), design);

    /// <summary>Reads an entry's payload into its stored form (the costly part of a decode: parsing the JSON).</summary>
    public static StoredResult Read(ReadOnlySpan<byte> bytes) =>
        JsonSerializer.Deserialize(bytes, Json.StoredResult) ?? throw new JsonException("empty entry");

    /// <summary>
    /// A design's result from its stored form. The stored form is shared between runs (<see cref="DecodedEntries"/>), so
    /// everything handed out here is a fresh object or a fresh list; nothing a run does to its result reaches the memo.
    /// </summary>
    public static DesignResult Decode(StoredResult stored, Design design)
    {
        ArgumentNullException.ThrowIfNull(stored);
        var summary = new DesignSummary(
            design,
            stored.DesignFigures.Select(FigureCodec.FromStored).ToList(),
            stored.StageFigures.Select(p => new KeyValuePair<string, IReadOnlyList<Figure>>(p.Stage, p.Figures.Select(FigureCodec.FromStored).ToList())).ToList())
        {
            Plots = [.. stored.Plots],
            Yields = [.. stored.Yields],
            Requirements = [.. stored.Requirements],
        };
        return new DesignResult(stored.Findings.Select(FindingCodec.FromStored).ToList(), summary);
    }

    /// <summary>The findings in the codec's form, for keys that depend on them (a design's page).</summary>
    public static byte[] EncodeFindings(IEnumerable<Finding> findings) =>
        JsonSerializer.SerializeToUtf8Bytes(findings.Select(FindingCodec.ToStored).ToList(), Json.ListStoredFinding);

    internal sealed record StoredResult(
        List<StoredFinding> Findings,
        List<StoredFigure> DesignFigures,
        List<StoredStageFigures> StageFigures,
        List<StagePlots> Plots,
        List<YieldEstimate> Yields,
        List<RequirementVerdict> Requirements);

    internal sealed record StoredStageFigures(string Stage, List<StoredFigure> Figures);

    internal sealed record StoredFinding(
        string RuleId, string Title, int Severity, string Message, string File, int Line, int Column, int EndLine, int EndColumn,
        string HelpPage, string? DesignId, string? StageId, string? Waiver, List<StoredFigure> Figures, StoredFix? Fix = null);

    internal sealed record StoredFix(
        FixKind Kind, string Subject, double Value, string Unit, string Text, bool BeyondPartClasses,
        string? Replacement, string? File, int Line, int Column, int EndLine, int EndColumn, List<StoredFix>? Alternatives = null);

    internal sealed record StoredFigure(string Kind, string? Subject, double Value, double? Limit, double? Margin, double? Temperature = null);

    private static class FindingCodec
    {
        public static StoredFinding ToStored(Finding f) => new(
            f.RuleId, f.Title, (int)f.Severity, f.Message, f.Span.File, f.Span.Line, f.Span.Column, f.Span.EndLine, f.Span.EndColumn,
            f.HelpPage, f.DesignId, f.StageId, f.Waiver, f.Figures.Select(FigureCodec.ToStored).ToList(), f.Fix is { } x ? ToStored(x) : null);

        private static StoredFix ToStored(FixHint x) => new(x.Kind, x.Subject, x.Value, x.Unit, x.Text, x.BeyondPartClasses, x.Replacement, x.ValueSpan?.File,
            x.ValueSpan?.Line ?? 0, x.ValueSpan?.Column ?? 0, x.ValueSpan?.EndLine ?? 0, x.ValueSpan?.EndColumn ?? 0,
            x.Alternatives.Count > 0 ? x.Alternatives.Select(ToStored).ToList() : null);

        private static FixHint FromStored(StoredFix x) =>
            new(Enum.IsDefined(x.Kind) ? x.Kind : throw new JsonException("unknown fix kind"), x.Subject, x.Value, x.Unit, x.Text)
            {
                BeyondPartClasses = x.BeyondPartClasses,
                Replacement = x.Replacement,
                ValueSpan = x.File is null ? null : new SourceSpan(x.File, x.Line, x.Column, x.EndLine, x.EndColumn),
                Alternatives = x.Alternatives?.Select(FromStored).ToList() ?? [],
            };

        public static Finding FromStored(StoredFinding s) => new(
            s.RuleId, s.Title, Enum.IsDefined((Severity)s.Severity) ? (Severity)s.Severity : throw new JsonException("unknown severity"),
            s.Message, new SourceSpan(s.File, s.Line, s.Column, s.EndLine, s.EndColumn), s.HelpPage, s.DesignId, s.StageId, s.Waiver,
            s.Figures.Select(FigureCodec.FromStored).ToList())
        {
            Fix = s.Fix is { } x ? FromStored(x) : null,
        };
    }

    /// <summary>The one place the cache knows the shape of a figure (the typed figure keys will change it here only).</summary>
    private static class FigureCodec
    {
        private static readonly Dictionary<string, FigureKind> Kinds = FigureKinds.All.ToDictionary(k => k.Name, StringComparer.Ordinal);

        public static StoredFigure ToStored(Figure f) => new(f.Key.Kind.Name, f.Key.Subject, f.Value, f.Limit, f.Margin, f.Temperature);

        // A kind this version does not know makes the entry foreign: it is re-evaluated, never guessed.
        public static Figure FromStored(StoredFigure s) =>
            new(new FigureKey(Kinds.TryGetValue(s.Kind, out var kind) ? kind : throw new JsonException($"unknown figure kind '{s.Kind}'"), s.Subject), s.Value)
            {
                Limit = s.Limit,
                Margin = s.Margin,
                Temperature = s.Temperature,
            };
    }
}

/// <summary>
/// The results cache's JSON, generated at compile time (no reflection, nothing emitted at run time). Every type it
/// reaches from <see cref="ResultCodec.StoredResult"/> is generated with it, a type that holds a list of itself included
/// (a fix hint's alternatives); <c>ResultCodecTests</c> fills every member by reflection and round-trips it.
/// </summary>
[JsonSourceGenerationOptions(NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals, IncludeFields = false, WriteIndented = false,
    Converters = [typeof(DoublesAsBytes)])]
[JsonSerializable(typeof(ResultCodec.StoredResult))]
[JsonSerializable(typeof(List<ResultCodec.StoredFinding>))]
internal sealed partial class ResultCodecJson : JsonSerializerContext;

/// <summary>
/// A list of numbers (a plot's waveform, frequencies, samples) as the Base64 text of its IEEE 754 binary64 values,
/// little-endian. A cached design's plots are thousands of numbers; as decimal text they were most of what reading the
/// cache cost (parsing each number and growing a list), and the bytes give back every value bit for bit, NaN included.
/// </summary>
internal sealed class DoublesAsBytes : JsonConverter<IReadOnlyList<double>>
{
    public override IReadOnlyList<double> Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
    {
        if (reader.TokenType != JsonTokenType.String)
        {
            throw new JsonException("a list of numbers is stored as Base64 text");
        }

        var bytes = reader.GetBytesFromBase64();
        if (bytes.Length % sizeof(double) != 0)
        {
            throw new JsonException("a list of numbers holds a whole number of 8-byte values");
        }

        var values = new double[bytes.Length / sizeof(double)];
        for (var i = 0; i < values.Length; i++)
        {
            values[i] = System.Buffers.Binary.BinaryPrimitives.ReadDoubleLittleEndian(bytes.AsSpan(i * sizeof(double)));
        }

        return values;
    }

    public override void Write(Utf8JsonWriter writer, IReadOnlyList<double> value, JsonSerializerOptions options)
    {
        var bytes = new byte[value.Count * sizeof(double)];
        for (var i = 0; i < value.Count; i++)
        {
            System.Buffers.Binary.BinaryPrimitives.WriteDoubleLittleEndian(bytes.AsSpan(i * sizeof(double)), value[i]);
        }

        writer.WriteBase64StringValue(bytes);
    }
}
