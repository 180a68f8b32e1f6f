using System.Numerics;

namespace DesignRules.Simulation.Analysis;

/// <summary>The complex MNA system of an AC small-signal point, linearised at the operating point held in <see cref="X"/>.</summary>
internal sealed class AcLoadContext(int size, BandOrdering? ordering = null, HashSet<(int, int)>? record = null)
{
    /// <summary>Complex matrix and right-hand side (or, in a recording context, only the positions loaded).</summary>
    public DenseLu<Complex> System { get; } = record is null ? new(size, ordering) : DenseLu<Complex>.Recorder(size, record);

    /// <summary>Operating point.</summary>
    public double[] X { get; } = new double[size];

    /// <summary>Angular frequency ω in rad/s.</summary>
    public double Omega { get; set; }

    /// <summary>Conductance across every diode junction in S (<see cref="SolverLimits.JunctionShunt"/>).</summary>
    public double JunctionShunt { get; set; }

    /// <summary>Circuit temperature in K.</summary>
    public double Temperature { get; set; } = PhysicalConstants.DefaultTemperature;

    /// <summary>Adds <paramref name="value"/> at (row, column) unless either is the reference.</summary>
    public void Add(int row, int column, Complex value)
    {
        if (row >= 0 && column >= 0) System.Add(row, column, value);
    }

    /// <summary>Adds to the right-hand side unless the row is the reference.</summary>
    public void AddRhs(int row, Complex value)
    {
        if (row >= 0) System.Rhs[row] += value;
    }

    /// <summary>Operating-point voltage of unknown <paramref name="index"/> (0 for the reference).</summary>
    public double V(int index) => index >= 0 ? X[index] : 0;

    /// <summary>Stamps an admittance between two nodes.</summary>
    public void Admittance(int a, int b, Complex y)
    {
        Add(a, a, y);
        Add(b, b, y);
        Add(a, b, -y);
        Add(b, a, -y);
    }

    /// <summary>
    /// Id of the amplifier whose loop is broken at its controlling input for a loop-gain analysis (its drive takes a
    /// unit injected differential input), or null for an ordinary AC point.
    /// </summary>
    public string? BrokenAmplifier { get; set; }

    /// <summary>Id of the source that carries the small-signal stimulus.</summary>
    public string Stimulus { get; init; } = string.Empty;

    /// <summary>Amplitude of the stimulus, V or A, at zero phase.</summary>
    public double StimulusAmplitude { get; init; } = 1;

    /// <summary>Small-signal value of an independent source: the stimulus amplitude for the requested source, zero for every other.</summary>
    public Complex SourcePhasor(string id) => string.Equals(id, Stimulus, StringComparison.Ordinal) ? new Complex(StimulusAmplitude, 0) : Complex.Zero;
}
