using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Simulation;

namespace DesignRules.Figures.Tolerance;

/// <summary>A resistor whose value may lie anywhere in nominal·(1 ± tolerance).</summary>
/// <param name="ElementId">Engine element id, also the value-override key (<c>stage.rf</c>).</param>
/// <param name="Name">The design's name for it (rf).</param>
/// <param name="Nominal">Nominal value, Ω.</param>
/// <param name="Tolerance">Its family's tolerance as a ratio (0 when it has no family: treated as exact).</param>
/// <param name="Span">Where the value is written.</param>
/// <param name="Tempco">Its family's temperature coefficient magnitude, 1/K (0 without a family).</param>
internal sealed record ResistorVariable(string ElementId, string Name, double Nominal, double Tolerance, SourceSpan Span, double Tempco = 0);

/// <summary>An amplifier whose input offset voltage and bias currents may reach the part's maxima, either sign.</summary>
/// <param name="ElementId">Engine element id (<c>stage.u1</c>).</param>
/// <param name="MaximumOffset">The part's maximum offset voltage, V.</param>
/// <param name="MaximumBias">The part's maximum bias current, A.</param>
/// <param name="MaximumOffsetCurrent">
/// The part's maximum input offset current (|Ib+ − Ib−|), A; 0 when the part states none, so that the two inputs' bias
/// currents are taken as equal.
/// </param>
/// <param name="Drift">The part's largest offset drift, V/K (0 when it states none).</param>
/// <param name="Doubling">The temperature rise over which its bias current doubles, K (0 when it states none: constant).</param>
internal sealed record AmplifierVariable(string ElementId, double MaximumOffset, double MaximumBias, double MaximumOffsetCurrent, double Drift = 0, double Doubling = 0);

/// <summary>A diode whose forward voltage may lie anywhere in the nominal ± <see cref="DiodeSpread.ForwardVoltage"/>.</summary>
/// <param name="ElementId">Engine element id (<c>stage.d1</c>).</param>
/// <param name="SlopeVoltage">n·V_T of its model, V: a forward-voltage shift δ is a saturation-current factor exp(−δ/(n·V_T)).</param>
/// <param name="Coefficient">Its forward voltage's change with temperature, V/K: the part's, else <see cref="TemperatureBehaviour.DiodeForwardVoltageCoefficient"/>.</param>
internal sealed record DiodeVariable(string ElementId, double SlopeVoltage, double Coefficient = TemperatureBehaviour.DiodeForwardVoltageCoefficient);

/// <summary>
/// The diode forward-voltage spread the tolerance analysis assumes. Diodes of one type from different lots differ in
/// forward voltage at a given current by a few tens of millivolts (common practice: about ±25 mV for small-signal silicon
/// junctions; the parts format has no spread figure), applied as a saturation-current factor, since at a fixed current
/// Vf = n·V_T·ln(I/Is).
/// </summary>
internal static class DiodeSpread
{
    /// <summary>Forward-voltage spread taken as the extreme (±3σ in Monte Carlo), V (common practice).</summary>
    public const double ForwardVoltage = 25e-3;

    /// <summary>The saturation-current factor that raises the forward voltage by <paramref name="shift"/> volts.</summary>
    public static double SaturationScale(DiodeVariable diode, double shift) => Math.Exp(-shift / diode.SlopeVoltage);
}

/// <summary>
/// How the variables' extremes move with temperature (°C). Parts state their figures at 25 °C. A resistor's tempco is a
/// ± spread like its tolerance, so the extreme at T is t + |α|·|T − 25 °C| (the extreme-value treatment of a tempco);
/// an amplifier's offset extreme grows by its drift, Vos,max + TCVos·|T − 25 °C| (the standard offset/drift relation);
/// its bias currents scale by 2^((T − 25 °C)/doubling) where the part states a doubling interval (JFET and CMOS inputs:
/// about 10 °C, common practice); a diode's forward voltage moves by its part's coefficient, else by about −2 mV/°C
/// (common practice for silicon junctions at a fixed current), whatever its spread.
/// </summary>
internal static class TemperatureBehaviour
{
    /// <summary>The temperature parts files state their figures at, °C.</summary>
    public const double Reference = 25;

    /// <summary>Diode forward-voltage coefficient at a fixed current where the part states none, V/K (common practice: about −2 mV/°C).</summary>
    public const double DiodeForwardVoltageCoefficient = -2e-3;

    public static double ResistorSpread(ResistorVariable r, double celsius) => r.Tolerance + (r.Tempco * Math.Abs(celsius - Reference));

    public static double Offset(AmplifierVariable a, double celsius) => a.MaximumOffset + (a.Drift * Math.Abs(celsius - Reference));

