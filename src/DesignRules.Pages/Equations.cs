using System.Globalization;
using DesignRules.Model;

namespace DesignRules.Pages;

/// <summary>The ideal transfer of each built-in block as an equation, with its value from the component values.</summary>
internal static class Equations
{
    public static string Of(Stage stage)
    {
        if (stage is not BlockStage b)
        {
            return stage.Requirements.Gain is { } g ? $"v_out = {Number(g.Value.Value)}·v_in (required)" : "given by the netlist";
        }

        double V(string name) => b.Values.TryGetValue(name, out var v) ? v.Si : double.NaN;
        return b.Block.Name switch
        {
            "inverting" => $"v_out = −(rf/rin)·v_in = {Number(-V("rf") / V("rin"))}·v_in",
            "non-inverting" => $"v_out = (1 + rf/rg)·v_in = {Number(1 + (V("rf") / V("rg")))}·v_in",
            "follower" => "v_out = v_in",
            "difference" => $"v_out = (r2/r1)·(v₊ − v₋) = {Number(V("r2") / V("r1"))}·(v₊ − v₋), with r4/r3 = r2/r1",
            "summing" => b.Values.ContainsKey("r2") && b.Values.ContainsKey("bias")
                ? $"v_out = −rf·(v_in/r1 + bias/r2) = {Number(-V("rf") / V("r1"))}·v_in {Signed(-V("rf") / V("r2") * V("bias"))} V"
                : $"v_out = −(rf/r1)·v_in = {Number(-V("rf") / V("r1"))}·v_in",
            "half-wave-inverting" => $"v_out = −(rf/rin)·max(v_in, 0) = {Number(-V("rf") / V("rin"))}·max(v_in, 0)",
            "half-wave-follower" => "v_out = max(v_in, 0)",
            "absolute-value" => $"v_out = |v_in| (r5/r3 = {Number(V("r5") / V("r3"))}, (r5/r4)·(r2/r1) = {Number(V("r5") / V("r4") * V("r2") / V("r1"))})",
            "peak-detector" => $"v_out = peak of v_in, decaying with τ = rdis·chold = {new Quantities.Quantity(V("rdis") * V("chold"), Quantities.Dimension.Time).Format()}",
            "averaging-filter" => $"v_out = average of v_in, τ = r·c = {new Quantities.Quantity(V("r") * V("c"), Quantities.Dimension.Time).Format()}",
            _ => "see the block's description",
        };
    }

    private static string Number(double x) => x.ToString("0.####", CultureInfo.InvariantCulture).Replace("-", "−", StringComparison.Ordinal);

    private static string Signed(double x) => x < 0 ? "− " + Number(-x) : "+ " + Number(x);
}
