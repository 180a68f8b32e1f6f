namespace DesignRules.Rules.Tests.Reference;

/// <summary>
/// An independent time-stepping of the textbook model of a single-diode follower rectifier (written here, not the engine):
/// <list type="bullet">
/// <item><description>amplifier: single pole from GBW and the open-loop gain A0, dx/dt = SR·tanh((ωu·vd − ωp·x)/SR) — the
/// dominant-pole integrator driven by a differential pair, whose tanh large-signal transfer saturates at the slew rate
/// (Gray and Meyer, Analysis and Design of Analog Integrated Circuits, differential-pair transfer and slew rate, from
/// memory) — with the output held inside its swing limits;</description></item>
/// <item><description>diode: a dead zone of a constant forward voltage Vf (the constant-drop diode model of every circuits
/// textbook), no resistance when on; while it is off the load holds the output at 0 V;</description></item>
/// <item><description>glitch: the longest time after an input zero crossing that the output stays more than band·Vp from the
/// ideal max(vin, 0), with the input delayed by the closed loop's own phase delay at f, atan(f/GBW)/(2π·f) (the single-pole
/// follower 1/(1 + s/ωu), a bandwidth matter and not a glitch).</description></item>
/// </list>
/// Forward Euler with a step of 1 % of 1/ωu and of the period / 20 000, whichever is shorter; three periods, the last one
/// measured.
/// </summary>
internal static class FollowerRectifierModel
{
    public static double Glitch(double slewRate, double gbw, double openLoopGain, double swingLow, double forwardVoltage, double amplitude, double frequency, double band)
    {
        double wu = 2 * Math.PI * gbw, wp = wu / openLoopGain, period = 1 / frequency;
        double dt = Math.Min(0.01 / wu, period / 20000);
        double delay = Math.Atan(frequency / gbw) / (2 * Math.PI * frequency);
        double tolerance = band * amplitude;
        double x = 0, worst = 0;
        double? outSince = null;
        long steps = (long)Math.Ceiling(3 * period / dt);
        for (long k = 0; k <= steps; k++)
        {
            double t = k * dt;
            double vin = amplitude * Math.Sin(2 * Math.PI * frequency * t);
            double vout = Math.Max(x - forwardVoltage, 0);
            if (t >= 2 * period)
            {
                double ideal = Math.Max(amplitude * Math.Sin(2 * Math.PI * frequency * (t - delay)), 0);
                bool outOfBand = Math.Abs(vout - ideal) > tolerance;
                if (outOfBand && outSince is null)
                {
                    outSince = t;
                }
                else if (!outOfBand && outSince is { } start)
                {
                    worst = Math.Max(worst, t - start);
                    outSince = null;
                }
            }

            double rate = slewRate * Math.Tanh(((wu * (vin - vout)) - (wp * x)) / slewRate);
            x = Math.Clamp(x + (rate * dt), swingLow, -swingLow);
        }

        return worst;
    }
}
