namespace DesignRules.Simulation.Measurements;

/// <summary>
/// What a transient asked of one amplifier: the peak rate of change at its output pin, how long it was slew-limited,
/// at a swing limit or with an input outside the common-mode range, the peak output current and differential input.
/// </summary>
/// <param name="Id">Amplifier id.</param>
/// <param name="PeakSlewDemand">Largest |dv/dt| at the output node between accepted points, V/s.</param>
/// <param name="TimeSlewLimited">Total time slew-limited, s.</param>
/// <param name="TimeAtSwingLimit">Total time at a swing limit, s.</param>
/// <param name="TimeCurrentLimited">Total time current-limited, s.</param>
/// <param name="TimeOutsideCommonModeRange">Total time with an input outside the common-mode range, s.</param>
/// <param name="PeakOutputCurrent">Largest |output current|, A.</param>
/// <param name="PeakDifferentialInput">Largest |v(+) − v(−)|, V.</param>
/// <param name="DifferentialInputExceeded">True when the peak differential input exceeds the model's maximum.</param>
public sealed record AmplifierStress(
    string Id, double PeakSlewDemand, double TimeSlewLimited, double TimeAtSwingLimit, double TimeCurrentLimited, double TimeOutsideCommonModeRange,
    double PeakOutputCurrent, double PeakDifferentialInput, bool DifferentialInputExceeded)
{
    /// <summary>Measures one amplifier of a transient result over [from, end].</summary>
    /// <param name="result">Transient result.</param>
    /// <param name="amplifierId">Amplifier id.</param>
    /// <param name="from">Ignore time before this (settling), s.</param>
    public static AmplifierStress Measure(TransientResult result, string amplifierId, double from = 0)
    {
        ArgumentNullException.ThrowIfNull(result);
        var trace = result.Amplifier(amplifierId);
        var time = result.Time;
        var output = result.Voltage(trace.OutputNode);
        double peakSlope = 0, slew = 0, swing = 0, limited = 0, commonMode = 0, peakCurrent = 0, peakDifferential = 0;
        for (int i = 0; i < time.Count; i++)
        {
            if (time[i] < from) continue;
            peakCurrent = Math.Max(peakCurrent, Math.Abs(trace.OutputCurrent[i]));
            peakDifferential = Math.Max(peakDifferential, Math.Abs(trace.DifferentialInput[i]));
            if (i == 0 || time[i - 1] < from) continue;
            double dt = time[i] - time[i - 1];
            if (dt <= 0) continue;
            peakSlope = Math.Max(peakSlope, Math.Abs(output[i] - output[i - 1]) / dt);
            slew += Share(trace.SlewLimited, i) * dt;
            swing += Share(trace.AtSwingLimit, i) * dt;
            limited += Share(trace.CurrentLimited, i) * dt;
            commonMode += Share(trace.InputOutsideCommonModeRange, i) * dt;
        }

        bool exceeded = trace.Model.MaxDifferentialInput is { } max && peakDifferential > max;
        return new AmplifierStress(amplifierId, peakSlope, slew, swing, limited, commonMode, peakCurrent, peakDifferential, exceeded);
    }

    /// <summary>Fraction of the interval ending at point i during which a flag holds (mean of its two ends).</summary>
    private static double Share(IReadOnlyList<bool> flags, int i) => ((flags[i] ? 1 : 0) + (flags[i - 1] ? 1 : 0)) * 0.5;
}
