using DesignRules.Simulation;

namespace DesignRules.Elaboration.Blocks;

/// <summary>
/// Inverting amplifier: rin from the input to the summing junction <c>id.sum</c>, rf from <c>id.sum</c> to the output
/// <c>id.out</c>; the + input on ground, or on <c>id.ref</c> through rcomp when given. Ideal gain −rf/rin.
/// </summary>
internal sealed class InvertingBlock : IBlockBuilder
{
    public string Name => "inverting";

    public StageProbe Build(StageBuilder s)
    {
        string sum = s.Node("sum"), output = s.Node("out");
        string plus = Circuit.Ground;
        if (s.Has("rcomp"))
        {
            plus = s.Node("ref");
            s.Resistor("rcomp", plus, Circuit.Ground);
        }

        s.Resistor("rin", s.Input, sum);
        s.Resistor("rf", sum, output);
        s.Amplifier("u1", plus, sum, output);
        s.SummingJunction(sum);
        return s.Finish(output, IdealTransfer.Linear(-s.Value("rf") / s.Value("rin")));
    }
}

/// <summary>
/// Non-inverting amplifier: the input on the + input, rf from the output <c>id.out</c> to the feedback node <c>id.fb</c>,
/// rg from <c>id.fb</c> to ground. Ideal gain 1 + rf/rg.
/// </summary>
internal sealed class NonInvertingBlock : IBlockBuilder
{
    public string Name => "non-inverting";

    public StageProbe Build(StageBuilder s)
    {
        string fb = s.Node("fb"), output = s.Node("out");
        s.Resistor("rf", output, fb);
        s.Resistor("rg", fb, Circuit.Ground);
        s.Amplifier("u1", s.Input, fb, output);
        return s.Finish(output, IdealTransfer.Linear(1 + (s.Value("rf") / s.Value("rg"))));
    }
}

/// <summary>Unity-gain follower: the input on the + input, the output <c>id.out</c> fed back to the − input.</summary>
internal sealed class FollowerBlock : IBlockBuilder
{
    public string Name => "follower";

    public StageProbe Build(StageBuilder s)
    {
        string output = s.Node("out");
        s.Amplifier("u1", s.Input, output, output);
        return s.Finish(output, IdealTransfer.Linear(1));
    }
}

/// <summary>
/// Difference amplifier: r1 from the inverting signal input (the stage's reference input: ground, or the − leg of a split
/// source) to <c>id.sum</c>, r2 from <c>id.sum</c> to <c>id.out</c>; r3 from the stage input to <c>id.plus</c>, r4 from
/// <c>id.plus</c> to ground. A single-ended input therefore drives the + side: out = G+·v+ − (r2/r1)·v− with
/// G+ = r4/(r3 + r4)·(1 + r2/r1), which is (r2/r1)·(v+ − v−) when r2/r1 = r4/r3. Fed from a split source
/// (v± = cm ± v/2), the ideal transfer in terms of the differential signal v has slope (G+ + r2/r1)/2 and offset cm·(G+ − r2/r1).
/// </summary>
internal sealed class DifferenceBlock : IBlockBuilder
{
    public string Name => "difference";

    public StageProbe Build(StageBuilder s)
    {
        string sum = s.Node("sum"), plus = s.Node("plus"), output = s.Node("out");
        s.Resistor("r1", s.ReferenceInput, sum);
        s.Resistor("r2", sum, output);
        s.Resistor("r3", s.Input, plus);
        s.Resistor("r4", plus, Circuit.Ground);
        s.Amplifier("u1", plus, sum, output);
        s.SummingJunction(sum);
        double r1 = s.Value("r1"), r2 = s.Value("r2"), r3 = s.Value("r3"), r4 = s.Value("r4");
        double plusGain = r4 / (r3 + r4) * (1 + (r2 / r1));
        double minusGain = r2 / r1;
        var transfer = Circuit.IsReference(s.ReferenceInput)
            ? IdealTransfer.Linear(plusGain)
            : IdealTransfer.Linear((plusGain + minusGain) / 2, s.CommonMode * (plusGain - minusGain));
        return s.Finish(output, transfer);
    }
}

/// <summary>
/// Inverting summer: r1 from the input to <c>id.sum</c>, rf from <c>id.sum</c> to <c>id.out</c>, and when r2 is given r2 from
/// <c>id.bias</c> to <c>id.sum</c>, with <c>id.bias</c> driven to the bias value by the source <c>id.vbias</c> (0 V when no bias
/// is given). Ideal out = −rf·(vin/r1 + bias/r2).
/// </summary>
internal sealed class SummingBlock : IBlockBuilder
{
    public string Name => "summing";

    public StageProbe Build(StageBuilder s)
    {
        string sum = s.Node("sum"), output = s.Node("out");
        s.Resistor("r1", s.Input, sum);
        s.Resistor("rf", sum, output);
        double offset = 0;
        if (s.Has("r2"))
        {
            string bias = s.Node("bias");
            double level = s.Has("bias") ? s.Value("bias") : 0;
            s.Source("vbias", bias, Circuit.Ground, level, s.Stage.Span);
            s.Resistor("r2", bias, sum);
            offset = -s.Value("rf") * level / s.Value("r2");
        }

        s.Amplifier("u1", Circuit.Ground, sum, output);
        s.SummingJunction(sum);
        return s.Finish(output, IdealTransfer.Linear(-s.Value("rf") / s.Value("r1"), offset));
    }
}
