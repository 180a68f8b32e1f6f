namespace DesignRules.Simulation.Analysis;

/// <summary>Which equations the devices load.</summary>
internal enum AnalysisMode
{
    /// <summary>DC: time derivatives are zero (capacitors open, inductors short).</summary>
    Dc,

    /// <summary>Transient: derivatives come from the integration formula.</summary>
    Transient,
}
