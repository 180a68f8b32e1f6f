using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Quantities;
using DesignRules.Yaml;

namespace DesignRules.Loading;

/// <summary>Reads a design file (top-level key <c>design:</c>) into a <see cref="Design"/>, resolving parts in a catalogue.</summary>
/// <summary>The header of a design file, read before its parts libraries are loaded.</summary>
internal sealed record DesignHeader(Located<string>? Id, string Title, string Summary, IReadOnlyList<Located<string>> Libraries);

internal static class DesignReader
{
    /// <summary>Names of pages the tool writes itself beside the design pages; no design id may take one.</summary>
    internal static readonly HashSet<string> ReservedPageNames = new(StringComparer.Ordinal) { "index" };

    private static readonly Dictionary<string, WaveformKind> Waveforms = new(StringComparer.Ordinal)
    {
        ["sine"] = WaveformKind.Sine, ["triangle"] = WaveformKind.Triangle, ["square"] = WaveformKind.Square,
        ["dc"] = WaveformKind.Dc, ["sum"] = WaveformKind.Sum,
    };

    private static readonly Dictionary<string, TransferKind> Transfers = new(StringComparer.Ordinal)
    {
        ["gain"] = TransferKind.Gain, ["absolute-value"] = TransferKind.AbsoluteValue,
        ["half-wave-positive"] = TransferKind.HalfWavePositive, ["half-wave-negative"] = TransferKind.HalfWaveNegative,
        ["peak"] = TransferKind.Peak, ["average"] = TransferKind.Average,
    };

    private static readonly Dictionary<string, string> SeriesNames = new[] { "E6", "E12", "E24", "E48", "E96", "E192" }
        .ToDictionary(s => s, s => s, StringComparer.Ordinal);

    /// <summary>Reads the header and library references; the catalogue is built by the caller from them.</summary>
    public static DesignHeader ReadHeader(MappingReader root)
    {
        var header = root.Child("design", "the design header", required: true, "id, title and summary");
        var id = header?.Id("id", required: true);
        if (id is not null && ReservedPageNames.Contains(id.Value))
        {
            // The design's page would be written over the page the tool writes under that name itself.
            root.Diagnostics.Add(DesignFileDiagnostics.DuplicateId.At(id.Span, "design", id.Value,
                $"the pages folder's own page {id.Value}.md, which the tool writes itself"));
            id = null;
        }

        var title = header?.Text("title", required: false, "a title")?.Value ?? string.Empty;
        var summary = header?.Text("summary", required: false, "a summary")?.Value ?? string.Empty;
        header?.Finish();
        var libraries = root.List("libraries", required: false, "paths of parts files")
            .Select(n => PartsReader.ReadPath(n, "libraries", root.Diagnostics)).OfType<Located<string>>().ToList();
        return new DesignHeader(id, title, summary, libraries);
    }

    public static Design? Read(string file, MappingReader root, DesignHeader header, IReadOnlyList<PartsLibrary> libraries, PartsCatalog catalog)
    {
        var (id, title, summary, _) = header;

        var series = root.Choice("e-series", SeriesNames, required: false);
        var capacitorSeries = root.Choice("capacitor-e-series", SeriesNames, required: false);
        var supplies = ReadSupplies(root);
        var source = ReadSource(root);
        var load = ReadLoad(root);
        var stages = ReadStages(root, catalog);
        var requirements = ReadRequirements(root.Child("requires", "the design's requirements", false, string.Empty), root.Span);
        var waivers = ReadWaivers(root, stages);
        var hazards = ReadHazards(root);
        var temperature = root.Range("temperature", Dimension.Temperature, required: false, OperatingRange);
        root.Finish();

        if (id is null || supplies is null || source is null || load is null || stages is null)
        {
            return null;
        }

        return new Design(id, title, summary, file, series is null ? null : new Located<string>(series.Value, series.Span),
            supplies, source, load, stages, requirements, waivers, libraries)
        {
            Hazards = hazards,
            CapacitorESeries = capacitorSeries is null ? null : new Located<string>(capacitorSeries.Value, capacitorSeries.Span),
            Temperature = temperature,
        };
    }

