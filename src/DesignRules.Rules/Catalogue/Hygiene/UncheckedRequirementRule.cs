using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Hygiene;

/// <summary>DR702: a requirement that no rule can check, so that nobody relies on a check that never runs.</summary>
internal sealed class UncheckedRequirementRule : Rule
{
    public override RuleId Id => RuleIds.UncheckedRequirement;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var design = evaluation.Design;
        foreach (var stage in design.Stages)
        {
            var r = stage.Requirements;
            var target = $"stage `{stage.Id.Value}`";
            var probe = evaluation.Analyses.Chain(Elaboration.BandEnd.Top) is { Succeeded: true } built ? built.Stage(stage.Id.Value) : null;
            var rectifying = probe is not null && StageProperties.IsRectifying(probe);
            if (r.Glitch is not null && !rectifying)
            {
                Report(evaluation, stage.Id.Value, r.Glitch.Span, "glitch", target, "only rectifying stages have zero-crossing glitches");
            }

            if (r.MinSignal is not null && !rectifying)
            {
                Report(evaluation, stage.Id.Value, r.MinSignal.Span, "min-signal", target, "the smallest-signal check applies to precision rectifiers");
            }

            if (r.Yield is not null && r.Accuracy is null)
            {
                Report(evaluation, stage.Id.Value, r.Yield.Span, "yield", target, "a yield needs an accuracy to count samples against");
            }

            // DR403 measures common-mode rejection only where the chain feeds a difference stage from a split source.
            bool splitFed = design.Source.CommonMode is not null && design.Stages[0] == stage && stage is BlockStage { Block.Name: "difference" };
            if (r.CommonModeRejection is not null && !splitFed)
            {
                Report(evaluation, stage.Id.Value, r.CommonModeRejection.Span, "cmrr", target,
                    "common-mode rejection is measured on a difference stage that is the first stage, fed from a source with a `common-mode` level");
            }

        }

        // DR501 checks a chain-level bandwidth when every stage is a linear gain stage; nothing else checks the chain.
        var chain = design.Requirements;
        var linearChain = design.Stages.All(s => s is BlockStage { Block.Name: "inverting" or "non-inverting" or "follower" or "difference" or "summing" });
        foreach (var (name, span) in new (string, SourceSpan?)[]
                 {
                     ("transfer", chain.Transfer?.Span), ("gain", chain.Gain?.Span), ("accuracy", chain.Accuracy?.Span),
                     ("glitch", chain.Glitch?.Span), ("yield", chain.Yield?.Span), ("bandwidth", linearChain ? null : chain.Bandwidth?.Span),
                     ("output-offset", chain.OutputOffset?.Span), ("min-signal", chain.MinSignal?.Span), ("cmrr", chain.CommonModeRejection?.Span),
                 })
        {
            if (span is not null)
            {
                Report(evaluation, null, span, name, $"design `{design.Id.Value}`", "requirements are checked per stage; move it to the stage it concerns");
            }
        }
    }

    private void Report(DesignEvaluation evaluation, string? stage, SourceSpan span, string requirement, string target, string reason) =>
        evaluation.Report(Id, stage, span, new Dictionary<string, string>
        {
            ["requirement"] = requirement, ["target"] = target, ["reason"] = reason,
        });
}
