namespace DesignRules.Rules;

/// <summary>The loop gain T(jω) of one amplifier, with the crossover and phase margin the stability rules read from it.</summary>
/// <param name="Amplifier">The slot or netlist element id (u1).</param>
/// <param name="Frequency">Hertz, log-spaced.</param>
/// <param name="MagnitudeDb">|T| in dB.</param>
/// <param name="PhaseDegrees">∠T in degrees, unwrapped from low frequency.</param>
/// <param name="Crossover">Frequency where |T| = 1, Hz.</param>
/// <param name="PhaseMargin">180° + ∠T at the crossover, degrees.</param>
/// <param name="OperatingPoint">Where the loop was linearised, in words.</param>
public sealed record LoopGainPlot(
    string Amplifier, IReadOnlyList<double> Frequency, IReadOnlyList<double> MagnitudeDb, IReadOnlyList<double> PhaseDegrees,
    double Crossover, double PhaseMargin, string OperatingPoint);

/// <summary>A stage's answer to a small step at the source: input, stage output and amplifier outputs.</summary>
/// <param name="Step">Step size at the source, V.</param>
/// <param name="Time">Seconds after the step, uniform grid.</param>
/// <param name="Traces">The waveforms.</param>
/// <param name="Overshoot">Overshoot of the stage output as a fraction of its change.</param>
/// <param name="Settling">Settling time to 1 %, s, if within the record.</param>
public sealed record StepPlot(double Step, IReadOnlyList<double> Time, IReadOnlyList<Trace> Traces, double Overshoot, double? Settling);
