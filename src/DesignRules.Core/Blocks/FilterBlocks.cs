using System.Numerics;
using DesignRules.Model;

namespace DesignRules.Blocks;

/// <summary>The shape of a second-order filter section.</summary>
public enum FilterShape
{
    /// <summary>Passes below f0.</summary>
    LowPass,
    /// <summary>Passes above f0.</summary>
    HighPass,
    /// <summary>Passes around f0.</summary>
    BandPass,
}

/// <summary>
/// The ideal response of a second-order section with ideal amplifiers: with x = f/f0 and D = 1 − x² + j·x/Q,
/// low-pass K/D, high-pass −K·x²/D, band-pass K·(j·x/Q)/D (standard second-order forms; K is the gain in the pass band,
/// at the centre for a band-pass).
/// </summary>
/// <param name="Shape">Low-pass, high-pass or band-pass.</param>
/// <param name="F0">Natural (centre) frequency, Hz.</param>
/// <param name="Q">Quality factor.</param>
/// <param name="PassbandGain">K, signed.</param>
public sealed record FilterResponse(FilterShape Shape, double F0, double Q, double PassbandGain)
{
    /// <summary>The ideal complex response at <paramref name="frequency"/> Hz.</summary>
    public Complex At(double frequency)
    {
        double x = frequency / F0;
        var d = new Complex(1 - (x * x), x / Q);
        return Shape switch
        {
            FilterShape.LowPass => PassbandGain / d,
            FilterShape.HighPass => -PassbandGain * x * x / d,
            _ => PassbandGain * new Complex(0, x / Q) / d,
        };
    }
}

/// <summary>
/// What the second-order filter blocks share: value names, the amplifier slot, the ideal response from the component
/// values, and the equation text. Each block adds its topology and its f0, Q and K formulas.
/// </summary>
internal abstract class FilterBlock : BlockDescriptor
{
    public override IReadOnlyList<string> AmplifierSlots => ["u1"];

    /// <summary>The ideal response for the component values.</summary>
    public abstract override FilterResponse Filter(BlockValues values);

    public override string Equation(BlockValues v)
    {
        var f = Filter(v);
        string shape = f.Shape switch { FilterShape.LowPass => "low-pass", FilterShape.HighPass => "high-pass", _ => "band-pass" };
        return $"{Formula}: f0 = {EquationText.Frequency(f.F0)}, Q = {EquationText.Number(f.Q)}, K = {EquationText.Number(f.PassbandGain)} ({shape})";
    }

    /// <summary>The block's formulas for f0, Q and K in its own value names.</summary>
    protected abstract string Formula { get; }

    protected static double Hertz(double omega) => omega / (2 * Math.PI);
}

/// <summary>
/// Unity-gain Sallen–Key low-pass: r1 from the input to <c>id.a</c>, r2 from <c>id.a</c> to <c>id.b</c>, c1 from
/// <c>id.a</c> to the output <c>id.out</c>, c2 from <c>id.b</c> to ground; u1 follows <c>id.b</c> onto <c>id.out</c>.
/// H(s) = 1 / (s²·R1R2C1C2 + s·C2(R1 + R2) + 1): ω0 = 1/√(R1R2C1C2), Q = √(R1R2C1C2) / (C2(R1 + R2)), K = 1.
/// </summary>
internal sealed class SallenKeyLowPassBlock : FilterBlock
{
    public override string Name => "sallen-key-low-pass";

    public override string Summary => "Second-order Sallen–Key low-pass, unity gain";

    public override IReadOnlyList<string> RequiredValues => ["r1", "r2", "c1", "c2"];

    protected override string Formula => "f0 = 1/(2π·√(r1·r2·c1·c2)), Q = √(r1·r2·c1·c2)/(c2·(r1 + r2)), K = 1";

    public override BlockOutput Build(IBlockCircuit s)
    {
        string a = s.Node("a"), b = s.Node("b"), output = s.Node("out");
        s.Resistor("r1", s.Input, a);
        s.Resistor("r2", a, b);
        s.Capacitor("c1", a, output);
        s.Capacitor("c2", b, s.Ground);
        s.Amplifier("u1", b, output, output);
        return BlockOutput.Linear(output, 1);
    }

    public override FilterResponse Filter(BlockValues v)
    {
        double product = v["r1"] * v["r2"] * v["c1"] * v["c2"];
        return new FilterResponse(FilterShape.LowPass, Hertz(1 / Math.Sqrt(product)), Math.Sqrt(product) / (v["c2"] * (v["r1"] + v["r2"])), 1);
    }
}

/// <summary>
/// Equal-component Sallen–Key low-pass: two resistors r (<c>r.1</c> from the input to <c>id.a</c>, <c>r.2</c> from
/// <c>id.a</c> to <c>id.b</c>) and two capacitors c (<c>c.1</c> from <c>id.a</c> to the output, <c>c.2</c> from <c>id.b</c> to
/// ground), u1 non-inverting with gain K = 1 + rf/rg (rf from <c>id.out</c> to <c>id.fb</c>, rg from <c>id.fb</c> to ground).
/// ω0 = 1/(R·C), Q = 1/(3 − K); each r and c is its own part, so each varies on its own in the tolerance analysis.
/// </summary>
internal sealed class SallenKeyLowPassEqualBlock : FilterBlock
{
    public override string Name => "sallen-key-low-pass-equal";

