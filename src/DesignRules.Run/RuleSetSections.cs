using System.Globalization;
using System.Text;
using DesignRules.Diagnostics;
using DesignRules.Model;

namespace DesignRules.Run;

/// <summary>
/// The parts of a rule set that apply to one design, written out canonically for its cache key: the file, the Monte
/// Carlo settings, the rules for every design and the design's own section with its stages — values with their source
/// positions (findings may point there). Other designs' sections are left out, so editing one design's section
/// re-evaluates that design only.
/// </summary>
internal static class RuleSetSections
{
    public static void Append(StringBuilder text, RuleSet ruleSet, string designId)
    {
        var mc = ruleSet.MonteCarlo;
        text.Append("rule-set ").Append(ruleSet.File).Append('\n');
        text.Append(CultureInfo.InvariantCulture, $"monte-carlo {mc.Samples} {mc.Seed} {mc.Distribution} {mc.Sequential} {mc.MaxSamples}\n");
        foreach (var (id, change) in ruleSet.Rules.OrderBy(r => r.Key, StringComparer.Ordinal))
        {
            Override(text, "rules " + id, change);
        }

        if (ruleSet.Designs.TryGetValue(designId, out var section))
        {
            text.Append("design-section ").Append(Span(section.Id.Span)).Append('\n');
            foreach (var (id, change) in section.Rules.OrderBy(r => r.Key, StringComparer.Ordinal))
            {
                Override(text, "design " + id, change);
            }

            foreach (var (stage, rules) in section.Stages.OrderBy(s => s.Key, StringComparer.Ordinal))
            {
                foreach (var (id, change) in rules.OrderBy(r => r.Key, StringComparer.Ordinal))
                {
                    Override(text, $"stage {stage} {id}", change);
                }
            }
        }
    }

    private static void Override(StringBuilder text, string what, RuleOverride change)
    {
        text.Append(what);
        if (change.Level is { } level)
        {
            text.Append(" level ").Append(level.Value).Append(' ').Append(Span(level.Span));
        }

        foreach (var (name, value) in change.Thresholds.OrderBy(t => t.Key, StringComparer.Ordinal))
        {
            text.Append(CultureInfo.InvariantCulture, $" {name}={value.Value.Value:R} {value.Value.Dimension} {Span(value.Span)}");
        }

        text.Append('\n');
    }

    private static string Span(SourceSpan s) =>
        string.Create(CultureInfo.InvariantCulture, $"{s.File.Length}:{s.File}({s.Line},{s.Column},{s.EndLine},{s.EndColumn})");
}