    /// <summary>An operating range lies between −100 °C and 250 °C, beyond what any signal-chain part is rated for.</summary>
    private static string? OperatingRange(QuantityRange r) =>
        r.Low.Value < -100 || r.High.Value > 250
            ? "an operating temperature range lies within -100 °C..250 °C, e.g. temperature: -40 °C..85 °C"
            : null;

    /// <summary>
    /// <c>hazards: [mains]</c>, or the long form <c>hazards: { kinds: [mains], note: ... }</c>; unknown kinds are
    /// reported with the known ones and a "did you mean".
    /// </summary>
    private static Hazards? ReadHazards(MappingReader root)
    {
        var known = string.Join(", ", Hazards.Names.Keys);
        var node = root.Node("hazards", required: false, string.Empty);
        YamlNode? list = node;
        Located<string>? note = null;
        if (node is YamlMapping)
        {
            var m = root.Child("hazards", "the hazard declaration", required: false, string.Empty)!;
            list = m.Node("kinds", required: true, "one or more of " + known);
            note = m.Text("note", required: false, "where the hazard is, for people");
            m.Finish();
        }

        if (list is null)
        {
            return null;
        }

        if (list is not YamlSequence seq)
        {
            d(root).Add(DesignFileDiagnostics.WrongShape.At(list.Span, "hazards",
                $"a list of hazard kinds ({known}), or a mapping with 'kinds' and 'note'", list.ShapeName));
            return null;
        }

        if (seq.Items.Count == 0)
        {
            d(root).Add(DesignFileDiagnostics.MissingKey.At(seq.Span, "the hazard declaration", "kinds",
                $"at least one of {known}; leave 'hazards' out when the chain touches none"));
            return null;
        }

        var kinds = new List<Located<HazardKind>>();
        var complete = true;
        foreach (var item in seq.Items)
        {
            if (item is not YamlScalar scalar)
            {
                d(root).Add(DesignFileDiagnostics.WrongShape.At(item.Span, "a hazard kind", $"a single word ({known})", item.ShapeName));
                complete = false;
                continue;
            }

            var kind = root.ReadChoice(scalar, "hazards", Hazards.Names);
            complete &= kind is not null;
            if (kind is not null && kinds.All(k => k.Value != kind.Value))
            {
                kinds.Add(kind);
            }
        }

        return complete ? new Hazards(kinds, note, node!.Span) : null;
    }

    private static Supplies? ReadSupplies(MappingReader root)
    {
        var m = root.Child("supplies", "the supplies", required: true, "positive and negative rail voltages");
        if (m is null)
        {
            return null;
        }

        var railRange = ValueChecks.Within(0, 1000, "a rail lies within ±1 kV");
        var positive = m.Quantity("positive", Dimension.Voltage, required: true, railRange);
        var negative = m.Quantity("negative", Dimension.Voltage, new Quantity(0, Dimension.Voltage), railRange);
        m.Finish();
        if (positive is null)
        {
            return null;
        }

        if (positive.Value.Value <= negative.Value.Value)
        {
            d(m).Add(DesignFileDiagnostics.OutOfRange.At(positive.Span, positive.Value.Format(), "positive", $"the positive rail must be above the negative rail ({negative.Value.Format()})"));
            return null;
        }

        return new Supplies(positive, negative);
    }

    private static List<Diagnostic> d(MappingReader m) => m.Diagnostics;

    private static SignalSource? ReadSource(MappingReader root)
    {
        var m = root.Child("source", "the source", required: true, "waveform, amplitude, frequency or band, impedance");
        if (m is null)
        {
            return null;
        }

        var waveform = ReadWaveform(m, "the source", nested: false);
        var impedance = m.Quantity("impedance", Dimension.Resistance, new Quantity(0, Dimension.Resistance), ValueChecks.NotNegative);
        var commonMode = m.Quantity("common-mode", Dimension.Voltage, required: false);
        m.Finish();
        return waveform is null ? null : new SignalSource(waveform, impedance, commonMode, m.Span);
    }

