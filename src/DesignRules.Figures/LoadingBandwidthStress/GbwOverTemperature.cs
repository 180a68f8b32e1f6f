using DesignRules.Elaboration;
using DesignRules.Figures.Tolerance;
using DesignRules.Model;

namespace DesignRules.Figures.LoadingBandwidthStress;

/// <summary>
/// The nominal chain with every amplifier's gain-bandwidth product taken at one end of the design's operating range: a
/// variant of the compiled circuit (<see cref="Circuit.WithGainBandwidthScaled"/>), not a second elaboration.
/// </summary>
/// <param name="Celsius">The temperature, °C.</param>
/// <param name="Chain">The chain whose circuit carries the derated GBWs (its probes still describe the 25 °C parts).</param>
/// <param name="Factors">Each derated amplifier's GBW at <paramref name="Celsius"/> over its 25 °C figure, by element id.</param>
internal sealed record GbwAtTemperature(double Celsius, ElaboratedChain Chain, IReadOnlyDictionary<string, double> Factors)
{
    /// <summary>True when some amplifier has less GBW here than at 25 °C: the end where bandwidth and loop gain are least.</summary>
    public bool Lowers => Factors.Values.Any(f => f < 1);

    /// <summary>True when some amplifier has more GBW here than at 25 °C: the end where a crossover moves up towards the poles of a capacitive load.</summary>
    public bool Raises => Factors.Values.Any(f => f > 1);
}

/// <summary>
/// Where a part states a <c>gbw-derating</c> d, its GBW at T is GBW·(1 + d·(T − 25 °C)) (<see cref="TemperatureBehaviour.GbwFactor"/>):
/// linear, so its least and greatest lie at the ends of the range. Bandwidth is judged at the end where GBW is lowest;
/// phase margin at the end where it is highest, since a higher crossover meets the extra poles (the second pole, the
/// output resistance with a capacitive load) with more phase lag (Franco, Design with Operational Amplifiers, §8.4).
/// </summary>
internal static class GbwOverTemperature
{
    /// <summary>The chain at each end of the range where some amplifier's GBW differs from 25 °C; empty without a range or a derating.</summary>
    public static IReadOnlyList<GbwAtTemperature> Ends(Design design, ElaboratedChain chain)
    {
        if (design.Temperature is not { } range || !chain.Succeeded)
        {
            return [];
        }

        var derated = chain.Stages.SelectMany(s => s.Amplifiers).Where(a => a.Part.GbwDerating is { } d && d.Value.Value != 0).ToArray();
        if (derated.Length == 0)
        {
            return [];
        }

        var ends = new List<GbwAtTemperature>();
        foreach (var celsius in new[] { range.Value.Low.Value, range.Value.High.Value }.Distinct())
        {
            var factors = derated.ToDictionary(a => a.ElementId, a => TemperatureBehaviour.GbwFactor(a.Part, celsius), StringComparer.Ordinal);
            if (factors.Values.All(f => f == 1))
            {
                continue;
            }

            ends.Add(new GbwAtTemperature(celsius, chain with { Circuit = chain.Circuit.WithGainBandwidthScaled(factors) }, factors));
        }

        return ends;
    }
}
