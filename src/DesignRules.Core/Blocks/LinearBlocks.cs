namespace DesignRules.Blocks;

/// <summary>
/// Inverting amplifier: rin from the input to the summing junction <c>id.sum</c>, rf from <c>id.sum</c> to the output
/// <c>id.out</c>; the + input on ground, or on <c>id.ref</c> through rcomp when given. Ideal gain −rf/rin.
/// </summary>
internal sealed class InvertingBlock : BlockDescriptor
{
    public override string Name => "inverting";

    public override string Summary => "Inverting amplifier, gain −rf/rin";

    public override IReadOnlyList<string> RequiredValues => ["rin", "rf"];

    public override IReadOnlyList<string> OptionalValues => ["rcomp"];

    public override IReadOnlyList<string> AmplifierSlots => ["u1"];

    public override BlockOutput Build(IBlockCircuit s)
    {
        string sum = s.Node("sum"), output = s.Node("out");
        string plus = s.Ground;
        if (s.Has("rcomp"))
        {
            plus = s.Node("ref");
            s.Resistor("rcomp", plus, s.Ground);
        }

        s.Resistor("rin", s.Input, sum);
        s.Resistor("rf", sum, output);
        s.Amplifier("u1", plus, sum, output);
        s.SummingJunction(sum);
        return BlockOutput.Linear(output, -s.Value("rf") / s.Value("rin"));
    }

    public override string Equation(BlockValues v) => $"v_out = −(rf/rin)·v_in = {EquationText.Number(-v["rf"] / v["rin"])}·v_in";

    public override double? NoiseGain(string slot, BlockValues v) => 1 + (v["rf"] / v["rin"]);
}

/// <summary>
/// Non-inverting amplifier: the input on the + input, rf from the output <c>id.out</c> to the feedback node <c>id.fb</c>,
/// rg from <c>id.fb</c> to ground. Ideal gain 1 + rf/rg.
/// </summary>
internal sealed class NonInvertingBlock : BlockDescriptor
{
    public override string Name => "non-inverting";

    public override string Summary => "Non-inverting amplifier, gain 1 + rf/rg";

    public override IReadOnlyList<string> RequiredValues => ["rg", "rf"];

    public override IReadOnlyList<string> AmplifierSlots => ["u1"];

    public override BlockOutput Build(IBlockCircuit s)
    {
        string fb = s.Node("fb"), output = s.Node("out");
        s.Resistor("rf", output, fb);
        s.Resistor("rg", fb, s.Ground);
        s.Amplifier("u1", s.Input, fb, output);
        return BlockOutput.Linear(output, 1 + (s.Value("rf") / s.Value("rg")));
    }

    public override string Equation(BlockValues v) => $"v_out = (1 + rf/rg)·v_in = {EquationText.Number(1 + (v["rf"] / v["rg"]))}·v_in";

    public override double? NoiseGain(string slot, BlockValues v) => 1 + (v["rf"] / v["rg"]);
}

/// <summary>Unity-gain follower: the input on the + input, the output <c>id.out</c> fed back to the − input.</summary>
internal sealed class FollowerBlock : BlockDescriptor
{
    public override string Name => "follower";

    public override string Summary => "Unity-gain buffer";

    public override IReadOnlyList<string> AmplifierSlots => ["u1"];

    public override BlockOutput Build(IBlockCircuit s)
    {
        string output = s.Node("out");
        s.Amplifier("u1", s.Input, output, output);
        return BlockOutput.Linear(output, 1);
    }

    public override string Equation(BlockValues v) => "v_out = v_in";
}

/// <summary>
/// Difference amplifier: r1 from the inverting signal input (the stage's reference input: ground, or the − leg of a split
/// source) to <c>id.sum</c>, r2 from <c>id.sum</c> to <c>id.out</c>; r3 from the stage input to <c>id.plus</c>, r4 from
/// <c>id.plus</c> to ground. A single-ended input therefore drives the + side: out = G+·v+ − (r2/r1)·v− with
/// G+ = r4/(r3 + r4)·(1 + r2/r1), which is (r2/r1)·(v+ − v−) when r2/r1 = r4/r3. Fed from a split source
/// (v± = cm ± v/2), the ideal transfer in terms of the differential signal v has slope (G+ + r2/r1)/2 and offset cm·(G+ − r2/r1).
/// </summary>
internal sealed class DifferenceBlock : BlockDescriptor
{
    public override string Name => "difference";

