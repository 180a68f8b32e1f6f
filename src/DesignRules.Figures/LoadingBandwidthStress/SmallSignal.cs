using System.Numerics;
using DesignRules.Elaboration;
using DesignRules.Model;
using DesignRules.Simulation;

namespace DesignRules.Figures.LoadingBandwidthStress;

/// <summary>
/// Small-signal (AC) figures of a design at the frequencies the rules care about: the band-end test frequencies, 1 Hz (the
/// reference of a DC-coupled transfer) and 1 mHz (DC, for signals that carry a mean: rectified, averaged, or DC sources).
/// The sweep is run once per design on the band-top chain and shared.
/// </summary>
internal sealed class SmallSignal
{
    /// <summary>The frequency taken as DC, Hz.</summary>
    public const double Dc = 1e-3;

    private SmallSignal(ElaboratedChain chain, AcResult result, IReadOnlyList<double> bandFrequencies)
    {
        Chain = chain;
        Result = result;
        BandFrequencies = bandFrequencies;
    }

    public ElaboratedChain Chain { get; }

    public AcResult Result { get; }

    /// <summary>The source's test frequencies at the band ends (empty for a DC source).</summary>
    public IReadOnlyList<double> BandFrequencies { get; }

    /// <summary>The shared small-signal sweep of a design; null when the chain could not be built or the analysis failed (reported once).</summary>
    public static SmallSignal? Of(DesignAnalyses analyses) =>
        analyses.SmallSignal;

    internal static SmallSignal? Compute(DesignAnalyses analyses) => Compute(analyses, analyses.Chain(BandEnd.Top));

    /// <summary>The same small-signal list on a variant of the band-top chain (its amplifiers at another temperature).</summary>
    internal static SmallSignal? Compute(DesignAnalyses analyses, ElaboratedChain chain)
    {
        if (!chain.Succeeded)
        {
            return null;
        }

        var band = analyses.BandEnds.Select(e => analyses.Chain(e).TestFrequency).OfType<double>().Distinct().Order().ToList();
        var top = SourceSignal.TopFrequency(analyses.Design.Source.Waveform);
        var frequencies = new[] { Dc, 1.0 }.Concat(band).Concat(top is { } t ? [t] : []).Distinct().Order().ToArray();
        var result = Simulate.AcSweep(chain.Circuit, AcSweep.List(chain.SourceId, frequencies));
        if (!result.Succeeded)
        {
            analyses.ReportFailure("AC", result.Failure!, chain);
            return null;
        }

        return new SmallSignal(chain, result, band);
    }

    /// <summary>Index of a frequency of the sweep.</summary>
    public int IndexOf(double frequency)
    {
        for (int i = 0; i < Result.Frequencies.Count; i++)
        {
            if (Result.Frequencies[i] == frequency)
            {
                return i;
            }
        }

        throw new ArgumentOutOfRangeException(nameof(frequency), frequency, "not a frequency of the sweep");
    }

    /// <summary>The differential voltage of a stage's input (input node minus its reference input node).</summary>
    public static Complex InputVoltage(AcResult result, StageProbe stage, int index) =>
        result.Voltage(stage.InputNode)[index] - result.Voltage(stage.ReferenceInputNode)[index];

    /// <summary>
    /// The loading between a stage's output node and whatever is connected to it downstream (the next stage, or the load):
    /// a 1 A AC test current is injected at the node, in a second elaboration of the same chain, and the share of it that
    /// flows into the downstream elements is the loading loss Zout/(Zout + Zin) (current divider); Zin and Zout follow.
    /// </summary>
    internal Loading? ComputeLoading(DesignAnalyses analyses, int stageIndex)
    {
        var stage = Chain.Stages[stageIndex];
        var node = stage.OutputNode;
        var tested = ChainElaborator.Elaborate(analyses.Design, Chain.Options);
        const string testId = "loading-test";
        tested.Circuit.AddCurrentSource(testId, Circuit.Ground, node, 0);
        var result = Simulate.AcSweep(tested.Circuit, AcSweep.List(testId, [.. Result.Frequencies]));
        if (!result.Succeeded)
        {
            analyses.ReportFailure("AC", result.Failure!, Chain);
            return null;
        }

        // The test current is the only stimulus of this sweep, so every node voltage is the change it causes.
        Complex Delta(string n, int i) => result.Voltage(n)[i];
        var points = new List<LoadingPoint>();
        for (int i = 0; i < Result.Frequencies.Count; i++)
        {
            double omega = 2 * Math.PI * Result.Frequencies[i];
            var dv = Delta(node, i);
            Complex into = Complex.Zero;
            if (stageIndex + 1 < Chain.Stages.Count)
            {
                foreach (var c in Chain.Stages[stageIndex + 1].Components)
                {
                    if (c.NodeA != node && c.NodeB != node)
                    {
                        continue;
                    }

                    var other = c.NodeA == node ? c.NodeB : c.NodeA;
                    into += Admittance(c.Kind, c.Value, omega) * (dv - Delta(other, i));
                }
            }
            else
            {
                var load = analyses.Design.Load;
                into = dv * (Admittance(ElementKind.Resistor, load.Resistance.Value.Value, omega)
                             + (load.Capacitance is { } cl ? Admittance(ElementKind.Capacitor, cl.Value.Value, omega) : Complex.Zero));
            }

            points.Add(new LoadingPoint(Result.Frequencies[i], into.Magnitude, dv / into, dv / (1 - into)));
        }

        return new Loading(points);
    }

    private static Complex Admittance(ElementKind kind, double value, double omega) => kind switch
    {
        ElementKind.Resistor => 1 / value,
        ElementKind.Capacitor => new Complex(0, omega * value),
        ElementKind.Inductor => 1 / new Complex(0, omega * value),
        _ => Complex.Zero,
    };

}

/// <summary>The loading of one stage output at each swept frequency.</summary>
internal sealed record Loading(IReadOnlyList<LoadingPoint> Points);

/// <summary>Loading loss Zout/(Zout + Zin) at one frequency, with the impedances it follows from.</summary>
internal sealed record LoadingPoint(double Frequency, double Error, Complex InputImpedance, Complex OutputImpedance);
