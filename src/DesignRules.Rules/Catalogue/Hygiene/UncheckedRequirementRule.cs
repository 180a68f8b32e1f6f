using DesignRules.Diagnostics;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Hygiene;

/// <summary>
/// DR702: a requirement that no rule can check, so that nobody relies on a check that never runs. Where a requirement can
/// be judged is the requirement table's word (<see cref="RequirementTable"/>), not this rule's.
/// </summary>
internal sealed class UncheckedRequirementRule : Rule
{
    public override RuleId Id => RuleIds.UncheckedRequirement;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var design = evaluation.Design;
        var chain = evaluation.Analyses.Chain(Elaboration.BandEnd.Top) is { Succeeded: true } built ? built : null;
        foreach (var stage in design.Stages)
        {
            var target = $"stage `{stage.Id.Value}`";
            var probe = chain?.Stage(stage.Id.Value);
            foreach (var (kind, span) in RequirementTable.Stated(stage.Requirements))
            {
                if (kind.AppliesTo is { } applies && !applies(design, stage, probe))
                {
                    Report(evaluation, stage.Id.Value, span, kind.Key, target, kind.NotApplicableReason!);
                }
            }
        }

        foreach (var (kind, span) in RequirementTable.Stated(design.Requirements))
        {
            // A chain that did not build is reported for that; whether a chain-level check would have run is unknown.
            bool onChain = kind.JudgedOnChain is { } judged && (chain is null || judged(chain));
            if (!onChain)
            {
                Report(evaluation, null, span, kind.Key, $"design `{design.Id.Value}`", "requirements are checked per stage; move it to the stage it concerns");
            }
        }
    }

    private void Report(DesignEvaluation evaluation, string? stage, SourceSpan span, string requirement, string target, string reason) =>
        evaluation.Report(Id, stage, span, new Dictionary<string, string>
        {
            ["requirement"] = requirement, ["target"] = target, ["reason"] = reason,
        });
}