    public override string Summary => "Second-order Sallen–Key low-pass, equal components, gain 1 + rf/rg sets Q";

    public override IReadOnlyList<string> RequiredValues => ["r", "c", "rf", "rg"];

    protected override string Formula => "f0 = 1/(2π·r·c), Q = 1/(3 − K), K = 1 + rf/rg";

    public override BlockOutput Build(IBlockCircuit s)
    {
        string a = s.Node("a"), b = s.Node("b"), fb = s.Node("fb"), output = s.Node("out");
        s.Resistor("r", "r.1", s.Input, a);
        s.Resistor("r", "r.2", a, b);
        s.Capacitor("c", "c.1", a, output);
        s.Capacitor("c", "c.2", b, s.Ground);
        s.Resistor("rf", output, fb);
        s.Resistor("rg", fb, s.Ground);
        s.Amplifier("u1", b, fb, output);
        return BlockOutput.Linear(output, 1 + (s.Value("rf") / s.Value("rg")));
    }

    public override FilterResponse Filter(BlockValues v)
    {
        double k = 1 + (v["rf"] / v["rg"]);
        return new FilterResponse(FilterShape.LowPass, Hertz(1 / (v["r"] * v["c"])), 1 / (3 - k), k);
    }

    public override double? NoiseGain(string slot, BlockValues v) => 1 + (v["rf"] / v["rg"]);
}

/// <summary>
/// Unity-gain Sallen–Key high-pass: c1 from the input to <c>id.a</c>, c2 from <c>id.a</c> to <c>id.b</c>, r1 from <c>id.a</c>
/// to the output <c>id.out</c>, r2 from <c>id.b</c> to ground; u1 follows <c>id.b</c>. ω0 = 1/√(R1R2C1C2),
/// Q = √(R1R2C1C2) / (R1(C1 + C2)), K = 1.
/// </summary>
internal sealed class SallenKeyHighPassBlock : FilterBlock
{
    public override string Name => "sallen-key-high-pass";

    public override string Summary => "Second-order Sallen–Key high-pass, unity gain";

    public override IReadOnlyList<string> RequiredValues => ["c1", "c2", "r1", "r2"];

    protected override string Formula => "f0 = 1/(2π·√(r1·r2·c1·c2)), Q = √(r1·r2·c1·c2)/(r1·(c1 + c2)), K = 1";

    public override BlockOutput Build(IBlockCircuit s)
    {
        string a = s.Node("a"), b = s.Node("b"), output = s.Node("out");
        s.Capacitor("c1", s.Input, a);
        s.Capacitor("c2", a, b);
        s.Resistor("r1", a, output);
        s.Resistor("r2", b, s.Ground);
        s.Amplifier("u1", b, output, output);
        return BlockOutput.Linear(output, 0);
    }

    public override FilterResponse Filter(BlockValues v)
    {
        double product = v["r1"] * v["r2"] * v["c1"] * v["c2"];
        return new FilterResponse(FilterShape.HighPass, Hertz(1 / Math.Sqrt(product)), Math.Sqrt(product) / (v["r1"] * (v["c1"] + v["c2"])), 1);
    }
}

/// <summary>
/// Equal-component Sallen–Key high-pass: two capacitors c (<c>c.1</c> from the input to <c>id.a</c>, <c>c.2</c> from
/// <c>id.a</c> to <c>id.b</c>) and two resistors r (<c>r.1</c> from <c>id.a</c> to the output, <c>r.2</c> from <c>id.b</c> to
/// ground), u1 non-inverting with K = 1 + rf/rg. ω0 = 1/(R·C), Q = 1/(3 − K).
/// </summary>
internal sealed class SallenKeyHighPassEqualBlock : FilterBlock
{
    public override string Name => "sallen-key-high-pass-equal";

    public override string Summary => "Second-order Sallen–Key high-pass, equal components, gain 1 + rf/rg sets Q";

    public override IReadOnlyList<string> RequiredValues => ["r", "c", "rf", "rg"];

    protected override string Formula => "f0 = 1/(2π·r·c), Q = 1/(3 − K), K = 1 + rf/rg";

    public override BlockOutput Build(IBlockCircuit s)
    {
        string a = s.Node("a"), b = s.Node("b"), fb = s.Node("fb"), output = s.Node("out");
        s.Capacitor("c", "c.1", s.Input, a);
        s.Capacitor("c", "c.2", a, b);
        s.Resistor("r", "r.1", a, output);
        s.Resistor("r", "r.2", b, s.Ground);
        s.Resistor("rf", output, fb);
        s.Resistor("rg", fb, s.Ground);
        s.Amplifier("u1", b, fb, output);
        return BlockOutput.Linear(output, 0);
    }

    public override FilterResponse Filter(BlockValues v)
    {
        double k = 1 + (v["rf"] / v["rg"]);
        return new FilterResponse(FilterShape.HighPass, Hertz(1 / (v["r"] * v["c"])), 1 / (3 - k), k);
    }

