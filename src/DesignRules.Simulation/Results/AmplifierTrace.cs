namespace DesignRules.Simulation.Results;

/// <summary>
/// What the engine recorded for one amplifier at every accepted transient time point (aligned with
/// <see cref="TransientResult.Time"/>).
/// </summary>
public sealed class AmplifierTrace
{
    internal AmplifierTrace(string id, string outputNode, AmplifierModel model, SupplyRails rails, bool[] slew, bool[] swing, bool[] current, bool[] commonMode, double[] differential, double[] outputCurrent)
    {
        Id = id;
        OutputNode = outputNode;
        Model = model;
        Rails = rails;
        SlewLimited = slew;
        AtSwingLimit = swing;
        CurrentLimited = current;
        InputOutsideCommonModeRange = commonMode;
        DifferentialInput = differential;
        OutputCurrent = outputCurrent;
    }

    /// <summary>Amplifier id.</summary>
    public string Id { get; }

    /// <summary>Name of the output node.</summary>
    public string OutputNode { get; }

    /// <summary>Model parameters.</summary>
    public AmplifierModel Model { get; }

    /// <summary>Supply rails.</summary>
    public SupplyRails Rails { get; }

    /// <summary>True where the internal rate is at 90 % or more of the slew rate in its direction (and the output is not at a swing limit).</summary>
    public IReadOnlyList<bool> SlewLimited { get; }

    /// <summary>True where the output stage is within 2 mV of (or held at) a swing limit.</summary>
    public IReadOnlyList<bool> AtSwingLimit { get; }

    /// <summary>True where the output current is at 90 % or more of the current limit.</summary>
    public IReadOnlyList<bool> CurrentLimited { get; }

    /// <summary>True where either input lies outside the common-mode range.</summary>
    public IReadOnlyList<bool> InputOutsideCommonModeRange { get; }

    /// <summary>v(+) − v(−) at the pins, V.</summary>
    public IReadOnlyList<double> DifferentialInput { get; }

    /// <summary>Current delivered by the output pin into the output node, A.</summary>
    public IReadOnlyList<double> OutputCurrent { get; }
}