    private static Waveform? ReadWaveform(MappingReader m, string what, bool nested)
    {
        var kind = m.Choice("waveform", Waveforms, required: true);
        var isDc = kind?.Value == WaveformKind.Dc;
        var isSum = kind?.Value == WaveformKind.Sum;
        var amplitude = isDc || isSum ? null : m.Quantity("amplitude", Dimension.Voltage, required: kind is not null, ValueChecks.NotNegative);
        Located<Quantity>? frequency = null;
        Located<QuantityRange>? band = null;
        if (!isDc && !isSum)
        {
            var hasFrequency = m.Has("frequency");
            var hasBand = m.Has("band");
            if (hasFrequency && hasBand)
            {
                d(m).Add(DesignFileDiagnostics.ConflictingKeys.At(m.KeySpan("band"),
                    $"{Capital(what)} gives both 'frequency' and 'band'; give a single frequency or a band, not both."));
            }
            else if (!hasFrequency && !hasBand && kind is not null)
            {
                d(m).Add(DesignFileDiagnostics.MissingKey.At(m.Anchor, what, "frequency", "or 'band', e.g. band: 20 Hz..20 kHz"));
            }

            // One range for a signal frequency, whether given alone or as either end of a band.
            var signalFrequency = ValueChecks.Within(1e-3, 1e9, "a signal frequency lies between 1 mHz and 1 GHz");
            frequency = m.Quantity("frequency", Dimension.Frequency, required: false, signalFrequency);
            band = m.Range("band", Dimension.Frequency, required: false,
                r => r.Low.Value > 0 ? signalFrequency(r.Low) ?? signalFrequency(r.High) : "the band must start above 0 Hz");
            if (hasFrequency && hasBand)
            {
                band = null;
            }
        }

        var offset = m.Quantity("offset", Dimension.Voltage, required: isDc);
        Located<Quantity>? rise = null, duty = null;
        if (kind?.Value == WaveformKind.Square)
        {
            rise = m.Quantity("rise-time", Dimension.Time, required: false, ValueChecks.Positive);
            duty = m.Quantity("duty", Dimension.Ratio, required: false, ValueChecks.OpenFraction);
        }

        var components = new List<Waveform>();
        if (isSum)
        {
            var items = m.List("components", required: true, "sine, triangle, square or dc entries");
            if (items.Count > DesignLimits.MaxSumComponents)
            {
                d(m).Add(DesignFileDiagnostics.SizeLimit.At(m.KeySpan("components"),
                    $"A sum of {items.Count.ToString(System.Globalization.CultureInfo.InvariantCulture)} components",
                    $"{DesignLimits.MaxSumComponents.ToString(System.Globalization.CultureInfo.InvariantCulture)} components"));
                return null;
            }

            foreach (var item in items)
            {
                var part = MappingReader.Of(item, "a component of the sum", d(m));
                if (part is null)
                {
                    continue;
                }

                var w = ReadWaveform(part, "a component of the sum", nested: true);
                part.Finish();
                if (w is { Kind: WaveformKind.Sum })
                {
                    d(m).Add(DesignFileDiagnostics.UnknownChoice.At(part.KeySpan("waveform"), "sum", "waveform", " A sum cannot hold another sum.", "sine, triangle, square, dc"));
                    continue;
                }

                if (w is not null)
                {
                    components.Add(w);
                }
            }

            if (items.Count == 0 && m.Has("components"))
            {
                d(m).Add(DesignFileDiagnostics.MissingKey.At(m.KeySpan("components"), what, "components", "at least one entry"));
            }
        }

        _ = nested;
        if (kind is null || (!isDc && !isSum && amplitude is null) || (!isDc && !isSum && frequency is null && band is null))
        {
            return null;
        }

        return new Waveform(kind.Value, amplitude, frequency, band, offset, rise, duty, components, m.Span);
    }

