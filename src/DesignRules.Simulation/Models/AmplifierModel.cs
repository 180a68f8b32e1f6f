namespace DesignRules.Simulation.Models;

/// <summary>
/// Behavioural operational-amplifier model of this engine, built from the published single-/two-pole description
/// of a voltage-feedback op-amp. All quantities in SI units.
/// <para>Equations (vd = v(+) − v(−) + Vos; ωu = 2π·GBW; ωp = ωu/A0 the dominant pole):</para>
/// <list type="number">
/// <item><description>Input stage: bias currents Ib+ and Ib− flow from each input node into the amplifier.</description></item>
/// <item><description>Dominant-pole integrator with slew limit, state x (volts):
/// dx/dt = S(ωp·(A0·vd − x)) − C(x), where S(r) = SRrise·tanh(r/SRrise) for r ≥ 0 and SRfall·tanh(r/SRfall) for r &lt; 0
/// (the tanh transfer of a differential input pair: linear for small signals, saturating at the slew rates), and
/// C(x) = Gc·w·[softplus((x − Hi)/w) − softplus((Lo − x)/w)] is a stiff, smooth clamp holding x inside the swing limits
/// Lo = Vneg + headroom−, Hi = Vpos − headroom+ (w = 1 mV, Gc = 1000·max(SR)/V, so x overshoots a limit by at most about 1 mV).
/// Because x itself is clamped there is no wind-up: once vd reverses, S changes sign and x leaves the limit at once.
/// Small-signal: x/vd = A0/(1 + s/ωp), so |A| = 1 at GBW.</description></item>
/// <item><description>Optional second pole: τ2·dy/dt = x − y, τ2 = 1/(2π·f2); otherwise y = x.</description></item>
/// <item><description>Overload recovery (optional, time Tor): a memory state m follows the clamp activity,
/// Tor/3·dm/dt = a(x) − m with a(x) ∈ [0, 1]; the drive that pulls x away from a limit is scaled by
/// 1 − m, so after a long overload the output waits about Tor before slewing away.</description></item>
/// <item><description>Output stage: current into the output node i = Ilim·tanh((y − vout)/(Rout·Ilim)) — output resistance Rout
/// for small currents, smoothly limited to ±Ilim (i = (y − vout)/Rout when there is no limit).</description></item>
/// </list>
/// Input common-mode range and maximum differential input are only checked (flagged), not modelled.
/// </summary>
public sealed record AmplifierModel
{
    /// <summary>Gain–bandwidth product (unity-gain frequency of the single-pole response) in Hz.</summary>
    public required double GainBandwidth { get; init; }

    /// <summary>DC open-loop gain A0 in V/V (e.g. 1e5 for 100 dB).</summary>
    public required double OpenLoopGain { get; init; }

    /// <summary>Rising slew rate in V/s (e.g. 8e6 for 8 V/µs).</summary>
    public required double SlewRateRising { get; init; }

    /// <summary>Falling slew rate in V/s, as a positive number.</summary>
    public required double SlewRateFalling { get; init; }

    /// <summary>Optional second-pole frequency in Hz (null: single-pole amplifier).</summary>
    public double? SecondPoleFrequency { get; init; }

    /// <summary>Output swing headroom to the positive rail in V: the output reaches at most Vpos − this.</summary>
    public double SwingHeadroomPositive { get; init; }

    /// <summary>Output swing headroom to the negative rail in V: the output reaches at least Vneg + this.</summary>
    public double SwingHeadroomNegative { get; init; }

    /// <summary>Open-loop output resistance in Ω (positive; typical 50 Ω).</summary>
    public double OutputResistance { get; init; } = 50;

    /// <summary>Output current limit in A (magnitude), or null for no limit.</summary>
    public double? OutputCurrentLimit { get; init; }

    /// <summary>Input offset voltage in V, in series with the non-inverting input.</summary>
    public double InputOffsetVoltage { get; init; }

    /// <summary>Bias current flowing into the non-inverting input, in A.</summary>
    public double InputBiasCurrentNonInverting { get; init; }

