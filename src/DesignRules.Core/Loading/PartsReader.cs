using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Quantities;
using DesignRules.Yaml;

namespace DesignRules.Loading;

/// <summary>Reads a parts file (top-level key <c>library:</c>) into a <see cref="PartsLibrary"/>.</summary>
internal static class PartsReader
{
    public static PartsLibrary? Read(string file, MappingReader root)
    {
        var diagnostics = root.Diagnostics;
        var header = root.Child("library", "the library header", required: true, "id and title");
        var id = header?.Id("id", required: true);
        var title = header?.Text("title", required: false, "a title")?.Value ?? string.Empty;
        header?.Finish();

        var uses = root.List("uses", required: false, "paths of parts files")
            .Select(n => ReadPath(n, "uses", diagnostics)).OfType<Located<string>>().ToList();

        var ids = new Dictionary<string, SourceSpan>(StringComparer.Ordinal);
        var amplifiers = ReadAll(root, "amplifiers", "amplifier", ids, ReadAmplifier);
        var diodes = ReadAll(root, "diodes", "diode", ids, ReadDiode);
        var resistors = ReadAll(root, "resistors", "resistor family", ids, ReadResistors);
        var capacitors = ReadAll(root, "capacitors", "capacitor family", ids, ReadCapacitors);
        root.Finish();

        return id is null ? null : new PartsLibrary(id, title, file, uses, amplifiers, diodes, resistors, capacitors);
    }

    public static Located<string>? ReadPath(YamlNode node, string key, List<Diagnostic> diagnostics)
    {
        if (node is YamlScalar { IsNull: false } s)
        {
            return new Located<string>(s.Value, s.Span);
        }

        diagnostics.Add(DesignFileDiagnostics.WrongShape.At(node.Span, key, "a file path", node.ShapeName));
        return null;
    }

    private static List<T> ReadAll<T>(
        MappingReader root, string key, string kind, Dictionary<string, SourceSpan> ids,
        Func<MappingReader, Located<string>, T?> read)
        where T : class
    {
        var result = new List<T>();
        foreach (var node in root.List(key, required: false, $"{kind} entries"))
        {
            var m = MappingReader.Of(node, $"a{(kind[0] is 'a' ? "n" : string.Empty)} {kind}", root.Diagnostics);
            if (m is null)
            {
                continue;
            }

            var id = m.Id("id", required: true);
            if (id is null)
            {
                m.Finish();
                continue;
            }

            var reader = m;
            reader.What = $"{kind} '{id.Value}'";
            var part = read(reader, id);
            reader.Finish();
            if (ids.TryGetValue(id.Value, out var first))
            {
                root.Diagnostics.Add(DesignFileDiagnostics.DuplicateId.At(id.Span, "part", id.Value, MappingReader.Position(first)));
                continue;
            }

            ids[id.Value] = id.Span;
            if (part is not null)
            {
                result.Add(part);
            }
        }

        return result;
    }

