namespace DesignRules.Simulation.Analysis;

/// <summary>
/// Everything a device needs to load its linearised (companion) contribution into the real MNA system at one
/// Newton iteration: the present guess, the mode, the time, the source scale of the source ramp and the
/// integration coefficients. Rows are Kirchhoff current laws (sum of currents leaving the node = 0) or the
/// element's own branch/state equation; the system reads A·x = b.
/// </summary>
internal sealed class LoadContext(int size, int stateCount, BandOrdering? ordering = null, HashSet<(int, int)>? record = null)
{
    /// <summary>Matrix and right-hand side (or, in a recording context, only the positions loaded).</summary>
    public DenseLu<double> System { get; } = record is null ? new(size, ordering) : DenseLu<double>.Recorder(size, record);

    /// <summary>Present Newton guess (linearisation point).</summary>
    public double[] X { get; } = new double[size];

    /// <summary>Charge-like value of each integrated state at the present guess (written by the devices).</summary>
    public double[] Charge { get; } = new double[stateCount];

    /// <summary>History term of each integrated state: dq/dt ≈ <see cref="Alpha"/>·q + History.</summary>
    public double[] History { get; } = new double[stateCount];

    /// <summary>DC or transient.</summary>
    public AnalysisMode Mode { get; set; }

    /// <summary>Simulated time in s (0 in DC).</summary>
    public double Time { get; set; }

    /// <summary>Scale applied to every independent source (the source ramp); 1 normally.</summary>
    public double SourceScale { get; set; } = 1;

    /// <summary>Conductance across every diode junction in S (<see cref="SolverLimits.JunctionShunt"/>).</summary>
    public double JunctionShunt { get; set; }

    /// <summary>Leading coefficient of the integration formula (1/s); 0 in DC.</summary>
    public double Alpha { get; set; }

    /// <summary>Circuit temperature in K.</summary>
    public double Temperature { get; set; } = PhysicalConstants.DefaultTemperature;

    /// <summary>Set by a device that limited a junction voltage this iteration (the iteration then cannot count as converged).</summary>
    public bool Limited { get; set; }

    /// <summary>Name of the last element that limited, for failure messages.</summary>
    public string? LimitedBy { get; set; }

    /// <summary>True when the first Newton iteration of a solve is being loaded.</summary>
    public bool FirstIteration { get; set; }

    /// <summary>Source value to use instead of the waveform for one named source (DC sweep), or null.</summary>
    public string? OverrideSource { get; set; }

    /// <summary>True when DC equations should use the sources' values at <see cref="Time"/> (the transient's initial operating point).</summary>
    public bool UseTimeValues { get; set; }

    /// <summary>Value of <see cref="OverrideSource"/>.</summary>
    public double OverrideValue { get; set; }

    /// <summary>Stores the charge of state <paramref name="state"/> and returns its time derivative (0 in DC).</summary>
    public double Derivative(int state, double charge)
    {
        Charge[state] = charge;
        return Mode == AnalysisMode.Dc ? 0 : (Alpha * charge) + History[state];
    }

    /// <summary>Adds <paramref name="value"/> at (row, column) unless either is the reference.</summary>
    public void Add(int row, int column, double value)
    {
        if (row >= 0 && column >= 0) System.Add(row, column, value);
    }

    /// <summary>Adds to the right-hand side unless the row is the reference.</summary>
    public void AddRhs(int row, double value)
    {
        if (row >= 0) System.Rhs[row] += value;
    }

    /// <summary>Voltage of unknown <paramref name="index"/> (0 for the reference).</summary>
    public double V(int index) => index >= 0 ? X[index] : 0;

    /// <summary>Stamps a conductance between two nodes.</summary>
    public void Conductance(int a, int b, double g)
    {
        Add(a, a, g);
        Add(b, b, g);
        Add(a, b, -g);
        Add(b, a, -g);
    }

    /// <summary>
    /// Stamps a non-linear current <paramref name="current"/> flowing from node a to node b through an element, with
    /// conductance <paramref name="g"/> = dI/d(va − vb) at the present controlling voltage <paramref name="v"/>.
    /// </summary>
    public void NonlinearBranch(int a, int b, double current, double g, double v)
    {
        Conductance(a, b, g);
        double equivalent = current - (g * v);
        AddRhs(a, -equivalent);
        AddRhs(b, equivalent);
    }
}
