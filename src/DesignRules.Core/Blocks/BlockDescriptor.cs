namespace DesignRules.Model;

/// <summary>What a built-in topology needs: its value names, yes/no options and part slots.</summary>
/// <param name="Name">The block name used in design files.</param>
/// <param name="Summary">One line on what it is.</param>
/// <param name="RequiredValues">Component values that must be given.</param>
/// <param name="OptionalValues">Component values that may be given.</param>
/// <param name="Flags">Yes/no options.</param>
/// <param name="AmplifierSlots">Amplifier slots (always filled).</param>
/// <param name="OptionalAmplifierSlots">Amplifier slots filled only when an option asks (e.g. an output buffer).</param>
/// <param name="DiodeSlots">Diode slots.</param>
public sealed record BlockDefinition(
    string Name,
    string Summary,
    IReadOnlyList<string> RequiredValues,
    IReadOnlyList<string> OptionalValues,
    IReadOnlyList<string> Flags,
    IReadOnlyList<string> AmplifierSlots,
    IReadOnlyList<string> OptionalAmplifierSlots,
    IReadOnlyList<string> DiodeSlots)
{
    /// <summary>Every value name the block accepts.</summary>
    public IEnumerable<string> AllValues => RequiredValues.Concat(OptionalValues);
}

/// <summary>The built-in topologies.</summary>
public static class BlockCatalog
{
    /// <summary>Every built-in block, by name.</summary>
    public static IReadOnlyDictionary<string, BlockDefinition> All { get; } = new[]
    {
        new BlockDefinition("inverting", "Inverting amplifier, gain −rf/rin", ["rin", "rf"], ["rcomp"], [], ["u1"], [], []),
        new BlockDefinition("non-inverting", "Non-inverting amplifier, gain 1 + rf/rg", ["rg", "rf"], [], [], ["u1"], [], []),
        new BlockDefinition("follower", "Unity-gain buffer", [], [], [], ["u1"], [], []),
        new BlockDefinition("difference", "Difference amplifier, (r2/r1)·(v+ − v−)", ["r1", "r2", "r3", "r4"], [], [], ["u1"], [], []),
        new BlockDefinition("summing", "Inverting summer, −rf·(vin/r1 + bias/r2)", ["r1", "rf"], ["r2", "bias"], [], ["u1"], [], []),
        new BlockDefinition("half-wave-inverting", "Two-diode inverting precision half-wave rectifier", ["rin", "rf"], [], [], ["u1"], [], ["d1", "d2"]),
        new BlockDefinition("half-wave-follower", "Single-diode precision half-wave rectifier in a follower loop", [], ["rload"], [], ["u1"], [], ["d1"]),
        new BlockDefinition("absolute-value", "Full-wave absolute-value circuit: half-wave rectifier plus 2:1 summer", ["r1", "r2", "r3", "r4", "r5"], [], [], ["u1", "u2"], [], ["d1", "d2"]),
        new BlockDefinition("peak-detector", "Peak detector with hold capacitor and discharge resistor", ["rdis", "chold"], ["rser"], ["buffer"], ["u1"], ["u2"], ["d1"]),
        new BlockDefinition("averaging-filter", "First-order RC averaging filter", ["r", "c"], [], ["buffer"], [], ["u1"], []),
    }.ToDictionary(b => b.Name, StringComparer.Ordinal);
}
