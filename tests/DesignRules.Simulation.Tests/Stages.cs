namespace DesignRules.Simulation.Tests;

/// <summary>Op-amp stages the amplifier tests share.</summary>
internal static class Stages
{
    public static readonly SupplyRails Rails = new(15, -15);

    /// <summary>Typical general-purpose amplifier: 1 MHz GBW, 100 dB, 8 V/µs (typical values).</summary>
    public static AmplifierModel GeneralPurpose => AmplifierModel.SinglePole(1e6, 1e5, 8e6);

    /// <summary>Non-inverting stage of gain 1 + rf/rg driven by <paramref name="drive"/> at node "in"; output "out".</summary>
    public static Circuit NonInverting(Waveform drive, AmplifierModel model, double rf, double rg)
    {
        var circuit = new Circuit().AddVoltageSource("vin", "in", Circuit.Ground, drive);
        if (rf == 0) return circuit.AddAmplifier("u1", "in", "out", "out", model, Rails);
        return circuit
            .AddAmplifier("u1", "in", "fb", "out", model, Rails)
            .AddResistor("rf", "out", "fb", rf)
            .AddResistor("rg", "fb", Circuit.Ground, rg);
    }

    /// <summary>Inverting stage of gain −rf/rin driven at node "in"; output "out"; summing node "sum".</summary>
    public static Circuit Inverting(Waveform drive, AmplifierModel model, double rf, double rin) => new Circuit()
        .AddVoltageSource("vin", "in", Circuit.Ground, drive)
        .AddResistor("rin", "in", "sum", rin)
        .AddResistor("rf", "sum", "out", rf)
        .AddAmplifier("u1", Circuit.Ground, "sum", "out", model, Rails);

    /// <summary>Time at which a rising (or falling) series first crosses <paramref name="level"/>, interpolated.</summary>
    public static double Crossing(IReadOnlyList<double> time, IReadOnlyList<double> values, double level, double from = 0, bool rising = true)
    {
        for (int i = 1; i < time.Count; i++)
        {
            if (time[i] < from) continue;
            bool crossed = rising ? values[i - 1] < level && values[i] >= level : values[i - 1] > level && values[i] <= level;
            if (crossed) return time[i - 1] + ((time[i] - time[i - 1]) * (level - values[i - 1]) / (values[i] - values[i - 1]));
        }

        return double.NaN;
    }
}
