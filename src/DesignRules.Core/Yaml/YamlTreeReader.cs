using System.Globalization;
using DesignRules.Diagnostics;
using DesignRules.Loading;
using YamlDotNet.Core;
using YamlDotNet.Core.Events;

namespace DesignRules.Yaml;

/// <summary>
/// Reads YAML text into a located <see cref="YamlNode"/> tree under explicit bounds: file size, node count,
/// nesting depth and alias expansion. Aliases are shared, never copied, and their expanded size is counted,
/// so a file built to expand exponentially is refused at the first alias that crosses the bound.
/// </summary>
internal static class YamlTreeReader
{
    public static YamlNode? Read(string file, string text, LoaderLimits limits, List<Diagnostic> diagnostics)
    {
        if (text.Length > limits.MaxFileCharacters)
        {
            diagnostics.Add(DesignFileDiagnostics.SizeLimit.At(
                SourceSpan.WholeFile(file), $"The file ({text.Length.ToString(CultureInfo.InvariantCulture)} characters)",
                $"{limits.MaxFileCharacters.ToString(CultureInfo.InvariantCulture)} characters"));
            return null;
        }

        // A warm process that read exactly this text of this file before (ParsedTrees, off unless the process asks) reuses
        // that tree; only trees read without any diagnostic are kept, so the reuse is invisible in what the loader reports.
        if (ParsedTrees.Find(file, text, limits) is { } kept)
        {
            return kept;
        }

        var reader = new Reader(file, limits, diagnostics);
        var before = diagnostics.Count;
        try
        {
            var tree = reader.ReadDocument(new Parser(new StringReader(text)));
            if (tree is not null && diagnostics.Count == before)
            {
                ParsedTrees.Keep(file, text, limits, tree);
            }

            return tree;
        }
        catch (YamlException ex)
        {
            var span = new SourceSpan(file, Math.Max(1, (int)ex.Start.Line), Math.Max(1, (int)ex.Start.Column),
                Math.Max(1, (int)ex.End.Line), Math.Max(1, (int)ex.End.Column));
            diagnostics.Add(DesignFileDiagnostics.YamlSyntax.At(span, CleanMessage(ex.Message)));
            return null;
        }
        catch (LimitExceeded)
        {
            return null;
        }
        catch (Exception ex) when (ex is InvalidOperationException or ArgumentException or IndexOutOfRangeException or FormatException or OverflowException)
        {
            // The YAML library can fail on some malformed input with a non-YAML exception; report it at the last good position.
            diagnostics.Add(DesignFileDiagnostics.YamlSyntax.At(reader.LastSpan ?? SourceSpan.WholeFile(file), "the text after this point cannot be read as YAML"));
            return null;
        }
    }

    // YamlDotNet's messages start with "(Line: x, Col: y, Idx: z) - (…): "; the position is already in the span.
    private static string CleanMessage(string message)
    {
        var cut = message.LastIndexOf("): ", StringComparison.Ordinal);
        var text = cut >= 0 && message.StartsWith('(') ? message[(cut + 3)..] : message;
        return text.TrimEnd('.');
    }

    private sealed class LimitExceeded : Exception;

    private sealed class Reader(string file, LoaderLimits limits, List<Diagnostic> diagnostics)
    {
        private readonly Dictionary<string, YamlNode> anchors = new(StringComparer.Ordinal);
        private long total;
        private long characters;

        /// <summary>The span of the last event read, for errors the parser reports without a position.</summary>
        public SourceSpan? LastSpan { get; private set; }

        public YamlNode? ReadDocument(Parser parser)
        {
            parser.Consume<StreamStart>();
            if (parser.Accept<StreamEnd>(out _))
            {
                return null;
            }

            parser.Consume<DocumentStart>();
            var root = parser.Accept<DocumentEnd>(out _) ? null : ReadNode(parser, 0);
            parser.Consume<DocumentEnd>();
            if (parser.Accept<DocumentStart>(out var second))
            {
                diagnostics.Add(DesignFileDiagnostics.WrongShape.At(
                    SpanOf(second), "the file", "one YAML document", "several documents (a second '---')"));
            }

            return root;
        }

