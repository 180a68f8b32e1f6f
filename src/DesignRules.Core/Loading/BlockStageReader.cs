using DesignRules.Blocks;
using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Quantities;
using DesignRules.Yaml;

namespace DesignRules.Loading;

/// <summary>Reads a stage that instantiates a built-in block: its parts per slot, values and options.</summary>
internal static class BlockStageReader
{
    public static BlockStage? Read(MappingReader m, Located<string>? id, Requirements requirements, PartsCatalog catalog)
    {
        var d = m.Diagnostics;
        var blockName = m.Text("block", required: true, "a built-in block name");
        BlockDescriptor? block = null;
        if (blockName is not null && !BlockCatalog.All.TryGetValue(blockName.Value, out block))
        {
            d.Add(DesignFileDiagnostics.UnknownBlock.At(blockName.Span, blockName.Value,
                SpellingSuggestion.Hint(blockName.Value, BlockCatalog.All.Keys), string.Join(", ", BlockCatalog.All.Keys)));
        }

        var amplifier = m.Text("amplifier", required: false, "an amplifier part id");
        var diode = m.Text("diode", required: false, "a diode part id");
        var resistorsId = m.Text("resistors", required: false, "a resistor family id");
        var capacitorsId = m.Text("capacitors", required: false, "a capacitor family id");
        var perAmplifier = m.Child("amplifiers", $"the amplifier slots of {m.What}", required: false, string.Empty);
        var perDiode = m.Child("diodes", $"the diode slots of {m.What}", required: false, string.Empty);
        var resistors = resistorsId is null ? null : catalog.Resistors(resistorsId, d);
        var capacitors = capacitorsId is null ? null : catalog.Capacitors(capacitorsId, d);
        var values = m.Child("values", $"the values of {m.What}", required: block is { RequiredValues.Count: > 0 }, "the block's component values");

        if (block is null)
        {
            // Without a known block the slots and value names cannot be checked; accept what is there quietly.
            foreach (var e in (perAmplifier?.Entries ?? []).Concat(perDiode?.Entries ?? []).Concat(values?.Entries ?? []))
            {
                perAmplifier?.Know(e.Key.Value);
                perDiode?.Know(e.Key.Value);
                values?.Know(e.Key.Value);
            }

            return null;
        }

        var ok = true;
        var componentValues = new Dictionary<string, ComponentValue>(StringComparer.Ordinal);
        var flags = new Dictionary<string, Located<bool>>(StringComparer.Ordinal);
        if (values is not null)
        {
            foreach (var name in block.Flags)
            {
                var flag = values.Flag(name);
                if (flag is not null)
                {
                    flags[name] = flag;
                }
            }

            foreach (var name in block.AllValues)
            {
                var required = block.RequiredValues.Contains(name);
                var value = ReadComponentValue(values, name, required, resistors, capacitors, catalog);
                if (value is not null)
                {
                    componentValues[name] = value;
                }
                else if (required)
                {
                    ok = false;
                }
            }

            values.Finish();
        }

        var amplifierSlots = block.AmplifierSlots.ToList();
        if (block.OptionalAmplifierSlots.Count > 0 && flags.TryGetValue("buffer", out var buffered) && buffered.Value)
        {
            amplifierSlots.AddRange(block.OptionalAmplifierSlots);
        }

        var spans = new Dictionary<string, SourceSpan>(StringComparer.Ordinal);
        var amplifiers = ResolveSlots(m, "amplifier", amplifier, perAmplifier, amplifierSlots, block.OptionalAmplifierSlots, catalog.Amplifier, spans, ref ok);
        var diodes = ResolveSlots(m, "diode", diode, perDiode, block.DiodeSlots, [], catalog.Diode, spans, ref ok);
        if (block.DiodeSlots.Count == 0 && diode is not null)
        {
            d.Add(DesignFileDiagnostics.UnknownKey.At(m.KeySpan("diode"), "diode", m.What, $" The block '{block.Name}' has no diodes.", "the block's slots only"));
        }

        if (amplifierSlots.Count == 0 && (amplifier is not null || perAmplifier is not null))
        {
            var hint = block.OptionalAmplifierSlots.Count > 0 ? " Set 'buffer: true' among the values to use one." : string.Empty;
            d.Add(DesignFileDiagnostics.UnknownKey.At(m.KeySpan(amplifier is null ? "amplifiers" : "amplifier"), amplifier is null ? "amplifiers" : "amplifier", m.What,
                $" The block '{block.Name}' uses no amplifier here.{hint}", "the block's slots only"));
        }

        if (!ok || id is null || blockName is null)
        {
            return null;
        }

        return new BlockStage(id, block, blockName, amplifiers, diodes, componentValues, flags, requirements, m.Span)
        {
            PartSpans = spans,
        };
    }

