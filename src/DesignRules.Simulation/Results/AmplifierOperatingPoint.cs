namespace DesignRules.Simulation.Results;

/// <summary>State of one amplifier at a DC operating point.</summary>
/// <param name="Id">Amplifier id.</param>
/// <param name="OutputVoltage">Output node voltage, V.</param>
/// <param name="OutputCurrent">Current delivered by the output pin into its node, A.</param>
/// <param name="DifferentialInput">v(+) − v(−) at the pins, V.</param>
/// <param name="AtSwingLimit">True when the output stage is held at a swing limit.</param>
/// <param name="CurrentLimited">True when the output current is at 90 % or more of its limit.</param>
/// <param name="InputOutsideCommonModeRange">True when an input lies outside the common-mode range.</param>
public sealed record AmplifierOperatingPoint(
    string Id, double OutputVoltage, double OutputCurrent, double DifferentialInput, bool AtSwingLimit, bool CurrentLimited, bool InputOutsideCommonModeRange);
