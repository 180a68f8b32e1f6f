using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Elaboration;

/// <summary>Turns amplifier and diode parts of the design model into the engine's behavioural models.</summary>
public static class PartModels
{
    /// <summary>
    /// The engine model of an amplifier part, with the given input offset and bias currents. Every figure maps one to one
    /// (GBW, A0, rising and falling slew rate, second pole, output headroom to each rail, output resistance, current limit,
    /// maximum differential input, overload recovery). A common-mode headroom below zero (an input range beyond the rail)
    /// is taken as 0, which the engine can represent: inputs beyond a rail are then flagged, a conservative reading.
    /// The headroom is used as given, whatever load it was specified at.
    /// </summary>
    /// <param name="part">The part.</param>
    /// <param name="offsetVoltage">Input offset voltage, V, in series with the + input.</param>
    /// <param name="bias">Input bias currents.</param>
    public static AmplifierModel Amplifier(AmplifierPart part, double offsetVoltage, BiasCurrents bias)
    {
        ArgumentNullException.ThrowIfNull(part);
        ArgumentNullException.ThrowIfNull(bias);
        return new AmplifierModel
        {
            GainBandwidth = part.GainBandwidth.Value.Value,
            OpenLoopGain = part.OpenLoopGain.Value.Value,
            SlewRateRising = part.SlewRising.Value.Value,
            SlewRateFalling = Math.Abs(part.SlewFalling.Value.Value),
            SecondPoleFrequency = part.SecondPole?.Value.Value,
            SwingHeadroomPositive = part.OutputHeadroom.Positive.Value.Value,
            SwingHeadroomNegative = part.OutputHeadroom.Negative.Value.Value,
            OutputResistance = part.OutputResistance.Value.Value,
            OutputCurrentLimit = part.OutputCurrent.Value.Value,
            InputOffsetVoltage = offsetVoltage,
            InputBiasCurrentNonInverting = bias.NonInverting,
            InputBiasCurrentInverting = bias.Inverting,
            CommonModeHeadroomPositive = Math.Max(0, part.InputRange.Positive.Value.Value),
            CommonModeHeadroomNegative = Math.Max(0, part.InputRange.Negative.Value.Value),
            MaxDifferentialInput = part.MaxDifferentialInput?.Value.Value,
            OverloadRecoveryTime = part.OverloadRecovery?.Value.Value ?? 0,
            InputVoltageNoise = part.NoiseDensity?.Value.Value ?? 0,
            InputCurrentNoise = part.CurrentNoise?.Value.Value ?? 0,
            NoiseCorner = part.NoiseCorner?.Value.Value ?? 0,
        };
    }

    /// <summary>The offset voltage a corner gives a part: 0, or ± its maximum.</summary>
    /// <param name="part">The part.</param>
    /// <param name="corner">The corner.</param>
    public static double OffsetVoltage(AmplifierPart part, OffsetCorner corner)
    {
        ArgumentNullException.ThrowIfNull(part);
        double max = Math.Abs(part.OffsetVoltage.Maximum.Value.Value);
        return corner switch
        {
            OffsetCorner.MaximumPositive => max,
            OffsetCorner.MaximumNegative => -max,
            _ => 0,
        };
    }

    /// <summary>The bias currents a corner gives a part: equal typical or maximum currents into both inputs, or none.</summary>
    /// <param name="part">The part.</param>
    /// <param name="corner">The corner.</param>
    public static BiasCurrents BiasCurrents(AmplifierPart part, BiasCorner corner)
    {
        ArgumentNullException.ThrowIfNull(part);
        double value = corner switch
        {
            BiasCorner.Typical => part.BiasCurrent.Typical.Value.Value,
            BiasCorner.Maximum => part.BiasCurrent.Maximum.Value.Value,
            _ => 0,
        };
        return new BiasCurrents(value, value);
    }

    /// <summary>
    /// The engine model of a diode part. When the part gives a forward-voltage point (Vf at I) instead of a saturation
    /// current, Is follows from the Shockley law through that point, Is = I / (exp(Vj/(n·V_T)) − 1) with the junction
    /// voltage Vj = Vf − I·Rs (so the model with its series resistance passes through the point) and the thermal voltage
    /// V_T = k·T/e from the exact SI constants. Returns false with a reason when the point cannot be met.
    /// </summary>
    /// <param name="part">The part.</param>
    /// <param name="temperature">Temperature in K.</param>
    /// <param name="saturationScale">Factor applied to the saturation current (1 for nominal).</param>
    /// <param name="model">The model, when the conversion succeeds.</param>
    /// <param name="problem">Why it failed, otherwise.</param>
    public static bool TryDiode(DiodePart part, double temperature, double saturationScale, out DiodeModel model, out string problem)
    {
        ArgumentNullException.ThrowIfNull(part);
        model = DiodeModel.SmallSignal;
        problem = string.Empty;
        double n = part.Emission.Value.Value;
        double rs = part.SeriesResistance.Value.Value;
        double saturation;
        if (part.SaturationCurrent is { } given)
        {
            saturation = given.Value.Value;
        }
        else if (part.ForwardVoltage is { } vf && part.ForwardVoltageCurrent is { } atCurrent)
        {
            double current = atCurrent.Value.Value;
            double junction = vf.Value.Value - (current * rs);
            if (!(junction > 0) || !(current > 0))
            {
                problem = $"diode '{part.Id.Value}': the forward-voltage point leaves no junction voltage after the series-resistance drop";
                return false;
            }

            saturation = current / double.ExpM1(junction / (n * PhysicalConstants.ThermalVoltage(temperature)));
        }
        else
        {
            problem = $"diode '{part.Id.Value}' gives neither a saturation current nor a forward-voltage point";
            return false;
        }

        saturation *= saturationScale;
        if (!(saturation > 0) || !double.IsFinite(saturation))
        {
            problem = $"diode '{part.Id.Value}': the saturation current comes out as {saturation} A; check the forward-voltage point and emission coefficient";
            return false;
        }

        model = new DiodeModel
        {
            SaturationCurrent = saturation,
            EmissionCoefficient = n,
            SeriesResistance = rs,
            JunctionCapacitance = part.Capacitance?.Value.Value ?? 0,
            BreakdownVoltage = part.BreakdownVoltage?.Value.Value,
        };
        return true;
    }
}
