namespace DesignRules.Simulation.Analysis;

/// <summary>What an unknown of the modified nodal equations stands for.</summary>
internal enum UnknownKind
{
    /// <summary>A node voltage (circuit node or element-internal node), in V.</summary>
    NodeVoltage,

    /// <summary>A branch current of a voltage-defined element, in A.</summary>
    BranchCurrent,

    /// <summary>An internal state of a behavioural model, expressed in volts.</summary>
    ModelState,
}