    private static SignalLoad? ReadLoad(MappingReader root)
    {
        var m = root.Child("load", "the load", required: true, "resistance, capacitance and returns-to");
        if (m is null)
        {
            return null;
        }

        var r = m.Quantity("resistance", Dimension.Resistance, required: true, ValueChecks.Positive);
        var c = m.Quantity("capacitance", Dimension.Capacitance, required: false, ValueChecks.NotNegative);
        var returnsTo = m.Quantity("returns-to", Dimension.Voltage, new Quantity(0, Dimension.Voltage));
        m.Finish();
        return r is null ? null : new SignalLoad(r, c, returnsTo, m.Span);
    }

    private static List<Stage>? ReadStages(MappingReader root, PartsCatalog catalog)
    {
        var items = root.List("stages", required: true, "stage entries with id and block or netlist");
        if (items.Count == 0)
        {
            if (root.Has("stages"))
            {
                d(root).Add(DesignFileDiagnostics.MissingKey.At(root.KeySpan("stages"), "the design", "stages", "at least one stage"));
            }

            return null;
        }

        if (items.Count > DesignLimits.MaxStages)
        {
            d(root).Add(DesignFileDiagnostics.SizeLimit.At(root.KeySpan("stages"),
                $"The chain of {items.Count.ToString(System.Globalization.CultureInfo.InvariantCulture)} stages",
                $"{DesignLimits.MaxStages.ToString(System.Globalization.CultureInfo.InvariantCulture)} stages"));
            return null;
        }

        var stages = new List<Stage>();
        var ids = new Dictionary<string, SourceSpan>(StringComparer.Ordinal);
        var complete = true;
        foreach (var item in items)
        {
            var probe = MappingReader.Of(item, "a stage", d(root));
            if (probe is null)
            {
                complete = false;
                continue;
            }

            var id = probe.Id("id", required: true);
            var m = probe;
            m.What = id is null ? "a stage" : $"stage '{id.Value}'";
            if (id is not null)
            {
                if (ids.TryGetValue(id.Value, out var first))
                {
                    d(root).Add(DesignFileDiagnostics.DuplicateId.At(id.Span, "stage", id.Value, MappingReader.Position(first)));
                    id = null;
                }
                else
                {
                    ids[id.Value] = id.Span;
                }
            }

            var stage = ReadStage(m, id, catalog);
            m.Finish();
            if (stage is null)
            {
                complete = false;
            }
            else
            {
                stages.Add(stage);
            }
        }

        return complete ? stages : null;
    }

    private static Stage? ReadStage(MappingReader m, Located<string>? id, PartsCatalog catalog)
    {
        var hasBlock = m.Has("block");
        var hasNetlist = m.Has("netlist");
        var requirements = ReadRequirements(m.Child("requires", $"the requirements of {m.What}", false, string.Empty), m.Span);
        if (hasBlock && hasNetlist)
        {
            foreach (var key in new[] { "amplifier", "amplifiers", "diode", "diodes", "resistors", "capacitors", "values" })
            {
                m.Know(key);
            }

            d(m).Add(DesignFileDiagnostics.ConflictingKeys.At(m.KeySpan("netlist"),
                $"{Capital(m.What)} has both 'block' and 'netlist'; a stage is either a built-in block or an explicit netlist."));
            return null;
        }

        if (hasNetlist)
        {
            return NetlistReader.Read(m, id, requirements, catalog);
        }

        if (!hasBlock)
        {
            d(m).Add(DesignFileDiagnostics.MissingKey.At(m.Anchor, m.What, "block", "a built-in block name, or 'netlist' with elements"));
            return null;
        }

        return BlockStageReader.Read(m, id, requirements, catalog);
    }

