using DesignRules.Model;

namespace DesignRules.Rules.Evaluation;

/// <summary>
/// The noise gain 1/β of each amplifier of a built-in block, from its feedback network (textbook: 1 + Zf/Zg, where Zg
/// is everything from the inverting input to signal sources and ground). Null for explicit netlists.
/// </summary>
internal static class NoiseGain
{
    public static double? Of(Stage stage, string slot)
    {
        if (stage is not BlockStage block)
        {
            return null;
        }

        double V(string name) => StageParts.Value(block, name) ?? double.NaN;
        var gain = (block.Block.Name, slot) switch
        {
            ("inverting", _) => 1 + (V("rf") / V("rin")),
            ("non-inverting", _) => 1 + (V("rf") / V("rg")),
            ("difference", _) => 1 + (V("r2") / V("r1")),
            ("summing", _) => 1 + (V("rf") / Parallel(V("r1"), StageParts.Value(block, "r2"))),
            ("half-wave-inverting", _) => 1 + (V("rf") / V("rin")),
            ("absolute-value", "u1") => 1 + (V("r2") / V("r1")),
            ("absolute-value", "u2") => 1 + (V("r5") / Parallel(V("r3"), V("r4"))),
            _ => 1.0, // followers, the follower rectifier, the peak detector's loops and buffers
        };
        return double.IsFinite(gain) ? gain : null;
    }

    private static double Parallel(double a, double? b) => b is null ? a : a * b.Value / (a + b.Value);
}