    public override double? NoiseGain(string slot, BlockValues v) => 1 + (v["rf"] / v["rg"]);
}

/// <summary>
/// Multiple-feedback band-pass: r1 from the input to <c>id.a</c>, r2 from <c>id.a</c> to ground, c1 from <c>id.a</c> to the
/// summing junction <c>id.sum</c>, c2 from <c>id.a</c> to the output <c>id.out</c>, r3 from <c>id.out</c> to <c>id.sum</c>; u1's
/// + input on ground. Nodal analysis gives H(s) = −(s/(R1C2)) / (s² + s(C1 + C2)/(R3C1C2) + (1/R1 + 1/R2)/(R3C1C2)):
/// ω0 = √((1/R1 + 1/R2)/(R3C1C2)), Q = ω0·R3C1C2/(C1 + C2), centre gain K = −R3C1/(R1(C1 + C2)) (−R3/(2R1) for C1 = C2).
/// </summary>
internal sealed class MultipleFeedbackBandPassBlock : FilterBlock
{
    public override string Name => "mfb-band-pass";

    public override string Summary => "Second-order multiple-feedback band-pass, inverting";

    public override IReadOnlyList<string> RequiredValues => ["r1", "r2", "r3", "c1", "c2"];

    protected override string Formula => "f0 = √((1/r1 + 1/r2)/(r3·c1·c2))/(2π), Q = 2π·f0·r3·c1·c2/(c1 + c2), K = −r3·c1/(r1·(c1 + c2))";

    public override BlockOutput Build(IBlockCircuit s)
    {
        string a = s.Node("a"), sum = s.Node("sum"), output = s.Node("out");
        s.Resistor("r1", s.Input, a);
        s.Resistor("r2", a, s.Ground);
        s.Capacitor("c1", a, sum);
        s.Capacitor("c2", a, output);
        s.Resistor("r3", output, sum);
        s.Amplifier("u1", s.Ground, sum, output);
        s.SummingJunction(sum);
        return BlockOutput.Linear(output, 0);
    }

    public override FilterResponse Filter(BlockValues v)
    {
        double r1 = v["r1"], r2 = v["r2"], r3 = v["r3"], c1 = v["c1"], c2 = v["c2"];
        double omega = Math.Sqrt(((1 / r1) + (1 / r2)) / (r3 * c1 * c2));
        return new FilterResponse(FilterShape.BandPass, Hertz(omega), omega * r3 * c1 * c2 / (c1 + c2), -r3 * c1 / (r1 * (c1 + c2)));
    }

    // The feedback network's β depends on frequency (two capacitors); the circuit gives it.
    public override double? NoiseGain(string slot, BlockValues values) => null;
}

/// <summary>
/// Multiple-feedback low-pass: r1 from the input to <c>id.a</c>, c1 from <c>id.a</c> to ground, r2 from <c>id.a</c> to the
/// output <c>id.out</c>, r3 from <c>id.a</c> to the summing junction <c>id.sum</c>, c2 from <c>id.sum</c> to <c>id.out</c>;
/// u1's + input on ground. H(s) = −(R2/R1) / (s²·R2R3C1C2 + s·C2(R2 + R3 + R2R3/R1) + 1): ω0 = 1/√(R2R3C1C2),
/// Q = √(R2R3C1C2) / (C2(R2 + R3 + R2R3/R1)), K = −R2/R1.
/// </summary>
internal sealed class MultipleFeedbackLowPassBlock : FilterBlock
{
    public override string Name => "mfb-low-pass";

    public override string Summary => "Second-order multiple-feedback low-pass, inverting";

    public override IReadOnlyList<string> RequiredValues => ["r1", "r2", "r3", "c1", "c2"];

    protected override string Formula => "f0 = 1/(2π·√(r2·r3·c1·c2)), Q = √(r2·r3·c1·c2)/(c2·(r2 + r3 + r2·r3/r1)), K = −r2/r1";

    public override BlockOutput Build(IBlockCircuit s)
    {
        string a = s.Node("a"), sum = s.Node("sum"), output = s.Node("out");
        s.Resistor("r1", s.Input, a);
        s.Capacitor("c1", a, s.Ground);
        s.Resistor("r2", a, output);
        s.Resistor("r3", a, sum);
        s.Capacitor("c2", sum, output);
        s.Amplifier("u1", s.Ground, sum, output);
        s.SummingJunction(sum);
        return BlockOutput.Linear(output, -s.Value("r2") / s.Value("r1"));
    }

    public override FilterResponse Filter(BlockValues v)
    {
        double r1 = v["r1"], r2 = v["r2"], r3 = v["r3"], c1 = v["c1"], c2 = v["c2"];
        double product = r2 * r3 * c1 * c2;
        return new FilterResponse(FilterShape.LowPass, Hertz(1 / Math.Sqrt(product)), Math.Sqrt(product) / (c2 * (r2 + r3 + (r2 * r3 / r1))), -r2 / r1);
    }

    public override double? NoiseGain(string slot, BlockValues values) => null;
}
