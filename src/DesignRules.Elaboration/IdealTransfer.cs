using DesignRules.Model;

namespace DesignRules.Elaboration;

/// <summary>
/// The transfer a stage realises with ideal amplifiers and diodes, computed from its component values: a piecewise-linear
/// function of the stage's input voltage with one slope for positive and one for negative inputs, plus an offset.
/// </summary>
/// <param name="Kind">What kind of transfer it is (a linear gain, a rectifier, a peak or an average).</param>
/// <param name="SlopePositive">Output change per volt of input for inputs at or above 0 V.</param>
/// <param name="SlopeNegative">Output change per volt of input for inputs below 0 V.</param>
/// <param name="Offset">Output for 0 V input, V.</param>
/// <remarks>
/// Examples: an inverting amplifier has both slopes −rf/rin; the two-diode half-wave rectifier of this library has
/// slopes −rf/rin and 0 (it passes the positive half-cycle inverted); an absolute-value circuit has slopes +1 and −1.
/// A peak detector and an averaging filter are not memoryless: for them <see cref="At"/> is the settled output for a
/// constant input, and the output of a periodic input should be compared with <see cref="At"/> of its peak or its mean.
/// </remarks>
public sealed record IdealTransfer(TransferKind Kind, double SlopePositive, double SlopeNegative, double Offset)
{
    /// <summary>A linear gain: out = offset + gain·in.</summary>
    /// <param name="gain">Voltage gain.</param>
    /// <param name="offset">Output for 0 V input, V.</param>
    public static IdealTransfer Linear(double gain, double offset = 0) => new(TransferKind.Gain, gain, gain, offset);

    /// <summary>The nominal gain: the slope of the passed half-cycle for a rectifier, the slope for positive inputs otherwise.</summary>
    public double Gain => Kind == TransferKind.HalfWaveNegative ? SlopeNegative : SlopePositive;

    /// <summary>The ideal output for an input of <paramref name="input"/> volts.</summary>
    /// <param name="input">Stage input voltage, V (for a stage fed differentially, the differential signal).</param>
    public double At(double input) => Offset + ((input >= 0 ? SlopePositive : SlopeNegative) * input);
}