    public static double BiasGrowth(AmplifierVariable a, double celsius) => a.Doubling > 0 ? Math.Pow(2, (celsius - Reference) / a.Doubling) : 1;

    public static double DiodeShift(DiodeVariable diode, double celsius) => diode.Coefficient * (celsius - Reference);

    /// <summary>An amplifier's slew rate at <paramref name="celsius"/> over its rate at 25 °C: 1 + d·(T − 25 °C), d its stated derating (none: 1).</summary>
    public static double SlewFactor(Model.AmplifierPart part, double celsius) => 1 + ((part.SlewDerating?.Value.Value ?? 0) * (celsius - Reference));

    /// <summary>An amplifier's GBW at <paramref name="celsius"/> over its GBW at 25 °C: 1 + d·(T − 25 °C), d its stated GBW derating (none: 1).</summary>
    public static double GbwFactor(Model.AmplifierPart part, double celsius) => 1 + ((part.GbwDerating?.Value.Value ?? 0) * (celsius - Reference));

    /// <summary>
    /// The lowest GBW of an amplifier over the design's operating range, as a factor of its 25 °C figure, and the end of
    /// the range it occurs at (the derating is linear, so its extreme lies at an end); (1, null) without a range or a
    /// derating, or where no end lowers it.
    /// </summary>
    public static (double Factor, double? At) LowestGbw(Model.Design design, Model.AmplifierPart part)
    {
        if (design.Temperature is not { } range || part.GbwDerating is not { } derating || derating.Value.Value == 0)
        {
            return (1, null);
        }

        double low = range.Value.Low.Value, high = range.Value.High.Value;
        double atLow = GbwFactor(part, low), atHigh = GbwFactor(part, high);
        var (factor, at) = atLow < atHigh ? (atLow, low) : (atHigh, high);
        return factor < 1 ? (factor, at) : (1, null);
    }

    /// <summary>
    /// The slowest slew rate of an amplifier over the design's operating range, as a factor of its 25 °C rate, and the end
    /// of the range it occurs at (the derating is linear, so its extreme lies at an end); (1, null) without a range or a
    /// derating.
    /// </summary>
    public static (double Factor, double? At) SlowestSlew(Model.Design design, Model.AmplifierPart part)
    {
        if (design.Temperature is not { } range || part.SlewDerating is not { } derating || derating.Value.Value == 0)
        {
            return (1, null);
        }

        double low = range.Value.Low.Value, high = range.Value.High.Value;
        double atLow = SlewFactor(part, low), atHigh = SlewFactor(part, high);
        return atLow < atHigh ? (atLow, low) : (atHigh, high);
    }
}

/// <summary>
/// One assignment of every variable of a stage: each a signed fraction of its extreme (−1 … +1): a resistor at
/// nominal·(1 + u·t), an offset at u·Vos,max, bias currents u·Ib,max into both inputs, an offset current w·Ios,max split
/// between them (Ib+ = Ib + w·Ios/2, Ib− = Ib − w·Ios/2), a diode at Vf + u·spread.
/// </summary>
/// <param name="Resistors">Per resistor variable, in order.</param>
/// <param name="Offsets">Per amplifier variable.</param>
/// <param name="Biases">Per amplifier variable.</param>
/// <param name="Diodes">Per diode variable.</param>
internal sealed record Variation(double[] Resistors, double[] Offsets, double[] Biases, double[] Diodes)
{
    /// <summary>Per amplifier variable: the signed fraction of its maximum offset current (all 0 unless set).</summary>
    public required double[] OffsetCurrents { get; init; }

    /// <summary>The temperature the variables' extremes are taken at, °C (see <see cref="TemperatureBehaviour"/>).</summary>
    public double Temperature { get; init; } = TemperatureBehaviour.Reference;
}

