using System.Numerics;

namespace DesignRules.Simulation.Measurements;

/// <summary>Gain and phase of a transfer at one frequency.</summary>
/// <param name="Frequency">Frequency, Hz.</param>
/// <param name="Gain">|H|.</param>
/// <param name="GainDb">20·log10|H|, dB.</param>
/// <param name="PhaseDegrees">∠H in degrees (−180..180).</param>
public sealed record GainPhase(double Frequency, double Gain, double GainDb, double PhaseDegrees);

/// <summary>Figures read from an AC result: transfer at a frequency, −3 dB bandwidth, impedances.</summary>
public static class FrequencyResponse
{
    /// <summary>
    /// Transfer H = V(output)/V(input) (or V(output) per unit source when <paramref name="input"/> is null) at
    /// <paramref name="frequency"/>, interpolated linearly in log-frequency between sweep points.
    /// </summary>
    /// <param name="ac">AC result.</param>
    /// <param name="output">Output node.</param>
    /// <param name="input">Input node, or null.</param>
    /// <param name="frequency">Frequency, Hz (within the sweep).</param>
    public static GainPhase At(AcResult ac, string output, string? input, double frequency)
    {
        var h = Transfer(ac, output, input);
        var value = Interpolate(ac.Frequencies, h, frequency);
        return Describe(frequency, value);
    }

    /// <summary>
    /// Frequency at which |H| first falls to 1/√2 of its value at the lowest swept frequency, interpolated in dB against
    /// log-frequency; null when it stays above within the sweep.
    /// </summary>
    /// <param name="ac">AC result.</param>
    /// <param name="output">Output node.</param>
    /// <param name="input">Input node, or null.</param>
    public static double? Bandwidth(AcResult ac, string output, string? input = null)
    {
        var h = Transfer(ac, output, input);
        if (h.Length < 2) return null;
        double reference = 20 * Math.Log10(h[0].Magnitude);
        double level = reference - (10 * Math.Log10(2));
        for (int i = 1; i < h.Length; i++)
        {
            double db = 20 * Math.Log10(h[i].Magnitude);
            if (db > level) continue;
            double dbPrev = 20 * Math.Log10(h[i - 1].Magnitude);
            double f0 = Math.Log10(ac.Frequencies[i - 1]), f1 = Math.Log10(ac.Frequencies[i]);
            double fraction = dbPrev == db ? 0 : (dbPrev - level) / (dbPrev - db);
            return Math.Pow(10, f0 + ((f1 - f0) * fraction));
        }

        return null;
    }

    /// <summary>
    /// Impedance seen by a voltage test source: Z = V(node)/I into the circuit, where the source's positive terminal is
    /// <paramref name="node"/> and its negative terminal the reference (input impedance of a stage).
    /// </summary>
    /// <param name="ac">AC result.</param>
    /// <param name="node">Node the source drives.</param>
    /// <param name="sourceId">Id of the voltage source (with a non-zero AC magnitude).</param>
    /// <param name="frequency">Frequency, Hz.</param>
    public static Complex ImpedanceAtSource(AcResult ac, string node, string sourceId, double frequency)
    {
        ArgumentNullException.ThrowIfNull(ac);
        var v = Interpolate(ac.Frequencies, ac.Voltage(node), frequency);
        var i = Interpolate(ac.Frequencies, ac.Current(sourceId), frequency);
        return v / -i;
    }

    private static Complex[] Transfer(AcResult ac, string output, string? input)
    {
        ArgumentNullException.ThrowIfNull(ac);
        var vout = ac.Voltage(output);
        if (input is null) return vout;
        var vin = ac.Voltage(input);
        var h = new Complex[vout.Length];
        for (int i = 0; i < h.Length; i++) h[i] = vout[i] / vin[i];
        return h;
    }

    private static Complex Interpolate(IReadOnlyList<double> frequencies, Complex[] values, double f)
    {
        if (values.Length == 0) return new Complex(double.NaN, double.NaN);
        if (f <= frequencies[0]) return values[0];
        if (f >= frequencies[^1]) return values[^1];
        for (int i = 1; i < frequencies.Count; i++)
        {
            if (frequencies[i] < f) continue;
            double x0 = Math.Log10(frequencies[i - 1]), x1 = Math.Log10(frequencies[i]);
            double w = x1 == x0 ? 0 : (Math.Log10(f) - x0) / (x1 - x0);

            // Interpolate magnitude in dB and unwrapped phase, which are smooth in log-frequency.
            double m0 = Math.Log(values[i - 1].Magnitude), m1 = Math.Log(values[i].Magnitude);
            double p0 = values[i - 1].Phase, p1 = values[i].Phase;
            if (p1 - p0 > Math.PI) p1 -= 2 * Math.PI;
            if (p0 - p1 > Math.PI) p1 += 2 * Math.PI;
            return Complex.FromPolarCoordinates(Math.Exp(m0 + ((m1 - m0) * w)), p0 + ((p1 - p0) * w));
        }

        return values[^1];
    }

    private static GainPhase Describe(double f, Complex h) => new(f, h.Magnitude, 20 * Math.Log10(h.Magnitude), h.Phase * 180 / Math.PI);
}