    private static Requirements ReadRequirements(MappingReader? m, SourceSpan fallback)
    {
        if (m is null)
        {
            return Requirements.None(fallback);
        }

        var transfer = m.Choice("transfer", Transfers, required: false);
        var gain = m.Quantity("gain", Dimension.Ratio, required: false, ValueChecks.Within(1e-6, 1e7, "a gain magnitude lies between 1e-6 and 1e7"));
        if (gain is not null && transfer is not null && transfer.Value != TransferKind.Gain)
        {
            d(m).Add(DesignFileDiagnostics.ConflictingKeys.At(gain.Span,
                $"'gain' needs 'transfer: gain' (or no transfer), but {m.What} says 'transfer' is another kind."));
        }

        transfer ??= gain is null ? null : new Located<TransferKind>(TransferKind.Gain, gain.Span);
        var accuracy = m.Quantity("accuracy", Dimension.Ratio, required: false, ValueChecks.OpenFraction);
        var glitch = m.Quantity("glitch", Dimension.Time, required: false, ValueChecks.Positive);
        var yield = m.Quantity("yield", Dimension.Ratio, required: false, ValueChecks.Fraction);
        var bandwidth = m.Quantity("bandwidth", Dimension.Frequency, required: false, ValueChecks.Positive);
        var offset = m.Quantity("output-offset", Dimension.Voltage, required: false, ValueChecks.Positive);
        var minSignal = m.Quantity("min-signal", Dimension.Voltage, required: false, ValueChecks.Positive);
        var cmrr = m.Quantity("cmrr", Dimension.Ratio, required: false,
            q => q.Value is > 1 and <= 1e12 ? null : "a common-mode rejection is above 1 (0 dB) and at most 1e12 (240 dB), e.g. 80 dB or 10k");
        var cutoff = FilterTargetOf(m, "cutoff", Dimension.Frequency, ValueChecks.Positive);
        var centre = FilterTargetOf(m, "centre", Dimension.Frequency, ValueChecks.Positive);
        var q = FilterTargetOf(m, "q", Dimension.Ratio, ValueChecks.PositiveWithin(1e-3, 1e3, "a Q lies between 0.001 and 1000"));
        var passbandGain = FilterTargetOf(m, "passband-gain", Dimension.Ratio, ValueChecks.Within(1e-6, 1e7, "a gain magnitude lies between 1e-6 and 1e7"));
        var snr = m.Quantity("snr", Dimension.Ratio, required: false,
            q => q.Value is > 1 and <= 1e12 ? null : "a signal-to-noise ratio is above 1 (0 dB) and at most 1e12 (240 dB), e.g. 60 dB");
        var noise = ReadNoise(m);
        var noiseBand = m.Range("noise-band", Dimension.Frequency, required: false,
            r => r.Low.Value > 0 ? null : "the noise band must start above 0 Hz");
        StopbandRequirement? stopband = null;
        if (m.Child("stopband", $"the stop-band requirement of {m.What}", required: false, string.Empty) is { } sb)
        {
            var frequency = sb.Quantity("frequency", Dimension.Frequency, required: true, ValueChecks.Positive);
            var attenuation = sb.Quantity("attenuation", Dimension.Ratio, required: true,
                a => a.Value is > 1 and <= 1e12 ? null : "an attenuation is above 1 (0 dB) and at most 1e12 (240 dB), e.g. 40 dB");
            sb.Finish();
            stopband = frequency is null || attenuation is null ? null : new StopbandRequirement(frequency, attenuation, sb.Span);
        }

        m.Finish();
        return new Requirements(transfer, gain, accuracy, glitch, yield, bandwidth, offset, minSignal, m.Span)
        {
            CommonModeRejection = cmrr, Cutoff = cutoff, Centre = centre, Q = q, PassbandGain = passbandGain, Stopband = stopband,
            SignalToNoise = snr, Noise = noise, NoiseBand = noiseBand,
        };
    }

    private static readonly Dictionary<string, NoiseReference> NoiseReferences = new(StringComparer.Ordinal)
    {
        ["output"] = NoiseReference.Output,
        ["input"] = NoiseReference.Input,
    };

