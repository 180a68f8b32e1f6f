namespace DesignRules.Simulation.Models;

/// <summary>Supply rails of an amplifier, as fixed values in V (the rails are not circuit nodes).</summary>
/// <param name="Positive">Positive rail Vpos in V.</param>
/// <param name="Negative">Negative rail Vneg in V (0 for a single supply).</param>
public sealed record SupplyRails(double Positive, double Negative)
{
    internal string? Validate() =>
        double.IsFinite(Positive) && double.IsFinite(Negative) && Positive > Negative ? null : "the positive rail must be above the negative rail";
}
