using DesignRules.Model;

namespace DesignRules.Blocks;

/// <summary>
/// Two-diode inverting precision half-wave rectifier (the amplifier never saturates). rin from the input to the summing
/// junction <c>id.sum</c>; u1 (+ on ground) drives <c>id.u1.out</c>; d1 from <c>id.u1.out</c> (anode) to <c>id.sum</c>
/// (cathode) closes the loop on negative inputs; d2 from the output <c>id.out</c> (anode) to <c>id.u1.out</c> (cathode)
/// closes it through rf (from <c>id.out</c> to <c>id.sum</c>) on positive inputs.
/// <para>Polarity: the output is the NEGATIVE of the positive half-cycle, out = −(rf/rin)·max(vin, 0), and 0 V (through rf
/// from the virtual ground) on the negative half-cycle — the form the absolute-value block sums with the input.</para>
/// </summary>
internal sealed class HalfWaveInvertingBlock : BlockDescriptor
{
    public override string Name => "half-wave-inverting";

    public override string Summary => "Two-diode inverting precision half-wave rectifier";

    public override IReadOnlyList<string> RequiredValues => ["rin", "rf"];

    public override IReadOnlyList<string> AmplifierSlots => ["u1"];

    public override IReadOnlyList<string> DiodeSlots => ["d1", "d2"];

    public override bool Rectifies => true;

    // On the half-cycle it does not pass, the output is held at the virtual ground through rf alone.
    public override string? OutputValue => "rf";

    public override BlockOutput Build(IBlockCircuit s)
    {
        string output = s.Node("out");
        AddHalfWave(s, "rin", "rf", output);
        double gain = -s.Value("rf") / s.Value("rin");
        return new BlockOutput(output, TransferKind.HalfWavePositive, gain, 0, 0);
    }

    public override string Equation(BlockValues v) =>
        $"v_out = −(rf/rin)·max(v_in, 0) = {EquationText.Number(-v["rf"] / v["rin"])}·max(v_in, 0)";

    public override double? NoiseGain(string slot, BlockValues v) => 1 + (v["rf"] / v["rin"]);

    /// <summary>Adds the half-wave section with the given value names, writing its output on <paramref name="output"/>.</summary>
    internal static void AddHalfWave(IBlockCircuit s, string inputResistor, string feedbackResistor, string output, string sumName = "sum")
    {
        string sum = s.Node(sumName), amplifierOut = s.Node("u1.out");
        s.Resistor(inputResistor, s.Input, sum);
        s.Resistor(feedbackResistor, output, sum);
        s.Amplifier("u1", s.Ground, sum, amplifierOut);
        s.Diode("d1", amplifierOut, sum);
        s.Diode("d2", output, amplifierOut);
        s.SummingJunction(sum);
    }
}

/// <summary>
/// Single-diode precision half-wave rectifier in a follower loop: u1's + input on the stage input, its output
/// <c>id.u1.out</c> on d1's anode, d1's cathode is the stage output <c>id.out</c>, which feeds back to u1's − input; rload
/// from <c>id.out</c> to ground when given. Passes the positive half-cycle (gain +1); on the negative half-cycle the diode
/// blocks, the loop opens and u1 runs to its negative swing limit.
/// </summary>
internal sealed class HalfWaveFollowerBlock : BlockDescriptor
{
    public override string Name => "half-wave-follower";

    public override string Summary => "Single-diode precision half-wave rectifier in a follower loop";

    public override IReadOnlyList<string> OptionalValues => ["rload"];

    public override IReadOnlyList<string> AmplifierSlots => ["u1"];

    public override IReadOnlyList<string> DiodeSlots => ["d1"];

    public override bool Rectifies => true;

    public override string? OutputValue => "rload";

    public override bool OpensLoopByDesign(string slot) => slot == "u1";

    public override BlockOutput Build(IBlockCircuit s)
    {
        string output = s.Node("out"), amplifierOut = s.Node("u1.out");
        s.Amplifier("u1", s.Input, output, amplifierOut);
        s.Diode("d1", amplifierOut, output);
        if (s.Has("rload")) s.Resistor("rload", output, s.Ground);
        return new BlockOutput(output, TransferKind.HalfWavePositive, 1, 0, 0);
    }

    public override string Equation(BlockValues v) => "v_out = max(v_in, 0)";
}

/// <summary>
/// Full-wave absolute-value circuit: the half-wave section of <see cref="HalfWaveInvertingBlock"/> (r1 input resistor,
/// r2 feedback, junction <c>id.sum1</c>, u1 output <c>id.u1.out</c>, d1, d2) gives vhw = −(r2/r1)·max(vin, 0) on
/// <c>id.hw</c>; the summer u2 adds r3 from the input and r4 from <c>id.hw</c> into <c>id.sum2</c> with r5 from <c>id.sum2</c>
/// to the output <c>id.out</c> (u2's output): vout = −(r5/r3·vin + r5/r4·vhw). With r1 = r2 = r3 = r5 and r4 = r3/2 this is |vin|.
/// </summary>
internal sealed class AbsoluteValueBlock : BlockDescriptor
{
    public override string Name => "absolute-value";

    public override string Summary => "Full-wave absolute-value circuit: half-wave rectifier plus 2:1 summer";

    public override IReadOnlyList<string> RequiredValues => ["r1", "r2", "r3", "r4", "r5"];

    public override IReadOnlyList<string> AmplifierSlots => ["u1", "u2"];

