namespace DesignRules.Simulation.Circuits;

/// <summary>
/// Variants of a circuit for "what if" questions (a stronger isolation, a smaller load, a step instead of the
/// waveform): each returns a new circuit and leaves this one unchanged.
/// </summary>
public sealed partial class Circuit
{
    /// <summary>
    /// The capacitors that a node drives to a small-signal ground: those between the node and the reference, or a node
    /// an independent voltage source holds against the reference (a supply rail, a load's return level).
    /// </summary>
    /// <param name="node">Node name (an amplifier's output).</param>
    public IReadOnlyList<string> CapacitorsToFixedNodes(string node)
    {
        ArgumentNullException.ThrowIfNull(node);
        var fixedNodes = elements.OfType<VoltageSourceDefinition>()
            .SelectMany(v => IsReference(v.Minus) ? [v.Plus] : IsReference(v.Plus) ? new[] { v.Minus } : [])
            .ToHashSet(StringComparer.Ordinal);
        bool Fixed(string n) => IsReference(n) || fixedNodes.Contains(n);
        return elements.OfType<CapacitorDefinition>()
            .Where(c => (c.A == node && Fixed(c.B)) || (c.B == node && Fixed(c.A)))
            .Select(c => c.Id)
            .ToArray();
    }

    /// <summary>Capacitance of a capacitor in F, or null when there is no capacitor of that id.</summary>
    /// <param name="id">Element id.</param>
    public double? Capacitance(string id) => elements.OfType<CapacitorDefinition>().FirstOrDefault(c => c.Id == id)?.Capacitance;

    /// <summary>
    /// A copy in which the named capacitors reach <paramref name="node"/> only through a new series resistor of
    /// <paramref name="resistance"/> Ω (id and new node <c>node + "#iso"</c>): an isolation resistor between an amplifier's
    /// output, where the feedback is taken, and its capacitive load.
    /// </summary>
    /// <param name="node">The node the capacitors hang on.</param>
    /// <param name="capacitorIds">Capacitors to isolate.</param>
    /// <param name="resistance">Isolation resistance in Ω.</param>
    public Circuit WithIsolatedCapacitors(string node, IReadOnlyCollection<string> capacitorIds, double resistance)
    {
        ArgumentNullException.ThrowIfNull(node);
        ArgumentNullException.ThrowIfNull(capacitorIds);
        string isolated = node + "#iso";
        var copy = Copy(e => e is CapacitorDefinition c && capacitorIds.Contains(c.Id)
            ? c with { A = c.A == node ? isolated : c.A, B = c.B == node ? isolated : c.B }
            : e);
        return copy.Add(new ResistorDefinition(node + "#iso", node, isolated, resistance));
    }

    /// <summary>A copy with the named capacitors' values multiplied by <paramref name="factor"/>.</summary>
    /// <param name="capacitorIds">Capacitors to scale.</param>
    /// <param name="factor">Factor (positive).</param>
    public Circuit WithCapacitorsScaled(IReadOnlyCollection<string> capacitorIds, double factor)
    {
        ArgumentNullException.ThrowIfNull(capacitorIds);
        return Copy(e => e is CapacitorDefinition c && capacitorIds.Contains(c.Id) ? c with { Capacitance = c.Capacitance * factor } : e);
    }

    /// <summary>A copy in which the independent voltage source <paramref name="sourceId"/> follows <paramref name="waveform"/>.</summary>
    /// <param name="sourceId">Voltage source id.</param>
    /// <param name="waveform">The new waveform.</param>
    public Circuit WithWaveform(string sourceId, Waveform waveform)
    {
        ArgumentNullException.ThrowIfNull(sourceId);
        ArgumentNullException.ThrowIfNull(waveform);
        return Copy(e => e is VoltageSourceDefinition v && v.Id == sourceId ? v with { Waveform = waveform } : e);
    }

    /// <summary>
    /// A copy in which each named amplifier's gain-bandwidth product is multiplied by its factor (its dominant pole moves
    /// with it, ωp = ωu/A0; open-loop gain, second pole and slew rates stay): an amplifier at another temperature.
    /// </summary>
    /// <param name="factors">Factor (positive) by amplifier element id; amplifiers not named keep theirs.</param>
    public Circuit WithGainBandwidthScaled(IReadOnlyDictionary<string, double> factors)
    {
        ArgumentNullException.ThrowIfNull(factors);
        return Copy(e => e is AmplifierDefinition a && factors.TryGetValue(a.Id, out var factor)
            ? a with { Model = a.Model with { GainBandwidth = a.Model.GainBandwidth * factor } }
            : e);
    }

    /// <summary>
    /// A copy without the named elements: an amplifier and the diodes around it taken out, to see how the rest of the
    /// circuit divides a signal while that amplifier's loop is open (a precision rectifier in its dead zone).
    /// </summary>
    /// <param name="elementIds">Ids of the elements to leave out.</param>
    public Circuit Without(IReadOnlyCollection<string> elementIds)
    {
        ArgumentNullException.ThrowIfNull(elementIds);
        var copy = new Circuit { Temperature = Temperature };
        foreach (var element in elements.Where(e => !elementIds.Contains(e.Id))) copy.Add(element);
        return copy;
    }

    private Circuit Copy(Func<ElementDefinition, ElementDefinition> change)
    {
        var copy = new Circuit { Temperature = Temperature };
        foreach (var element in elements) copy.Add(change(element));
        return copy;
    }
}