/// <summary>
/// The variables of one stage (its resistors with a tolerance, its amplifiers' offsets and bias currents, its diodes) and
/// the elaboration options that set them. Every other stage stays at its nominal values; the stage's own amplifiers start
/// from zero offset and zero bias current so that those enter only as variables.
/// </summary>
internal sealed class ToleranceVariables
{
    private ToleranceVariables(StageProbe stage, double temperature)
    {
        Stage = stage;
        Resistors = stage.Components
            .Where(c => c.Kind == DesignRules.Model.ElementKind.Resistor)
            .OrderBy(c => c.ElementId, StringComparer.Ordinal)
            .Select(c => new ResistorVariable(c.ElementId, c.Name, c.NominalValue, Math.Abs(c.ResistorFamily?.Tolerance.Value.Value ?? 0), c.Span,
                Math.Abs(c.ResistorFamily?.Tempco.Value.Value ?? 0)))
            .ToArray();
        Amplifiers = stage.Amplifiers.OrderBy(a => a.ElementId, StringComparer.Ordinal)
            .Select(a => new AmplifierVariable(a.ElementId, Math.Abs(a.Part.OffsetVoltage.Maximum.Value.Value), Math.Abs(a.Part.BiasCurrent.Maximum.Value.Value),
                Math.Abs(a.Part.OffsetCurrent?.Maximum.Value.Value ?? 0), Math.Abs(a.Part.OffsetDrift?.Value.Value ?? 0),
                a.Part.BiasDoubling?.Value.Value ?? 0))
            .ToArray();
        Diodes = stage.Diodes.OrderBy(d => d.ElementId, StringComparer.Ordinal)
            .Select(d => new DiodeVariable(d.ElementId, d.Model.EmissionCoefficient * PhysicalConstants.ThermalVoltage(temperature),
                d.Part.ForwardVoltageCoefficient?.Value.Value ?? TemperatureBehaviour.DiodeForwardVoltageCoefficient))
            .ToArray();
    }

    private ToleranceVariables(ToleranceVariables other, double celsius)
    {
        Stage = other.Stage;
        Resistors = other.Resistors;
        Amplifiers = other.Amplifiers;
        Diodes = other.Diodes;
        Temperature = celsius;
    }

    public StageProbe Stage { get; }

    /// <summary>The temperature <see cref="Nominal"/> is taken at, °C.</summary>
    public double Temperature { get; } = TemperatureBehaviour.Reference;

    /// <summary>The same variables with their extremes taken at <paramref name="celsius"/>.</summary>
    public ToleranceVariables At(double celsius) => new(this, celsius);

    public IReadOnlyList<ResistorVariable> Resistors { get; }

    /// <summary>The resistors that actually vary (a tolerance above zero).</summary>
    public IEnumerable<int> Toleranced => Enumerable.Range(0, Resistors.Count).Where(i => Resistors[i].Tolerance > 0);

    public IReadOnlyList<AmplifierVariable> Amplifiers { get; }

    public IReadOnlyList<DiodeVariable> Diodes { get; }

    /// <summary>Every variable at its nominal value.</summary>
    public Variation Nominal => new(new double[Resistors.Count], new double[Amplifiers.Count], new double[Amplifiers.Count], new double[Diodes.Count])
    {
        OffsetCurrents = new double[Amplifiers.Count],
        Temperature = Temperature,
    };

    public static ToleranceVariables Of(StageProbe stage, ElaborationOptions options) => new(stage, options.Temperature);

    /// <summary>The elaboration options that realise a variation on top of <paramref name="baseline"/>.</summary>
    public ElaborationOptions Options(ElaborationOptions baseline, Variation v)
    {
        var values = new Dictionary<string, double>(StringComparer.Ordinal);
        for (int i = 0; i < Resistors.Count; i++)
        {
            if (Resistors[i].Tolerance > 0 && v.Resistors[i] != 0)
            {
                values[Resistors[i].ElementId] = Resistors[i].Nominal * (1 + (v.Resistors[i] * TemperatureBehaviour.ResistorSpread(Resistors[i], v.Temperature)));
            }
        }

        var offsets = new Dictionary<string, double>(StringComparer.Ordinal);
        var biases = new Dictionary<string, BiasCurrents>(StringComparer.Ordinal);
        for (int i = 0; i < Amplifiers.Count; i++)
        {
            offsets[Amplifiers[i].ElementId] = v.Offsets[i] * TemperatureBehaviour.Offset(Amplifiers[i], v.Temperature);
            double growth = TemperatureBehaviour.BiasGrowth(Amplifiers[i], v.Temperature);
            double ib = v.Biases[i] * Amplifiers[i].MaximumBias * growth;
            double ios = v.OffsetCurrents[i] * Amplifiers[i].MaximumOffsetCurrent * growth;
            biases[Amplifiers[i].ElementId] = new BiasCurrents(ib + (ios / 2), ib - (ios / 2));
        }

        var diodes = new Dictionary<string, double>(StringComparer.Ordinal);
        for (int i = 0; i < Diodes.Count; i++)
        {
            double shift = (v.Diodes[i] * DiodeSpread.ForwardVoltage) + TemperatureBehaviour.DiodeShift(Diodes[i], v.Temperature);
            if (shift != 0)
            {
                diodes[Diodes[i].ElementId] = DiodeSpread.SaturationScale(Diodes[i], shift);
            }
        }

        return baseline with { Values = values, OffsetVoltages = offsets, BiasCurrents = biases, DiodeSaturationScales = diodes };
    }
}
