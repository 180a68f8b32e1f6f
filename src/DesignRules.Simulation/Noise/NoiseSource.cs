using System.Numerics;

namespace DesignRules.Simulation.Noise;

/// <summary>The physical origin of a noise contributor.</summary>
public enum NoiseKind
{
    /// <summary>Thermal (Johnson–Nyquist) noise of a resistor: current density 4kT/R A²/Hz across it.</summary>
    Thermal,

    /// <summary>An amplifier's input voltage noise e_n (with its 1/f part), in series with its non-inverting input.</summary>
    AmplifierVoltage,

    /// <summary>An amplifier's input current noise i_n at its non-inverting input.</summary>
    AmplifierCurrentNonInverting,

    /// <summary>An amplifier's input current noise i_n at its inverting input.</summary>
    AmplifierCurrentInverting,

    /// <summary>Shot noise of a diode's junction current, 2qI A²/Hz (Schottky).</summary>
    Shot,
}

/// <summary>
/// One independent noise source of the linearised circuit: where it enters the small-signal equations (a sparse
/// right-hand-side vector per unit of the source) and its one-sided power density at a frequency.
/// </summary>
internal sealed class NoiseSource(string element, NoiseKind kind, (int Row, double Weight)[] injection, double white, double corner)
{
    /// <summary>Id of the element the source belongs to.</summary>
    public string Element { get; } = element;

    public NoiseKind Kind { get; } = kind;

    /// <summary>Right-hand-side rows the source enters, with its weight in each (a current between two nodes: +1 and −1).</summary>
    public (int Row, double Weight)[] Injection { get; } = injection;

    /// <summary>White power density, V²/Hz or A²/Hz.</summary>
    public double White { get; } = white;

    /// <summary>1/f corner in Hz (0: white).</summary>
    public double Corner { get; } = corner;

    /// <summary>One-sided power density at <paramref name="frequency"/> Hz: white·(1 + f_c/f).</summary>
    public double Density(double frequency) => Corner > 0 ? White * (1 + (Corner / frequency)) : White;

    /// <summary>Transfer from the source to the output given the adjoint solution y (Aᵀy = e_out): Σ weight·y[row].</summary>
    public Complex Transfer(ReadOnlySpan<Complex> adjoint)
    {
        var sum = Complex.Zero;
        foreach (var (row, weight) in Injection) sum += weight * adjoint[row];
        return sum;
    }

    /// <summary>
    /// The noise sources of a compiled circuit at its operating point <paramref name="x"/>: every resistor (4kT/R),
    /// every amplifier with a stated noise (e_n in its drive equation, i_n at each input) and every diode (2q|I|).
    /// Sources of zero density are left out.
    /// </summary>
    public static List<NoiseSource> Collect(CompiledCircuit compiled, double[] x)
    {
        double kT = PhysicalConstants.Boltzmann * compiled.Temperature;
        var list = new List<NoiseSource>();
        foreach (var device in compiled.Devices)
        {
            switch (device)
            {
                case ResistorDevice r:
                    list.Add(new NoiseSource(r.Id, NoiseKind.Thermal, Between(r.A, r.B), 4 * kT * r.Conductance, 0));
                    break;
                case AmplifierDevice a:
                    AddAmplifier(list, a, x);
                    break;
                case DiodeDevice d:
                    double current = Math.Abs(d.JunctionCurrent(x, compiled.Temperature));
                    if (current > 0) list.Add(new NoiseSource(d.Id, NoiseKind.Shot, Between(d.Junction, d.Cathode), 2 * PhysicalConstants.ElementaryCharge * current, 0));
                    break;
            }
        }

        return list;
    }

    private static void AddAmplifier(List<NoiseSource> list, AmplifierDevice a, double[] x)
    {
        var model = a.Parameters.Model;
        var n = a.Nodes;
        if (model.InputVoltageNoise > 0)
        {
            // e_n in series with the non-inverting input adds to the differential input; the linearised drive row is
            // −s·(v+ − v−) + …, so e_n enters its right-hand side with weight s (the drive slope at the operating point).
            double slope = a.Evaluate(x, dc: true).DriveSlope;
            list.Add(new NoiseSource(a.Id, NoiseKind.AmplifierVoltage, [(n.Drive, slope)], model.InputVoltageNoise * model.InputVoltageNoise, model.NoiseCorner));
        }

        if (model.InputCurrentNoise > 0)
        {
            double power = model.InputCurrentNoise * model.InputCurrentNoise;
            if (n.Plus >= 0) list.Add(new NoiseSource(a.Id, NoiseKind.AmplifierCurrentNonInverting, [(n.Plus, 1)], power, 0));
            if (n.Minus >= 0) list.Add(new NoiseSource(a.Id, NoiseKind.AmplifierCurrentInverting, [(n.Minus, 1)], power, 0));
        }
    }

    private static (int, double)[] Between(int a, int b) =>
        a >= 0 && b >= 0 ? [(a, 1), (b, -1)] : a >= 0 ? [(a, 1)] : b >= 0 ? [(b, -1)] : [];
}
