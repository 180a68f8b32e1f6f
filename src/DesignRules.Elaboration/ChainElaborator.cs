using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Elaboration;

/// <summary>
/// Turns a loaded design into one engine circuit for the whole chain: supply sources, the signal source with its
/// impedance, every stage in order (each stage fed from the previous stage's output node, so the stages really load each
/// other) and the load. Problems are returned in <see cref="ElaboratedChain.Problems"/>, never thrown.
/// </summary>
public static class ChainElaborator
{
    /// <summary>Id of the signal source.</summary>
    public const string SourceId = "source";

    /// <summary>Elaborates a design.</summary>
    /// <param name="design">The loaded design.</param>
    /// <param name="options">Test frequency, amplitude and variations (default <see cref="ElaborationOptions.Default"/>).</param>
    public static ElaboratedChain Elaborate(Design design, ElaborationOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(design);
        options ??= ElaborationOptions.Default;
        var circuit = new Circuit { Temperature = options.Temperature };
        var rails = new SupplyRails(design.Supplies.Positive.Value.Value, design.Supplies.Negative.Value.Value);
        var chain = new ChainContext(circuit, options, rails);
        CheckOptions(design, options, chain);

        // Supplies: the nodes vpos and vneg that netlists may use.
        circuit.AddVoltageSource("supply.pos", "vpos", Circuit.Ground, rails.Positive);
        circuit.AddVoltageSource("supply.neg", "vneg", Circuit.Ground, rails.Negative);
        chain.Locate("supply.pos", design.Supplies.Positive.Span);
        chain.Locate("supply.neg", design.Supplies.Negative.Span);

        // The signal source: the test frequency and the window follow from its components' frequencies.
        var source = design.Source;
        var frequencies = SourceWaveforms.Frequencies(source.Waveform, options.BandEnd).Where(f => f > 0).ToArray();
        double frequencyScale = options.Frequency is { } wanted && frequencies.Length > 0 ? wanted / frequencies.Min() : 1;
        var waveform = SourceWaveforms.Convert(source.Waveform, options.BandEnd, options.AmplitudeScale, frequencyScale);
        double? lowest = frequencies.Length > 0 ? frequencies.Min() * frequencyScale : null;
        double? highest = frequencies.Length > 0 ? frequencies.Max() * frequencyScale : null;

        bool split = source.CommonMode is not null && design.Stages.Count > 0 && design.Stages[0] is BlockStage { Block.TakesDifferentialInput: true };
        double commonMode = split ? source.CommonMode!.Value.Value : 0;
        double rs = source.Impedance.Value.Value;
        string emf = "source.emf";
        circuit.AddVoltageSource(SourceId, emf, Circuit.Ground, waveform);
        chain.Locate(SourceId, source.Span);
        chain.LocateNode(emf, source.Span);
        string input, reference = Circuit.Ground;
        if (split)
        {
            // v(source.p) = cm + v/2 and v(source.n) = cm − v/2 behind half the source impedance each.
            circuit.AddVoltageSource("source.cm", "source.cmv", Circuit.Ground, commonMode);
            circuit.AddVoltageControlledVoltageSource("source.pos", "source.p.emf", "source.cmv", emf, Circuit.Ground, 0.5);
            circuit.AddVoltageControlledVoltageSource("source.neg", "source.n.emf", "source.cmv", emf, Circuit.Ground, -0.5);
            input = SourceLeg(chain, "source.p.emf", "source.p", "source.rs.p", rs / 2, source);
            reference = SourceLeg(chain, "source.n.emf", "source.n", "source.rs.n", rs / 2, source);
            foreach (var id in new[] { "source.cm", "source.pos", "source.neg" }) chain.Locate(id, source.CommonMode!.Span);
        }
        else
        {
            input = SourceLeg(chain, emf, "source.out", "source.rs", rs, source);
        }

        string sourceOutput = input;
        var stages = new List<StageProbe>(design.Stages.Count);
        foreach (var stage in design.Stages)
        {
            var builder = new StageBuilder(chain, stage, input, reference, commonMode);
            StageProbe? probe = stage switch
            {
                BlockStage block => builder.Finish(block.Block.Build(builder)),
                NetlistStage netlist => NetlistStageBuilder.Build(builder, netlist),
                _ => null,
            };
            if (probe is null)
            {
                chain.Problem($"stage '{stage.Id.Value}' uses a block this tool cannot build", stage.Span);
                continue;
            }

            stages.Add(probe);
            input = probe.OutputNode;
            reference = Circuit.Ground;
            commonMode = 0;
        }

        AddLoad(chain, design.Load, input);
        var overrideKeys = options.Values.Keys.Concat(options.OffsetVoltages.Keys).Concat(options.BiasCurrents.Keys).Concat(options.DiodeSaturationScales.Keys);
        foreach (var key in overrideKeys.Distinct(StringComparer.Ordinal).Where(k => !chain.UsedOverrides.Contains(k)).Order(StringComparer.Ordinal))
        {
            chain.Problem($"an override names '{key}', which is no element of this chain (keys are stageId.name, e.g. rect.r4 or rect.u1)", design.Id.Span, key);
        }

        foreach (var problem in circuit.Problems)
        {
            var span = problem.ElementId is { } id && chain.ElementSpans.TryGetValue(id, out var s) ? s : design.Id.Span;
            chain.Problem(problem.Reason, span, problem.ElementId);
        }

        double? period = lowest is { } low ? 1 / low : null;
        return new ElaboratedChain
        {
            Design = design,
            Circuit = circuit,
            Options = options,
            SourceId = SourceId,
            SourceEmfNode = emf,
            SourceOutputNode = sourceOutput,
            SourceWaveform = waveform,
            Stages = stages,
            OutputNode = input,
            Rails = rails,
            TestFrequency = lowest,
            Period = period,
            Window = Window(options, period, highest, stages),
            Problems = chain.Problems,
            ElementSpans = chain.ElementSpans,
            NodeSpans = chain.NodeSpans,
            StepSpan = SourceWaveforms.FastestSpan(source.Waveform, options.BandEnd),
        };
    }