    public override IReadOnlyList<string> DiodeSlots => ["d1", "d2"];

    public override bool Rectifies => true;

    public override BlockOutput Build(IBlockCircuit s)
    {
        string halfWave = s.Node("hw"), sum2 = s.Node("sum2"), output = s.Node("out");
        HalfWaveInvertingBlock.AddHalfWave(s, "r1", "r2", halfWave, "sum1");
        s.Resistor("r3", s.Input, sum2);
        s.Resistor("r4", halfWave, sum2);
        s.Resistor("r5", sum2, output);
        s.Amplifier("u2", s.Ground, sum2, output);
        s.SummingJunction(sum2);
        double r1 = s.Value("r1"), r2 = s.Value("r2"), r3 = s.Value("r3"), r4 = s.Value("r4"), r5 = s.Value("r5");
        double direct = -r5 / r3;
        double viaHalfWave = r5 / r4 * (r2 / r1);
        return new BlockOutput(output, TransferKind.AbsoluteValue, direct + viaHalfWave, direct, 0);
    }

    public override string Equation(BlockValues v) =>
        $"v_out = |v_in| (r5/r3 = {EquationText.Number(v["r5"] / v["r3"])}, (r5/r4)·(r2/r1) = {EquationText.Number(v["r5"] / v["r4"] * v["r2"] / v["r1"])})";

    public override double? NoiseGain(string slot, BlockValues v) => slot == "u1"
        ? 1 + (v["r2"] / v["r1"])
        : 1 + (v["r5"] / EquationText.Parallel(v["r3"], v["r4"]));
}

/// <summary>
/// Peak detector: u1's + input on the stage input, its output <c>id.u1.out</c> on d1's anode; d1's cathode <c>id.k</c>
/// charges the hold node <c>id.hold</c> through rser (without rser the cathode is the hold node); chold and rdis from the
/// hold node to ground. u1's − input is fed back from the cathode, so rser lies outside the loop (the loop stays stable with
/// a large hold capacitor, and at the peak, where the charging current stops, the hold node equals the cathode). With
/// buffer: true, u2 follows the hold node onto <c>id.out</c>; otherwise the hold node is the output <c>id.out</c>.
/// Ideal transfer: the output holds the input's peak (time constant rdis·chold).
/// </summary>
internal sealed class PeakDetectorBlock : BlockDescriptor
{
    public override string Name => "peak-detector";

    public override string Summary => "Peak detector with hold capacitor and discharge resistor";

    public override IReadOnlyList<string> RequiredValues => ["rdis", "chold"];

    public override IReadOnlyList<string> OptionalValues => ["rser"];

    public override IReadOnlyList<string> Flags => ["buffer"];

    public override IReadOnlyList<string> AmplifierSlots => ["u1"];

    public override IReadOnlyList<string> OptionalAmplifierSlots => ["u2"];

    public override IReadOnlyList<string> DiodeSlots => ["d1"];

    public override string? OutputValue => "rdis";

    public override bool OpensLoopByDesign(string slot) => slot == "u1";

    public override BlockOutput Build(IBlockCircuit s)
    {
        bool buffered = s.Flag("buffer");
        string output = s.Node("out");
        string hold = buffered ? s.Node("hold") : output;
        string cathode = s.Has("rser") ? s.Node("k") : hold;
        string amplifierOut = s.Node("u1.out");
        s.Amplifier("u1", s.Input, cathode, amplifierOut);
        s.Diode("d1", amplifierOut, cathode);
        if (s.Has("rser")) s.Resistor("rser", cathode, hold);
        s.Capacitor("chold", hold, s.Ground);
        s.Resistor("rdis", hold, s.Ground);
        if (buffered) s.Amplifier("u2", hold, output, output);
        return new BlockOutput(output, TransferKind.Peak, 1, 1, 0, s.Value("rdis") * s.Value("chold"));
    }

    public override string Equation(BlockValues v) =>
        $"v_out = peak of v_in, decaying with τ = rdis·chold = {EquationText.Time(v["rdis"] * v["chold"])}";
}

/// <summary>
/// First-order RC averaging filter: r from the input to the capacitor node, c from it to ground. With buffer: true the
/// capacitor node is <c>id.avg</c> and u1 follows it onto <c>id.out</c>; otherwise the capacitor node is <c>id.out</c>.
/// Ideal transfer: the average of the input (gain 1 at DC, time constant r·c).
/// </summary>
internal sealed class AveragingFilterBlock : BlockDescriptor
{
    public override string Name => "averaging-filter";

    public override string Summary => "First-order RC averaging filter";

    public override IReadOnlyList<string> RequiredValues => ["r", "c"];

    public override IReadOnlyList<string> Flags => ["buffer"];

    public override IReadOnlyList<string> OptionalAmplifierSlots => ["u1"];

    public override string? OutputValue => "r";

    public override BlockOutput Build(IBlockCircuit s)
    {
        bool buffered = s.Flag("buffer");
        string output = s.Node("out");
        string node = buffered ? s.Node("avg") : output;
        s.Resistor("r", s.Input, node);
        s.Capacitor("c", node, s.Ground);
        if (buffered) s.Amplifier("u1", node, output, output);
        return new BlockOutput(output, TransferKind.Average, 1, 1, 0, s.Value("r") * s.Value("c"));
    }

    public override string Equation(BlockValues v) => $"v_out = average of v_in, τ = r·c = {EquationText.Time(v["r"] * v["c"])}";
}
