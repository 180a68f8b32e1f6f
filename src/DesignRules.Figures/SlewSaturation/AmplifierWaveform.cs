using DesignRules.Elaboration;
using DesignRules.Simulation;

namespace DesignRules.Figures.SlewSaturation;

/// <summary>
/// One slewing event of an amplifier output: a monotone run during which the output moves at (or near) its slew rate,
/// e.g. the jump across a precision rectifier's diode dead zone or the return from a rail.
/// </summary>
/// <param name="Start">When the run starts, s.</param>
/// <param name="End">When it ends, s.</param>
/// <param name="From">Output voltage at the start, V.</param>
/// <param name="To">Output voltage at the end, V.</param>
internal sealed record SlewingEvent(double Start, double End, double From, double To)
{
    /// <summary>The voltage the event covers, V.</summary>
    public double Swing => Math.Abs(To - From);

    /// <summary>True for a rising output.</summary>
    public bool Rising => To > From;

    /// <summary>How long the event took in the transient, s.</summary>
    public double Duration => End - Start;
}

/// <summary>What one amplifier did in the transient at one band end, over the measurement window.</summary>
/// <param name="Stage">The stage the amplifier belongs to.</param>
/// <param name="Probe">The amplifier's nodes, part and model.</param>
/// <param name="Named">Where the design names the amplifier's part.</param>
/// <param name="Mean">Time average of the output, V.</param>
/// <param name="Minimum">Lowest output, V.</param>
/// <param name="Maximum">Highest output, V.</param>
/// <param name="FeedbackAtMinimum">Inverting-input voltage when the output is lowest, V.</param>
/// <param name="FeedbackAtMaximum">Inverting-input voltage when the output is highest, V.</param>
/// <param name="PeakSlope">Largest |dv/dt| of the output, V/s.</param>
/// <param name="Events">Slewing events, in time order.</param>
/// <param name="PlusMinimum">Lowest voltage of the + input, V.</param>
/// <param name="PlusMaximum">Highest voltage of the + input, V.</param>
/// <param name="MinusMinimum">Lowest voltage of the − input, V.</param>
/// <param name="MinusMaximum">Highest voltage of the − input, V.</param>
/// <param name="PeakDifferentialInput">Largest |v(+) − v(−)|, V.</param>
/// <param name="ReachedSwingLimit">True when the engine held the output at a swing limit at any time.</param>
internal sealed record AmplifierWaveform(
    StageProbe Stage,
    AmplifierProbe Probe,
    StageAmplifier Named,
    double Mean,
    double Minimum,
    double Maximum,
    double FeedbackAtMinimum,
    double FeedbackAtMaximum,
    double PeakSlope,
    IReadOnlyList<SlewingEvent> Events,
    double PlusMinimum,
    double PlusMaximum,
    double MinusMinimum,
    double MinusMaximum,
    double PeakDifferentialInput,
    bool ReachedSwingLimit)
{
    /// <summary>The peak excursion of the output from its mean, V (the Vp of the full-power bandwidth).</summary>
    public double PeakExcursion => Math.Max(Maximum - Mean, Mean - Minimum);

    /// <summary>The output node, as the reports name it (<c>stage.u1.out</c>).</summary>
    public string Node => Probe.OutputNode;

    /// <summary>The amplifier as the reports name it (<c>stage.u1</c>).</summary>
    public string Name => Probe.ElementId;

    /// <summary>Rising slew rate of the part, V/s.</summary>
    public double SlewRising => Probe.Model.SlewRateRising;

    /// <summary>Falling slew rate of the part, V/s (positive).</summary>
    public double SlewFalling => Probe.Model.SlewRateFalling;

    /// <summary>The slower of the rising and falling slew rates, V/s.</summary>
    public double SlewSlower => Math.Min(SlewRising, SlewFalling);

    /// <summary>Highest output the part reaches: positive rail less its headroom, V.</summary>
    public double SwingHigh => Probe.Rails.Positive - Probe.Part.OutputHeadroom.Positive.Value.Value;

    /// <summary>Lowest output the part reaches: negative rail plus its headroom, V.</summary>
    public double SwingLow => Probe.Rails.Negative + Probe.Part.OutputHeadroom.Negative.Value.Value;
}

/// <summary>The transient of one band end and what every amplifier of the chain did in it.</summary>
/// <param name="End">The band end.</param>
/// <param name="Chain">The elaborated chain.</param>
/// <param name="Transient">Its transient.</param>
/// <param name="From">Start of the measurement window (start-up excluded), s.</param>
/// <param name="Frequency">Highest frequency of the source at this band end, Hz; null for a DC source.</param>
/// <param name="Period">Period of the source's test frequency, s; null for a DC source.</param>
/// <param name="Amplifiers">Every amplifier in signal order.</param>
internal sealed record BandWaveforms(
    BandEnd End, ElaboratedChain Chain, TransientResult Transient, double From, double? Frequency, double? Period, IReadOnlyList<AmplifierWaveform> Amplifiers)
{
    /// <summary>True when the source is periodic, so slew and glitch figures mean something.</summary>
    public bool IsPeriodic => Frequency is not null && Period is not null;
}