    /// <summary>Adds one leg of the source impedance and returns the node after it (the emf node itself when there is none).</summary>
    private static string SourceLeg(ChainContext chain, string emf, string output, string id, double resistance, SignalSource source)
    {
        if (!(resistance > 0)) return emf;
        chain.Circuit.AddResistor(id, emf, output, resistance);
        chain.Locate(id, source.Impedance.Span);
        chain.LocateNode(output, source.Span);
        return output;
    }

    private static void AddLoad(ChainContext chain, SignalLoad load, string output)
    {
        string ret = Circuit.Ground;
        double level = load.ReturnsTo.Value.Value;
        if (level != 0)
        {
            ret = "load.ret";
            chain.Circuit.AddVoltageSource("load.vret", ret, Circuit.Ground, level);
            chain.Locate("load.vret", load.ReturnsTo.Span);
            chain.LocateNode(ret, load.Span);
        }

        chain.Circuit.AddResistor("load.r", output, ret, load.Resistance.Value.Value);
        chain.Locate("load.r", load.Resistance.Span);
        if (load.Capacitance is { } c)
        {
            chain.Circuit.AddCapacitor("load.c", output, ret, c.Value.Value);
            chain.Locate("load.c", c.Span);
        }
    }

    /// <summary>
    /// Start-up periods then measured periods of the slowest source component, the largest step a period of the fastest
    /// over the steps-per-period option (and no more than the edge time of a square). A DC source gets a 1 ms window, or
    /// five of the slowest designed time constants when those are shorter.
    /// </summary>
    private static TransientWindow Window(ElaborationOptions options, double? period, double? highest, List<StageProbe> stages)
    {
        int startup = Math.Max(0, options.StartupPeriods), measured = Math.Max(1, options.MeasuredPeriods), steps = Math.Max(10, options.StepsPerPeriod);
        if (period is { } t && highest is { } fmax)
        {
            return new TransientWindow(startup * t, (startup + measured) * t, 1 / (fmax * steps));
        }

        double slowest = stages.Select(s => s.TimeConstant ?? 0).DefaultIfEmpty(0).Max();
        double span = slowest > 0 ? Math.Min(1e-3, 5 * slowest) : 1e-3;
        return new TransientWindow(span * startup / (startup + measured), span, span / steps);
    }

    private static void CheckOptions(Design design, ElaborationOptions options, ChainContext chain)
    {
        if (!(options.AmplitudeScale >= 0) || !double.IsFinite(options.AmplitudeScale)) chain.Problem("the amplitude scale must be zero or positive", design.Source.Span);
        if (options.Frequency is { } f && (!(f > 0) || !double.IsFinite(f))) chain.Problem("the test frequency must be positive", design.Source.Span);
        if (!(options.DiodeSaturationScale > 0) || !double.IsFinite(options.DiodeSaturationScale)) chain.Problem("the diode saturation-current scale must be positive", design.Id.Span);
        if (!(options.Temperature > 0) || !double.IsFinite(options.Temperature)) chain.Problem("the temperature must be positive (kelvin)", design.Id.Span);
    }
}
