using System.Globalization;
using DesignRules.Blocks;
using DesignRules.Model;

namespace DesignRules.Pages;

/// <summary>The ideal transfer of a stage as an equation: a block's from its descriptor, a netlist's from its requirement.</summary>
internal static class Equations
{
    public static string Of(Stage stage) => stage switch
    {
        BlockStage b => b.Block.Equation(BlockValues.Of(b)),
        _ => stage.Requirements.Gain is { } g ? $"v_out = {Number(g.Value.Value)}·v_in (required)" : "given by the netlist",
    };

    private static string Number(double x) => x.ToString("0.####", CultureInfo.InvariantCulture).Replace("-", "−", StringComparison.Ordinal);
}