        private YamlNode ReadNode(Parser parser, int depth)
        {
            if (depth > limits.MaxDepth)
            {
                Refuse(parser.Current!, "Nesting", $"{limits.MaxDepth.ToString(CultureInfo.InvariantCulture)} levels");
            }

            LastSpan = SpanOf(parser.Current!);
            Count(parser.Current!, 1);
            switch (parser.Current)
            {
                case AnchorAlias alias:
                    parser.MoveNext();
                    if (!anchors.TryGetValue(alias.Value.Value, out var target))
                    {
                        throw new SemanticErrorException(alias.Start, alias.End, $"The alias '*{alias.Value.Value}' names no anchor defined before it");
                    }

                    Count(alias, target.ExpandedWeight);
                    CountCharacters(alias, target.ExpandedCharacters);
                    return target;
                case Scalar scalar:
                    parser.MoveNext();
                    var node = new YamlScalar(scalar.Value, scalar.Style != ScalarStyle.Plain, SpanOf(scalar)) { ExpandedCharacters = scalar.Value.Length };
                    CountCharacters(scalar, scalar.Value.Length);
                    Remember(scalar, node);
                    return node;
                case SequenceStart start:
                {
                    parser.MoveNext();
                    var sequence = new YamlSequence(SpanOf(start));
                    Remember(start, sequence);
                    while (!parser.TryConsume<SequenceEnd>(out _))
                    {
                        var item = ReadNode(parser, depth + 1);
                        sequence.Items.Add(item);
                        sequence.ExpandedWeight = Add(sequence.ExpandedWeight, item.ExpandedWeight);
                        sequence.ExpandedCharacters = Add(sequence.ExpandedCharacters, item.ExpandedCharacters);
                    }

                    return sequence;
                }

                case MappingStart start:
                {
                    parser.MoveNext();
                    var mapping = new YamlMapping(SpanOf(start));
                    Remember(start, mapping);
                    while (!parser.TryConsume<MappingEnd>(out _))
                    {
                        var keyEvent = parser.Current!;
                        var key = ReadNode(parser, depth + 1);
                        var value = ReadNode(parser, depth + 1);
                        if (key is not YamlScalar keyScalar)
                        {
                            diagnostics.Add(DesignFileDiagnostics.WrongShape.At(SpanOf(keyEvent), "a key", "a plain word", key.ShapeName));
                            continue;
                        }

                        mapping.Entries.Add(new(keyScalar, value));
                        mapping.ExpandedWeight = Add(mapping.ExpandedWeight, Add(key.ExpandedWeight, value.ExpandedWeight));
                        mapping.ExpandedCharacters = Add(mapping.ExpandedCharacters, Add(key.ExpandedCharacters, value.ExpandedCharacters));
                    }

                    return mapping;
                }

                default:
                    throw new SemanticErrorException(parser.Current!.Start, parser.Current.End, "Unexpected YAML content");
            }
        }

        private void Remember(NodeEvent e, YamlNode node)
        {
            if (!e.Anchor.IsEmpty)
            {
                anchors[e.Anchor.Value] = node;
            }
        }

        private void Count(ParsingEvent at, long weight)
        {
            total = Add(total, weight);
            if (total > limits.MaxExpandedNodes)
            {
                Refuse(at, "The expanded document (aliases counted as what they stand for)",
                    $"{limits.MaxExpandedNodes.ToString(CultureInfo.InvariantCulture)} nodes");
            }
        }

        // Nodes alone do not bound memory: one long value named by many aliases is few nodes and many characters.
        private void CountCharacters(ParsingEvent at, long count)
        {
            characters = Add(characters, count);
            if (characters > limits.MaxExpandedCharacters)
            {
                Refuse(at, "The expanded text of keys and values (aliases counted as what they stand for)",
                    $"{limits.MaxExpandedCharacters.ToString(CultureInfo.InvariantCulture)} characters");
            }
        }

        private void Refuse(ParsingEvent at, string what, string limit)
        {
            diagnostics.Add(DesignFileDiagnostics.SizeLimit.At(SpanOf(at), what, limit));
            throw new LimitExceeded();
        }

        private static long Add(long a, long b) => a > long.MaxValue - b ? long.MaxValue : a + b;

        private SourceSpan SpanOf(ParsingEvent e) => new(
            file, Math.Max(1, (int)e.Start.Line), Math.Max(1, (int)e.Start.Column),
            Math.Max(1, (int)e.End.Line), Math.Max(1, (int)e.End.Column));
    }
}