    /// <summary>A noise requirement: an RMS voltage at the output (<c>noise: 50 uV</c>) or <c>{ rms: 2 uV, at: input }</c>.</summary>
    private static NoiseRequirement? ReadNoise(MappingReader m)
    {
        var node = m.Node("noise", required: false, "an RMS noise voltage such as 50 uV, or { rms: 2 uV, at: input }");
        if (node is null)
        {
            return null;
        }

        if (node is YamlScalar s)
        {
            var q = m.ParseQuantity(s, "noise", Dimension.Voltage, ValueChecks.Positive);
            return q is null ? null : new NoiseRequirement(q, new Located<NoiseReference>(NoiseReference.Output, q.Span), q.Span);
        }

        var n = MappingReader.Of(node, "the noise requirement", d(m));
        if (n is null)
        {
            return null;
        }

        var rms = n.Quantity("rms", Dimension.Voltage, required: true, ValueChecks.Positive);
        var at = n.Choice("at", NoiseReferences, required: false);
        n.Finish();
        return rms is null ? null : new NoiseRequirement(rms, at ?? new Located<NoiseReference>(NoiseReference.Output, rms.Span), n.Span);
    }

    /// <summary>A filter figure written as <c>{ value: …, within: 2% }</c>.</summary>
    private static FilterTarget? FilterTargetOf(MappingReader m, string key, Dimension dimension, Func<Quantity, string?> check)
    {
        var t = m.Child(key, $"the {key} requirement of {m.What}", required: false, string.Empty);
        if (t is null)
        {
            return null;
        }

        var value = t.Quantity("value", dimension, required: true, check);
        var within = t.Quantity("within", Dimension.Ratio, required: true, ValueChecks.OpenFraction);
        t.Finish();
        return value is null || within is null ? null : new FilterTarget(value, within, t.Span);
    }

    private static List<Waiver> ReadWaivers(MappingReader root, List<Stage>? stages)
    {
        var waivers = new List<Waiver>();
        foreach (var item in root.List("waivers", required: false, "entries with rule, stage, reason and expires"))
        {
            var m = MappingReader.Of(item, "a waiver", d(root));
            if (m is null)
            {
                continue;
            }

            var rule = m.Text("rule", required: true, "a rule id such as DR103");
            if (rule is not null && !RuleId.IsWellFormed(rule.Value))
            {
                d(m).Add(DesignFileDiagnostics.MalformedValue.At(rule.Span, rule.Value, "rule", "a rule id is DR and three digits; expected a rule id such as DR103"));
                rule = null;
            }
            else if (rule is not null && !RuleCatalogue.Default.TryGet(rule.Value, out _))
            {
                // A waiver of an id no rule has would never match; say so at load time instead of as DR704 later.
                var ids = RuleCatalogue.Default.Rules.Select(r => r.Id).ToList();
                d(m).Add(DesignFileDiagnostics.UnknownChoice.At(rule.Span, rule.Value, "rule",
                    SpellingSuggestion.Hint(rule.Value, ids), "the ids of rules/catalogue.yaml"));
                rule = null;
            }

            var stage = m.Text("stage", required: true, "a stage id, or '*' for the whole design");
            if (stage is not null && stage.Value != "*" && stages is not null && stages.All(s => s.Id.Value != stage.Value))
            {
                var names = stages.Select(s => s.Id.Value).ToList();
                d(m).Add(DesignFileDiagnostics.UnknownChoice.At(stage.Span, stage.Value, "stage", SpellingSuggestion.Hint(stage.Value, names), string.Join(", ", names.Append("*"))));
                stage = null;
            }

            var reason = m.Text("reason", required: true, "why the finding is accepted");
            if (reason is not null && string.IsNullOrWhiteSpace(reason.Value))
            {
                d(m).Add(DesignFileDiagnostics.MissingKey.At(reason.Span, "a waiver", "reason", "a non-empty reason"));
                reason = null;
            }

            var expires = m.Date("expires");
            m.Finish();
            if (rule is not null && stage is not null && reason is not null)
            {
                waivers.Add(new Waiver(rule, stage, reason, expires, m.Span));
            }
        }

        return waivers;
    }

    internal static string Capital(string text) => text.Length == 0 ? text : char.ToUpperInvariant(text[0]) + text[1..];
}