    private static AmplifierPart? ReadAmplifier(MappingReader m, Located<string> id)
    {
        var description = m.Text("description", required: false, "what class of part")?.Value ?? string.Empty;
        var typical = m.Flag("typical")?.Value ?? false;
        var gbw = m.Quantity("gbw", Dimension.Frequency, required: true, ValueChecks.Positive);
        var (rising, falling) = ReadSlew(m);
        var a0 = m.Quantity("open-loop-gain", Dimension.Ratio, required: true, ValueChecks.Within(1, 1e9, "an open-loop gain lies between 1 (0 dB) and 1e9 (180 dB)"));
        var secondPole = m.Quantity("second-pole", Dimension.Frequency, required: false, ValueChecks.Positive);

        var headroom = m.Child("output-headroom", "the output headroom", required: true, "positive, negative and at-load");
        var outHeadroom = ReadPerRail(headroom, ValueChecks.NotNegative);
        var headroomLoad = headroom?.Quantity("at-load", Dimension.Resistance, required: false, ValueChecks.Positive);
        headroom?.Finish();

        var rout = m.Quantity("output-resistance", Dimension.Resistance, new Quantity(50, Dimension.Resistance), ValueChecks.NotNegative);
        var iout = m.Quantity("output-current", Dimension.Current, required: true, ValueChecks.Positive);
        var inputRangeMap = m.Child("input-range", "the input common-mode range", required: true, "positive and negative headroom");
        var inputRange = ReadPerRail(inputRangeMap, null);
        inputRangeMap?.Finish();
        var vos = ReadTypMax(m, "offset-voltage", Dimension.Voltage);
        var ib = ReadTypMax(m, "bias-current", Dimension.Current);
        var ios = ReadTypMax(m, "offset-current", Dimension.Current, required: false);
        var minGain = m.Quantity("min-stable-gain", Dimension.Ratio, new Quantity(1, Dimension.Ratio), ValueChecks.AtLeastOne);
        var span = m.Child("supply-span", "the supply span", required: true, "minimum and maximum");
        var spanMin = span?.Quantity("minimum", Dimension.Voltage, required: true, ValueChecks.Positive);
        var spanMax = span?.Quantity("maximum", Dimension.Voltage, required: true, ValueChecks.Positive);
        if (spanMin is not null && spanMax is not null && spanMin.Value.Value > spanMax.Value.Value)
        {
            m.Diagnostics.Add(DesignFileDiagnostics.OutOfRange.At(spanMax.Span, spanMax.Value.Format(), "maximum", "the maximum supply span is below the minimum"));
            spanMax = null;
        }

        span?.Finish();
        var maxDiff = m.Quantity("max-differential-input", Dimension.Voltage, required: false, ValueChecks.Positive);
        var noise = m.Quantity("noise-density", Dimension.VoltageNoiseDensity, required: false, ValueChecks.NotNegative);
        var currentNoise = m.Quantity("current-noise", Dimension.CurrentNoiseDensity, required: false, ValueChecks.NotNegative);
        var noiseCorner = m.Quantity("noise-corner", Dimension.Frequency, required: false, ValueChecks.NotNegative);
        var recovery = m.Quantity("overload-recovery", Dimension.Time, required: false, ValueChecks.NotNegative);
        var slewDerating = m.Quantity("slew-derating", Dimension.TemperatureCoefficient, required: false,
            q => Math.Abs(q.Value) <= 4e-3 ? null : "a slew-rate derating lies within ±0.004 /°C (±0.4 % per °C)");
        // The same bound as the slew derating: across -55 °C..125 °C it keeps the GBW between 0.6 and 1.4 times its 25 °C figure, never at or below zero.
        var gbwDerating = m.Quantity("gbw-derating", Dimension.TemperatureCoefficient, required: false,
            q => Math.Abs(q.Value) <= 4e-3 ? null : "a GBW derating lies within ±0.004 /°C (±0.4 % per °C)");
        var drift = m.Quantity("offset-drift", Dimension.VoltageDrift, required: false, ValueChecks.NotNegative);
        var doubling = m.Quantity("bias-doubling", Dimension.Temperature, required: false,
            ValueChecks.Within(1, 100, "a bias-current doubling interval lies between 1 °C and 100 °C (JFET and CMOS inputs: about 10 °C)"));
        var capacitiveLoad = m.Quantity("capacitive-load", Dimension.Capacitance, required: false, ValueChecks.Positive);

        if (gbw is null || rising is null || falling is null || a0 is null || outHeadroom is null || iout is null ||
            inputRange is null || vos is null || ib is null || spanMin is null || spanMax is null)
        {
            return null;
        }

        return new AmplifierPart(id, description, typical, gbw, rising, falling, a0, secondPole, outHeadroom, headroomLoad,
            rout, iout, inputRange, vos, ib, minGain, spanMin, spanMax, maxDiff, noise, recovery, m.Span)
        {
            OffsetCurrent = ios,
            OffsetDrift = drift,
            BiasDoubling = doubling,
            CapacitiveLoad = capacitiveLoad,
            CurrentNoise = currentNoise,
            NoiseCorner = noiseCorner,
            SlewDerating = slewDerating,
            GbwDerating = gbwDerating,
        };
    }

    private static (Located<Quantity>? Rising, Located<Quantity>? Falling) ReadSlew(MappingReader m)
    {
        var node = m.Node("slew-rate", required: true, "a slew rate such as 13 V/us, or rising and falling");
        if (node is YamlScalar s)
        {
            var q = m.ParseQuantity(s, "slew-rate", Dimension.SlewRate, ValueChecks.Positive);
            return (q, q);
        }

        var both = MappingReader.Of(node, "the slew rate", m.Diagnostics);
        var rising = both?.Quantity("rising", Dimension.SlewRate, required: true, ValueChecks.Positive);
        var falling = both?.Quantity("falling", Dimension.SlewRate, required: true, ValueChecks.Positive);
        both?.Finish();
        return (rising, falling);
    }

    private static PerRail? ReadPerRail(MappingReader? m, Func<Quantity, string?>? check)
    {
        var positive = m?.Quantity("positive", Dimension.Voltage, required: true, check);
        var negative = m?.Quantity("negative", Dimension.Voltage, required: true, check);
        return positive is null || negative is null ? null : new PerRail(positive, negative);
    }

    private static TypicalAndMaximum? ReadTypMax(MappingReader m, string key, Dimension dimension, bool required = true)
    {
        var node = m.Node(key, required, "typical and maximum");
        if (node is null)
        {
            return null;
        }

        if (node is YamlScalar s)
        {
            // A single figure is taken as both typical and maximum.
            var q = m.ParseQuantity(s, key, dimension, ValueChecks.NotNegative);
            return q is null ? null : new TypicalAndMaximum(q, q);
        }

        var both = MappingReader.Of(node, $"the {key}", m.Diagnostics);
        var typical = both?.Quantity("typical", dimension, required: true, ValueChecks.NotNegative);
        var maximum = both?.Quantity("maximum", dimension, required: true, ValueChecks.NotNegative);
        both?.Finish();
        if (typical is not null && maximum is not null && Math.Abs(typical.Value.Value) > Math.Abs(maximum.Value.Value))
        {
            m.Diagnostics.Add(DesignFileDiagnostics.OutOfRange.At(maximum.Span, maximum.Value.Format(), "maximum", "the maximum is below the typical figure"));
            return null;
        }

        return typical is null || maximum is null ? null : new TypicalAndMaximum(typical, maximum);
    }