    /// <summary>Bias current flowing into the inverting input, in A.</summary>
    public double InputBiasCurrentInverting { get; init; }

    /// <summary>Input common-mode headroom to the positive rail in V (inputs above Vpos − this are flagged).</summary>
    public double CommonModeHeadroomPositive { get; init; }

    /// <summary>Input common-mode headroom to the negative rail in V (inputs below Vneg + this are flagged).</summary>
    public double CommonModeHeadroomNegative { get; init; }

    /// <summary>Maximum differential input voltage in V (for flagging only), or null for none.</summary>
    public double? MaxDifferentialInput { get; init; }

    /// <summary>Overload recovery time in s (0: the output leaves a limit as soon as the drive reverses).</summary>
    public double OverloadRecoveryTime { get; init; }

    /// <summary>Input voltage noise density e_n in V/√Hz in its white region, in series with the non-inverting input (0: noiseless).</summary>
    public double InputVoltageNoise { get; init; }

    /// <summary>Input current noise density i_n in A/√Hz at each input, uncorrelated between the inputs, taken as white (0: noiseless).</summary>
    public double InputCurrentNoise { get; init; }

    /// <summary>
    /// 1/f corner of the voltage noise in Hz: e_n(f)² = e_n²·(1 + f_c/f), so below f_c the density rises as 1/√f
    /// (0: white voltage noise).
    /// </summary>
    public double NoiseCorner { get; init; }

    /// <summary>A single-pole amplifier with equal rising and falling slew rates and the other parameters at their defaults.</summary>
    /// <param name="gainBandwidth">GBW in Hz.</param>
    /// <param name="openLoopGain">A0 in V/V.</param>
    /// <param name="slewRate">Slew rate in V/s, both directions.</param>
    public static AmplifierModel SinglePole(double gainBandwidth, double openLoopGain, double slewRate) => new()
    {
        GainBandwidth = gainBandwidth,
        OpenLoopGain = openLoopGain,
        SlewRateRising = slewRate,
        SlewRateFalling = slewRate,
    };

    internal string? Validate(SupplyRails rails)
    {
        static bool Positive(double v) => v > 0 && double.IsFinite(v);
        static bool NonNegative(double v) => v >= 0 && double.IsFinite(v);
        if (!Positive(GainBandwidth)) return "amplifier gain-bandwidth must be positive";
        if (!Positive(OpenLoopGain) || OpenLoopGain < 1) return "amplifier open-loop gain must be at least 1";
        if (!Positive(SlewRateRising) || !Positive(SlewRateFalling)) return "amplifier slew rates must be positive";
        if (SecondPoleFrequency is { } f2 && !Positive(f2)) return "amplifier second-pole frequency must be positive";
        if (!NonNegative(SwingHeadroomPositive) || !NonNegative(SwingHeadroomNegative)) return "amplifier swing headroom must be zero or positive";
        if (rails.Positive - SwingHeadroomPositive <= rails.Negative + SwingHeadroomNegative + 0.01) return "amplifier swing headroom leaves no output range between the rails";
        if (!Positive(OutputResistance)) return "amplifier output resistance must be positive";
        if (OutputCurrentLimit is { } lim && !Positive(lim)) return "amplifier output current limit must be positive";
        if (!double.IsFinite(InputOffsetVoltage) || !double.IsFinite(InputBiasCurrentInverting) || !double.IsFinite(InputBiasCurrentNonInverting)) return "amplifier offset and bias currents must be finite";
        if (!NonNegative(CommonModeHeadroomPositive) || !NonNegative(CommonModeHeadroomNegative)) return "amplifier common-mode headroom must be zero or positive";
        if (MaxDifferentialInput is { } md && !Positive(md)) return "amplifier maximum differential input must be positive";
        if (!NonNegative(InputVoltageNoise) || !NonNegative(InputCurrentNoise) || !NonNegative(NoiseCorner)) return "amplifier noise densities and noise corner must be zero or positive";
        if (!NonNegative(OverloadRecoveryTime)) return "amplifier overload recovery time must be zero or positive";
        return null;
    }
}