    public override string Summary => "Difference amplifier, (r2/r1)·(v+ − v−)";

    public override IReadOnlyList<string> RequiredValues => ["r1", "r2", "r3", "r4"];

    public override IReadOnlyList<string> AmplifierSlots => ["u1"];

    public override bool TakesDifferentialInput => true;

    public override BlockOutput Build(IBlockCircuit s)
    {
        string sum = s.Node("sum"), plus = s.Node("plus"), output = s.Node("out");
        s.Resistor("r1", s.ReferenceInput, sum);
        s.Resistor("r2", sum, output);
        s.Resistor("r3", s.Input, plus);
        s.Resistor("r4", plus, s.Ground);
        s.Amplifier("u1", plus, sum, output);
        s.SummingJunction(sum);
        double r1 = s.Value("r1"), r2 = s.Value("r2"), r3 = s.Value("r3"), r4 = s.Value("r4");
        double plusGain = r4 / (r3 + r4) * (1 + (r2 / r1));
        double minusGain = r2 / r1;
        return s.ReferenceInput == s.Ground
            ? BlockOutput.Linear(output, plusGain)
            : BlockOutput.Linear(output, (plusGain + minusGain) / 2, s.CommonMode * (plusGain - minusGain));
    }

    public override string Equation(BlockValues v) =>
        $"v_out = (r2/r1)·(v₊ − v₋) = {EquationText.Number(v["r2"] / v["r1"])}·(v₊ − v₋), with r4/r3 = r2/r1";

    public override double? NoiseGain(string slot, BlockValues v) => 1 + (v["r2"] / v["r1"]);
}

/// <summary>
/// Inverting summer: r1 from the input to <c>id.sum</c>, rf from <c>id.sum</c> to <c>id.out</c>, and when r2 is given r2 from
/// <c>id.bias</c> to <c>id.sum</c>, with <c>id.bias</c> driven to the bias value by the source <c>id.vbias</c> (0 V when no bias
/// is given). Ideal out = −rf·(vin/r1 + bias/r2).
/// </summary>
internal sealed class SummingBlock : BlockDescriptor
{
    public override string Name => "summing";

    public override string Summary => "Inverting summer, −rf·(vin/r1 + bias/r2)";

    public override IReadOnlyList<string> RequiredValues => ["r1", "rf"];

    public override IReadOnlyList<string> OptionalValues => ["r2", "bias"];

    public override IReadOnlyList<string> AmplifierSlots => ["u1"];

    public override BlockOutput Build(IBlockCircuit s)
    {
        string sum = s.Node("sum"), output = s.Node("out");
        s.Resistor("r1", s.Input, sum);
        s.Resistor("rf", sum, output);
        double offset = 0;
        if (s.Has("r2"))
        {
            string bias = s.Node("bias");
            double level = s.Has("bias") ? s.Value("bias") : 0;
            s.Source("vbias", bias, s.Ground, level);
            s.Resistor("r2", bias, sum);
            offset = -s.Value("rf") * level / s.Value("r2");
        }

        s.Amplifier("u1", s.Ground, sum, output);
        s.SummingJunction(sum);
        return BlockOutput.Linear(output, -s.Value("rf") / s.Value("r1"), offset);
    }

    public override string Equation(BlockValues v) => v.Has("r2") && v.Has("bias")
        ? $"v_out = −rf·(v_in/r1 + bias/r2) = {EquationText.Number(-v["rf"] / v["r1"])}·v_in {EquationText.Signed(-v["rf"] / v["r2"] * v["bias"])} V"
        : $"v_out = −(rf/r1)·v_in = {EquationText.Number(-v["rf"] / v["r1"])}·v_in";

    public override double? NoiseGain(string slot, BlockValues v) => 1 + (v["rf"] / EquationText.Parallel(v["r1"], v.Optional("r2")));
}
