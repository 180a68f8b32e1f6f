using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Saturation;

/// <summary>
/// DR205: in a single-supply design (negative rail 0 V), a stage whose input swings below the negative rail plus the
/// larger of its amplifiers' input common-mode headroom and output swing headroom needs a bias point it does not have.
/// Points at the source's offset (first stage) or the stage (later stages), where the bias belongs.
/// </summary>
internal sealed class SingleSupplyBiasRule : Rule
{
    public override RuleId Id => RuleIds.SingleSupplyBias;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var design = evaluation.Design;
        foreach (var s in SingleSupply.Stages(evaluation.Analyses))
        {
            evaluation.Record(s.Stage.StageId, FigureKinds.SingleSupplyHeadroom.Of(s.Minimum - s.Limit).AtLeast(0));
            if (!s.NeedsBias)
            {
                continue;
            }

            bool first = design.Stages.Count > 0 && design.Stages[0].Id.Value == s.Stage.StageId;
            var span = first ? design.Source.Waveform.Offset?.Span ?? design.Source.Waveform.Span : s.Stage.Stage.Span;
            evaluation.Report(Id, s.Stage.StageId, span, new Dictionary<string, string>
            {
                ["stage"] = s.Stage.StageId,
                ["extreme"] = Say.Volts(s.Minimum),
                ["limit"] = Say.Volts(s.Limit),
            }, FigureKinds.InputMinimum.Of(s.Minimum), FigureKinds.UsableInputMinimum.Of(s.Limit));
        }
    }
}