    /// <summary>The dimension of a block value from its name: r… resistance, c… capacitance, bias voltage.</summary>
    internal static Dimension DimensionOf(string name) => name switch
    {
        "bias" => Dimension.Voltage,
        _ when name.StartsWith('c') => Dimension.Capacitance,
        _ => Dimension.Resistance,
    };

    private static ComponentValue? ReadComponentValue(
        MappingReader values, string name, bool required, ResistorFamily? resistors, CapacitorFamily? capacitors, PartsCatalog catalog)
    {
        var d = values.Diagnostics;
        var dimension = DimensionOf(name);
        var check = dimension == Dimension.Voltage
            ? ValueChecks.Within(0, 1000, "a bias voltage lies within ±1 kV")
            : dimension == Dimension.Resistance
                ? ValueChecks.PositiveWithin(1e-3, 1e12, "a resistance lies between 1 mΩ and 1 TΩ")
                : ValueChecks.PositiveWithin(1e-15, 10, "a capacitance lies between 1 fF and 10 F");
        var node = values.Node(name, required, QuantityForms.Example(dimension));
        switch (node)
        {
            case null:
                return null;
            case YamlScalar s:
            {
                var q = values.ParseQuantity(s, name, dimension, check);
                return q is null ? null : Value(name, values.KeySpan(name), q, dimension, resistors, capacitors);
            }

            default:
            {
                var m = MappingReader.Of(node, $"the value '{name}'", d);
                if (m is null)
                {
                    return null;
                }

                var q = m.Quantity("value", dimension, required: true, check);
                var familyId = m.Text("family", required: false, "a resistor or capacitor family id");
                m.Finish();
                if (familyId is not null)
                {
                    if (dimension == Dimension.Resistance)
                    {
                        resistors = catalog.Resistors(familyId, d);
                    }
                    else if (dimension == Dimension.Capacitance)
                    {
                        capacitors = catalog.Capacitors(familyId, d);
                    }
                    else
                    {
                        d.Add(DesignFileDiagnostics.UnknownKey.At(familyId.Span, "family", m.What, " Only resistors and capacitors have families.", "value"));
                    }
                }

                return q is null ? null : Value(name, values.KeySpan(name), q, dimension, resistors, capacitors);
            }
        }
    }

    // A value carries only the family of its own kind: a capacitor never inherits the stage's resistor family.
    private static ComponentValue Value(
        string name, SourceSpan span, Located<Quantity> q, Dimension dimension, ResistorFamily? resistors, CapacitorFamily? capacitors) =>
        new(new Located<string>(name, span), q,
            dimension == Dimension.Resistance ? resistors : null,
            dimension == Dimension.Capacitance ? capacitors : null);

    private static Dictionary<string, T> ResolveSlots<T>(
        MappingReader m, string kind, Located<string>? common, MappingReader? perSlot, IReadOnlyList<string> slots,
        IReadOnlyList<string> optionalSlots, Func<Located<string>, List<Diagnostic>, T?> find, Dictionary<string, SourceSpan> spans, ref bool ok)
        where T : class
    {
        var result = new Dictionary<string, T>(StringComparer.Ordinal);
        var commonPart = common is null ? null : find(common, m.Diagnostics);
        if (common is not null && commonPart is null)
        {
            ok = false;
        }

        foreach (var slot in slots)
        {
            var specific = perSlot?.Text(slot, required: false, $"a{(kind[0] is 'a' ? "n" : string.Empty)} {kind} part id");
            var part = specific is null ? commonPart : find(specific, m.Diagnostics);
            if (part is not null)
            {
                result[slot] = part;
                spans[slot] = (specific ?? common)!.Span;
            }
            else if (specific is not null || common is null)
            {
                if (specific is null)
                {
                    m.Diagnostics.Add(DesignFileDiagnostics.MissingKey.At(m.Anchor, m.What, kind, $"the {kind} part for slot {slot}"));
                }

                ok = false;
            }
        }

        foreach (var slot in optionalSlots)
        {
            perSlot?.Know(slot);
        }

        perSlot?.Finish();
        return result;
    }
}
