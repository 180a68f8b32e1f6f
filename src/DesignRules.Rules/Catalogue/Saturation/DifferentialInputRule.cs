using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Saturation;

/// <summary>
/// DR204: the largest voltage between an amplifier's inputs in the transient at every band end (it grows only while
/// the loop is open: a rectifier's diode off, a peak detector between peaks, a slewing edge) against the part's
/// maximum differential input.
/// </summary>
internal sealed class DifferentialInputRule : Rule
{
    public override RuleId Id => RuleIds.DifferentialInput;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var worst = new Dictionary<string, AmplifierWaveform>(StringComparer.Ordinal);
        var order = new List<string>();
        foreach (var a in AmplifierWaveforms.AtEveryEnd(evaluation.Analyses).SelectMany(b => b.Amplifiers))
        {
            if (!worst.TryGetValue(a.Name, out var previous))
            {
                order.Add(a.Name);
                worst[a.Name] = a;
            }
            else if (a.PeakDifferentialInput > previous.PeakDifferentialInput)
            {
                worst[a.Name] = a;
            }
        }

        foreach (var a in order.Select(n => worst[n]))
        {
            var peak = FigureKinds.DifferentialInput.Of(a.Probe.Slot, a.PeakDifferentialInput);
            evaluation.Record(a.Stage.StageId, a.Probe.Part.MaxDifferentialInput is { } maximum ? peak.AtMost(maximum.Value.Value) : peak);
            if (a.Probe.Part.MaxDifferentialInput is not { } rating || a.PeakDifferentialInput <= rating.Value.Value)
            {
                continue;
            }

            evaluation.Report(Id, a.Stage.StageId, a.Named.PartSpan, new Dictionary<string, string>
            {
                ["amplifier"] = a.Name,
                ["vd"] = Say.Volts(a.PeakDifferentialInput),
                ["limit"] = Say.Volts(rating.Value.Value),
            }, FigureKinds.DifferentialInput.Of(a.Probe.Slot, a.PeakDifferentialInput), FigureKinds.MaximumDifferentialInput.Of(rating.Value.Value));
        }
    }
}