    private static DiodePart? ReadDiode(MappingReader m, Located<string> id)
    {
        var description = m.Text("description", required: false, "what class of part")?.Value ?? string.Empty;
        var typical = m.Flag("typical")?.Value ?? false;
        var isat = m.Quantity("saturation-current", Dimension.Current, required: false, ValueChecks.Within(1e-20, 1e-3, "a saturation current lies between 1e-20 A and 1 mA"));
        var emission = m.Quantity("emission", Dimension.Ratio, new Quantity(1, Dimension.Ratio), ValueChecks.Emission);
        Located<Quantity>? vf = null, vfCurrent = null;
        var forward = m.Child("forward-voltage", "the forward-voltage point", required: false, "voltage and current");
        if (forward is not null)
        {
            vf = forward.Quantity("voltage", Dimension.Voltage, required: true, ValueChecks.Within(0.01, 5, "a forward voltage lies between 10 mV and 5 V"));
            vfCurrent = forward.Quantity("current", Dimension.Current, required: true, ValueChecks.Positive);
            forward.Finish();
        }

        if (isat is null && forward is null && !m.Has("saturation-current"))
        {
            m.Diagnostics.Add(DesignFileDiagnostics.MissingKey.At(m.Anchor, $"diode '{id.Value}'", "saturation-current", "or a forward-voltage point { voltage, current }"));
        }
        else if (m.Has("saturation-current") && forward is not null)
        {
            m.Diagnostics.Add(DesignFileDiagnostics.ConflictingKeys.At(m.KeySpan("forward-voltage"),
                $"Diode '{id.Value}' gives both 'saturation-current' and 'forward-voltage'; give one of them."));
            vf = null;
            isat = null;
        }

        var rs = m.Quantity("series-resistance", Dimension.Resistance, new Quantity(0, Dimension.Resistance), ValueChecks.NotNegative);
        var vr = m.Quantity("reverse-voltage", Dimension.Voltage, required: true, ValueChecks.Positive);
        var ifr = m.Quantity("forward-current", Dimension.Current, required: true, ValueChecks.Positive);
        var cj = m.Quantity("capacitance", Dimension.Capacitance, required: false, ValueChecks.NotNegative);
        var bv = m.Quantity("breakdown-voltage", Dimension.Voltage, required: false, ValueChecks.Positive);
        var coefficient = m.Quantity("forward-voltage-coefficient", Dimension.VoltageDrift, required: false,
            q => q.Value is >= -10e-3 and <= 0 ? null : "a diode's forward-voltage coefficient lies between -10 mV/°C and 0 (silicon junctions: about -2 mV/°C)");
        if ((isat is null && vf is null) || vr is null || ifr is null || (forward is not null && (vf is null || vfCurrent is null)))
        {
            return null;
        }

        return new DiodePart(id, description, typical, isat, emission, vf, vfCurrent, rs, vr, ifr, cj, bv, m.Span)
        {
            ForwardVoltageCoefficient = coefficient,
        };
    }

    private static ResistorFamily? ReadResistors(MappingReader m, Located<string> id)
    {
        var description = m.Text("description", required: false, "what class of part")?.Value ?? string.Empty;
        var tolerance = m.Quantity("tolerance", Dimension.Ratio, required: true, ValueChecks.Tolerance);
        var tempco = m.Quantity("tempco", Dimension.TemperatureCoefficient, required: true);
        var power = m.Quantity("power", Dimension.Power, required: true, ValueChecks.Positive);
        var voltage = m.Quantity("voltage", Dimension.Voltage, required: false, ValueChecks.Positive);
        return tolerance is null || tempco is null || power is null
            ? null
            : new ResistorFamily(id, description, tolerance, tempco, power, voltage, m.Span);
    }

    private static CapacitorFamily? ReadCapacitors(MappingReader m, Located<string> id)
    {
        var description = m.Text("description", required: false, "what class of part")?.Value ?? string.Empty;
        var tolerance = m.Quantity("tolerance", Dimension.Ratio, required: true, ValueChecks.Tolerance);
        var tempco = m.Quantity("tempco", Dimension.TemperatureCoefficient, required: false);
        var voltage = m.Quantity("voltage", Dimension.Voltage, required: false, ValueChecks.Positive);
        return tolerance is null ? null : new CapacitorFamily(id, description, tolerance, tempco, voltage, m.Span);
    }
}
