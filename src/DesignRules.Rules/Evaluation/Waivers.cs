using System.Globalization;
using DesignRules.Diagnostics;
using DesignRules.Model;

namespace DesignRules.Rules.Evaluation;

/// <summary>
/// Applies a design's waivers to its findings: a matching, unexpired waiver marks the finding waived with its
/// reason; an expired one waives nothing and is reported (DR703); one that matches nothing is reported (DR704).
/// </summary>
internal static class Waivers
{
    public static List<Finding> Apply(Design design, IReadOnlyList<Finding> findings, DateOnly today, Func<RuleId, string?, bool> isOn)
    {
        var result = findings.ToList();
        var extra = new List<Finding>();
        foreach (var waiver in design.Waivers)
        {
            var target = waiver.Stage.Value == "*" ? design.Id.Value : $"{design.Id.Value}.{waiver.Stage.Value}";
            var matches = Enumerable.Range(0, result.Count).Where(i => Matches(waiver, result[i])).ToList();
            if (waiver.Expires is { } expires && expires.Value < today)
            {
                if (isOn(RuleIds.ExpiredWaiver, StageOf(waiver)))
                {
                    extra.Add(Make(RuleIds.ExpiredWaiver, design, waiver, expires.Span, new Dictionary<string, string>
                    {
                        ["rule"] = waiver.Rule.Value, ["target"] = target,
                        ["expires"] = expires.Value.ToString("yyyy-MM-dd", CultureInfo.InvariantCulture),
                    }));
                }

                continue;
            }

            if (matches.Count == 0)
            {
                if (isOn(RuleIds.UnmatchedWaiver, StageOf(waiver)))
                {
                    extra.Add(Make(RuleIds.UnmatchedWaiver, design, waiver, waiver.Rule.Span, new Dictionary<string, string>
                    {
                        ["rule"] = waiver.Rule.Value, ["target"] = target,
                    }));
                }

                continue;
            }

            foreach (var i in matches)
            {
                result[i] = result[i] with { Waiver = DiagnosticText.Quote(waiver.Reason.Value) };
            }
        }

        result.AddRange(extra);
        return result;
    }

    private static string? StageOf(Waiver waiver) => waiver.Stage.Value == "*" ? null : waiver.Stage.Value;

    private static bool Matches(Waiver waiver, Finding finding) =>
        finding.RuleId == waiver.Rule.Value && finding.Waiver is null &&
        (waiver.Stage.Value == "*" || waiver.Stage.Value == finding.StageId);

    private static Finding Make(RuleId id, Design design, Waiver waiver, SourceSpan span, Dictionary<string, string> args)
    {
        var rule = RuleCatalogue.Default[id];
        return new Finding(id, rule.Title, rule.DefaultSeverity, rule.Render(args), span, rule.HelpPage, design.Id.Value, StageOf(waiver), null, []);
    }
}
