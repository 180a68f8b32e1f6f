using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures;

/// <summary>
/// The noise gain 1/β of each amplifier: from the block's feedback network for a built-in block (textbook: 1 + Zf/Zg,
/// where Zg is everything from the inverting input to signal sources and ground), and from the circuit for an explicit
/// netlist (<see cref="OfCircuit"/>).
/// </summary>
internal static class NoiseGain
{
    public static double? Of(Stage stage, string slot)
    {
        // The block's descriptor knows its feedback network; a netlist's comes from the circuit (OfCircuit).
        var gain = stage is BlockStage block ? block.Block.NoiseGain(slot, Blocks.BlockValues.Of(block)) : null;
        return gain is { } g && double.IsFinite(g) ? g : null;
    }

    /// <summary>
    /// The noise gain of one amplifier of a stage computed from the circuit: an AC analysis of the stage's feedback network
    /// alone, driven at the amplifier's output with the amplifier removed. The stage input, the supplies and the outputs
    /// of the stage's other amplifiers are AC ground (each is driven by a low impedance); every diode is taken as
    /// conducting (series resistance plus its small-signal resistance at 1 mA), since a loop closed through a conducting
    /// diode is where stability is least. β is the differential feedback (v− − v+)/vout; the noise gain is 1/|β| at the
    /// loop's crossover, the frequency where the single-pole open-loop gain min(A0, GBW/f) times |β| falls to 1
    /// (capacitors in the feedback network make β depend on frequency; it is the crossover that decides stability).
    /// Null when the network could not be analysed; infinity when no feedback reaches the inputs (an open loop).
    /// </summary>
    public static double? OfCircuit(StageProbe stage, AmplifierProbe amplifier)
    {
        var grounded = new HashSet<string>(StringComparer.Ordinal) { stage.InputNode, stage.ReferenceInputNode, "vpos", "vneg" };
        foreach (var other in stage.Amplifiers.Where(a => a.ElementId != amplifier.ElementId)) grounded.Add(other.OutputNode);
        grounded.Remove(amplifier.OutputNode);
        string Map(string node) => Circuit.IsReference(node) || grounded.Contains(node) ? Circuit.Ground : node;

        var circuit = new Circuit();
        var nodes = new HashSet<string>(StringComparer.Ordinal);
        void Track(string a, string b)
        {
            if (a != Circuit.Ground) nodes.Add(a);
            if (b != Circuit.Ground) nodes.Add(b);
        }

        foreach (var c in stage.Components)
        {
            string a = Map(c.NodeA), b = Map(c.NodeB);
            if (a == b) continue;
            Track(a, b);
            switch (c.Kind)
            {
                case ElementKind.Resistor: circuit.AddResistor(c.ElementId, a, b, c.Value); break;
                case ElementKind.Capacitor: circuit.AddCapacitor(c.ElementId, a, b, c.Value); break;
                case ElementKind.Inductor: circuit.AddInductor(c.ElementId, a, b, c.Value); break;
            }
        }

        foreach (var d in stage.Diodes)
        {
            string a = Map(d.Anode), b = Map(d.Cathode);
            if (a == b) continue;
            Track(a, b);
            double conducting = d.Model.SeriesResistance + (d.Model.EmissionCoefficient * 0.025852 / 1e-3);
            circuit.AddResistor(d.ElementId, a, b, conducting);
        }

        string output = Map(amplifier.OutputNode), minus = Map(amplifier.InvertingNode), plus = Map(amplifier.NonInvertingNode);
        if (output == Circuit.Ground)
        {
            return null;
        }

        Track(output, minus);
        Track(plus, Circuit.Ground);
        circuit.AddVoltageSource("noise-gain.drive", output, Circuit.Ground, new DcWaveform(0));

        // A very large resistance from every node to ground gives nodes reached only through capacitors a DC operating
        // point without changing β measurably.
        foreach (var node in nodes.Where(n => n != output).Order(StringComparer.Ordinal))
        {
            circuit.AddResistor($"noise-gain.leak.{node}", node, Circuit.Ground, 1e12);
        }

        var model = amplifier.Model;
        var sweep = Simulation.Analysis.AcSweep.Decades("noise-gain.drive", 1, Math.Max(10, model.GainBandwidth * 10), 20);
        var ac = Simulate.AcSweep(circuit, sweep);
        if (!ac.Succeeded)
        {
            return null;
        }

        var vMinus = minus == Circuit.Ground ? null : ac.Voltage(minus);
        var vPlus = plus == Circuit.Ground ? null : ac.Voltage(plus);
        double beta = 0;
        for (int i = 0; i < ac.Frequencies.Count; i++)
        {
            var feedback = (vMinus?[i] ?? 0) - (vPlus?[i] ?? 0);
            beta = feedback.Magnitude;
            double openLoop = Math.Min(model.OpenLoopGain, model.GainBandwidth / ac.Frequencies[i]);
            if (openLoop * beta <= 1)
            {
                break;
            }
        }

        return beta > 1e-9 ? 1 / beta : double.PositiveInfinity;
    }
}
