using System.Globalization;
using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Quantities;
using DesignRules.Rules;
using DesignRules.Rules.Evaluation;
using Scriban.Runtime;

namespace DesignRules.Pages;

/// <summary>
/// The data the templates see, built from a check report: plain script objects with snake_case names, so that a
/// repository's own templates depend only on this documented shape (see the built-in templates for every name).
/// </summary>
internal static class PageModel
{
    public static ScriptObject Index(CheckReport report, IReadOnlyList<(DesignSummary Summary, string Page)> designs)
    {
        var items = new ScriptArray();
        // Each design's findings in the report's order, gathered in one pass: a large repository's index lists hundreds of
        // designs, and a scan of every finding per design grew with the square of their number.
        var byDesign = report.Findings.Where(f => f.DesignId is not null).ToLookup(f => f.DesignId!, StringComparer.Ordinal);
        foreach (var (summary, page) in designs)
        {
            var findings = byDesign[summary.Design.Id.Value].ToList();
            items.Add(new ScriptObject
            {
                ["id"] = summary.Design.Id.Value,
                ["title"] = Title(summary.Design),
                ["summary"] = summary.Design.Summary,
                ["page"] = new MarkdownText(MarkdownEscape.Url(page)),
                ["stages"] = summary.Design.Stages.Count,
                ["errors"] = findings.Count(f => f.Severity == Severity.Error && !f.IsWaived),
                ["warnings"] = findings.Count(f => f.Severity == Severity.Warning && !f.IsWaived),
                ["notes"] = findings.Count(f => f.Severity == Severity.Note && !f.IsWaived),
                ["waived"] = findings.Count(f => f.IsWaived),
                ["caution"] = SafetyCaution.For(summary.Design)?.Text,
            });
        }

        return new ScriptObject
        {
            ["designs"] = items,
            ["errors"] = report.ErrorCount,
            ["warnings"] = report.WarningCount,
            ["design_count"] = report.DesignCount,
        };
    }

    public static ScriptObject Design(CheckReport report, DesignSummary summary, string? repositoryRoot, Func<string, string, string?> plotPath,
        Func<string, string> helpLink)
    {
        var design = summary.Design;
        var findings = report.Findings.Where(f => f.DesignId == design.Id.Value).ToList();
        var stages = new ScriptArray();
        foreach (var stage in design.Stages)
        {
            stages.Add(Stage(stage, summary, findings, plotPath, helpLink));
        }

        var source = design.Source.Waveform;
        return new ScriptObject
        {
            ["id"] = design.Id.Value,
            ["title"] = Title(design),
            ["summary"] = design.Summary,
            ["file"] = repositoryRoot is null ? design.File.Replace('\\', '/') : Path.GetRelativePath(repositoryRoot, design.File).Replace('\\', '/'),
            ["caution"] = SafetyCaution.For(design)?.Text,
            ["supplies"] = new ScriptObject
            {
                ["positive"] = design.Supplies.Positive.Value.Value,
                ["negative"] = design.Supplies.Negative.Value.Value,
                ["single"] = design.Supplies.Negative.Value.Value == 0,
            },
            ["source"] = new ScriptObject
            {
                ["waveform"] = source.Kind.ToString().ToLowerInvariant(),
                ["amplitude"] = source.Amplitude?.Value.Value,
                ["frequency"] = source.Frequency?.Value.Value,
                ["band_low"] = source.Band?.Value.Low.Value,
                ["band_high"] = source.Band?.Value.High.Value,
                ["offset"] = source.Offset?.Value.Value ?? 0.0,
                ["impedance"] = design.Source.Impedance.Value.Value,
                ["common_mode"] = design.Source.CommonMode?.Value.Value,
            },
            ["load"] = new ScriptObject
            {
                ["resistance"] = design.Load.Resistance.Value.Value,
                ["capacitance"] = design.Load.Capacitance?.Value.Value,
                ["returns_to"] = design.Load.ReturnsTo.Value.Value,
            },
            ["mermaid"] = new MarkdownText(Mermaid(design)),
            ["requirements"] = Requirements(design, summary.Requirements),
            ["stages"] = stages,
            ["findings"] = Findings(findings.Where(f => f.StageId is null), helpLink),
            ["errors"] = findings.Count(f => f.Severity == Severity.Error && !f.IsWaived),
            ["warnings"] = findings.Count(f => f.Severity == Severity.Warning && !f.IsWaived),
            ["waived"] = findings.Count(f => f.IsWaived),
        };
    }

    private static ScriptObject Stage(Stage stage, DesignSummary summary, List<Finding> findings, Func<string, string, string?> plotPath,
        Func<string, string> helpLink)
    {
        var parts = new ScriptArray();
        var values = new ScriptArray();
        string kind;
        string description;
        switch (stage)
        {
            case BlockStage block:
                kind = block.Block.Name;
                description = block.Block.Summary;
                foreach (var (slot, part) in block.Amplifiers.OrderBy(p => p.Key, StringComparer.Ordinal))
                {
                    parts.Add(Part(slot, part.Id.Value, part.Description, "amplifier"));
                }

                foreach (var (slot, part) in block.Diodes.OrderBy(p => p.Key, StringComparer.Ordinal))
                {
                    parts.Add(Part(slot, part.Id.Value, part.Description, "diode"));
                }

                foreach (var name in block.Block.AllValues.Where(block.Values.ContainsKey))
                {
                    var v = block.Values[name];
                    values.Add(Value(name, v.Value.Value, v.ResistorFamily?.Id.Value ?? v.CapacitorFamily?.Id.Value,
                        v.ResistorFamily?.Tolerance.Value.Value ?? v.CapacitorFamily?.Tolerance.Value.Value));
                }

                foreach (var (name, flag) in block.Flags.OrderBy(f => f.Key, StringComparer.Ordinal))
                {
                    values.Add(new ScriptObject { ["name"] = name, ["value"] = flag.Value ? "yes" : "no", ["unit"] = string.Empty, ["family"] = null, ["tolerance"] = null });
                }

                break;
            case NetlistStage netlist:
                kind = "netlist";
                description = $"Explicit circuit from {netlist.Input.Value} to {netlist.Output.Value}";
                foreach (var element in netlist.Elements)
                {
                    if (element.Amplifier is not null)
                    {
                        parts.Add(Part(element.Id.Value, element.Amplifier.Id.Value, element.Amplifier.Description, "amplifier"));
                    }
                    else if (element.Diode is not null)
                    {
                        parts.Add(Part(element.Id.Value, element.Diode.Id.Value, element.Diode.Description, "diode"));
                    }
                    else if (element.Value is not null)
                    {
                        values.Add(Value(element.Id.Value, element.Value.Value, element.ResistorFamily?.Id.Value ?? element.CapacitorFamily?.Id.Value,
                            element.ResistorFamily?.Tolerance.Value.Value ?? element.CapacitorFamily?.Tolerance.Value.Value));
                    }
                }

                break;
            default:
                throw new InvalidOperationException("Unknown stage kind.");
        }

        var figures = new ScriptArray();
        foreach (var figure in summary.StageFigures.FirstOrDefault(s => s.Key == stage.Id.Value).Value ?? [])
        {
            figures.Add(new ScriptObject
            {
                ["key"] = figure.Key.ToString(), ["name"] = figure.Name, ["value"] = figure.Value, ["unit"] = figure.Unit,
                ["limit"] = figure.Limit, ["margin"] = figure.Margin, ["temperature"] = figure.Temperature,
            });
        }

        var plots = summary.Plots.FirstOrDefault(p => p.StageId == stage.Id.Value);
        return new ScriptObject
        {
            ["id"] = stage.Id.Value,
            ["kind"] = kind,
            ["description"] = description,
            ["equation"] = Equations.Of(stage),
            ["parts"] = parts,
            ["values"] = values,
            ["figures"] = figures,
            // A temperature column only where the design declares an operating range, so pages of 25 °C designs keep their shape.
            ["temperature_column"] = (summary.StageFigures.FirstOrDefault(s => s.Key == stage.Id.Value).Value ?? []).Any(f => f.Temperature is not null),
            ["findings"] = Findings(findings.Where(f => f.StageId == stage.Id.Value), helpLink),
            ["transient_plot"] = plots?.Transient is null ? null : Link(plotPath(stage.Id.Value, "transient")),
            ["bode_plot"] = plots?.Bode is null ? null : Link(plotPath(stage.Id.Value, "response")),
            ["histogram_plot"] = plots?.Distribution is null ? null : Link(plotPath(stage.Id.Value, "monte-carlo")),
            ["histogram_caption"] = plots?.Distribution?.Caption,
            ["loop_gain_plots"] = new ScriptArray((plots?.LoopGains ?? []).Select(l => new ScriptObject
            {
                ["amplifier"] = l.Amplifier,
                ["plot"] = Link(plotPath(stage.Id.Value, "loop-" + OutputFolder.SafeName(l.Amplifier))),
                ["crossover"] = l.Crossover,
                ["phase_margin"] = l.PhaseMargin,
            })),
            ["step_plot"] = plots?.Step is null ? null : Link(plotPath(stage.Id.Value, "step")),
            ["step_overshoot"] = plots?.Step?.Overshoot,
            ["amplifier_nodes"] = new ScriptArray(plots?.Transient?.Traces.Where(t => t.Role == TraceRole.AmplifierOutput).Select(t => t.Name) ?? []),
            ["noise_plot"] = plots?.Noise is null ? null : Link(plotPath(stage.Id.Value, "noise")),
            ["noise_rms"] = plots?.Noise?.OutputRms,
            ["noise_contributors"] = NoiseContributors(plots?.Noise),
        };
    }

    /// <summary>Rows of the noise contributor table shown before the rest are summed into one row.</summary>
    private const int NoiseRows = 8;

    /// <summary>The largest contributors, one row each, the rest summed in power into one row.</summary>
    private static ScriptArray NoiseContributors(NoisePlot? noise)
    {
        var rows = new ScriptArray();
        if (noise is null)
        {
            return rows;
        }

        // Contributors below 0.01 % of the noise power are summed with the rest: they would only be rows of zeros.
        var listed = noise.Contributors.Take(NoiseRows).Where(c => c.Share >= 1e-4).ToList();
        foreach (var c in listed)
        {
            rows.Add(new ScriptObject { ["element"] = c.Element, ["source"] = c.Source, ["rms"] = c.Rms, ["share"] = c.Share });
        }

        var rest = noise.Contributors.Skip(listed.Count).ToList();
        if (rest.Count > 0)
        {
            rows.Add(new ScriptObject
            {
                ["element"] = null,
                ["others"] = $"{rest.Count} others",
                ["source"] = string.Empty,
                ["rms"] = Math.Sqrt(rest.Sum(c => c.Rms * c.Rms)),
                ["share"] = rest.Sum(c => c.Share),
            });
        }

        return rows;
    }

    private static ScriptObject Part(string slot, string id, string description, string kind) => new()
    {
        ["slot"] = slot, ["id"] = id, ["description"] = description, ["kind"] = kind,
    };

    private static ScriptObject Value(string name, Quantity value, string? family, double? tolerance) => new()
    {
        ["name"] = name,
        ["value"] = value.Format(),
        ["unit"] = string.Empty,
        ["family"] = family,
        ["tolerance"] = tolerance,
    };

    private static MarkdownText? Link(string? target) => target is null ? null : new MarkdownText(MarkdownEscape.Url(target));

    private static ScriptArray Findings(IEnumerable<Finding> findings, Func<string, string> helpLink)
    {
        var list = new ScriptArray();
        foreach (var f in findings)
        {
            list.Add(new ScriptObject
            {
                ["id"] = f.RuleId,
                ["title"] = f.Title,
                ["severity"] = f.Severity.ToString().ToLowerInvariant(),
                // Messages put node and key names in `code`; those stay code spans, the rest is escaped text.
                // The fix hint has its own column ("what would fix it"), so the page shows the message without it.
                ["message"] = new MarkdownText(MarkdownEscape.Message(f.Fix is { } fix && f.Message.EndsWith(" Fix: " + fix.Said, StringComparison.Ordinal)
                    ? f.Message[..^(" Fix: ".Length + fix.Said.Length)] : f.Message)),
                ["fix"] = f.Fix is null ? null : new MarkdownText(MarkdownEscape.Message(f.Fix.Said)),
                ["fix_subject"] = f.Fix?.Subject,
                ["line"] = f.Span.Line,
                ["column"] = f.Span.Column,
                ["waived"] = f.IsWaived,
                ["reason"] = f.Waiver,
                ["help"] = new MarkdownText(MarkdownEscape.Url(helpLink(f.RuleId))),
            });
        }

        return list;
    }

    private static ScriptArray Requirements(Design design, IReadOnlyList<RequirementVerdict> verdicts)
    {
        var list = new ScriptArray();
        foreach (var stage in design.Stages)
        {
            foreach (var (kind, _) in RequirementTable.Stated(stage.Requirements))
            {
                string name = kind.Key, text = kind.Text(stage.Requirements);
                // The verdict comes from the rules that judged the requirement (one table, in the check), never from here.
                var found = verdicts.FirstOrDefault(v => v.StageId == stage.Id.Value && v.Name == name);
                var verdict = found is null ? "not checked"
                    : found.Verdict == "not met" && found.Reported.All(id => id == RuleIds.YieldNotShown) ? $"not shown ({RuleIds.YieldNotShown})"
                    : found.Verdict == "not met" ? "not met (" + string.Join(", ", found.Reported.Where(id => id != RuleIds.YieldNotShown)) + ")"
                    : found.Verdict;
                list.Add(new ScriptObject { ["stage"] = stage.Id.Value, ["name"] = name, ["value"] = text, ["verdict"] = verdict });
            }
        }

        return list;
    }

    private static string Mermaid(Design design)
    {
        var lines = new List<string> { "flowchart LR" };
        var source = design.Source.Waveform;
        var freq = source.Frequency is not null ? source.Frequency.Value.Format() : source.Band?.Value.Format() ?? "DC";
        lines.Add($"  source[\"{MarkdownEscape.MermaidLabel($"Source: {source.Kind.ToString().ToLowerInvariant()} {source.Amplitude?.Value.Format() ?? source.Offset?.Value.Format()}, {freq}, {design.Source.Impedance.Value.Format()}")}\"]");
        var previous = "source";
        var i = 0;
        foreach (var stage in design.Stages)
        {
            var node = $"s{i++}";
            var kind = stage is BlockStage b ? b.Block.Name : "netlist";
            lines.Add($"  {node}[\"{MarkdownEscape.MermaidLabel($"{stage.Id.Value}: {kind}")}\"]");
            lines.Add($"  {previous} --> {node}");
            previous = node;
        }

        lines.Add($"  load[\"{MarkdownEscape.MermaidLabel($"Load: {design.Load.Resistance.Value.Format()}{(design.Load.Capacitance is null ? string.Empty : " ∥ " + design.Load.Capacitance.Value.Format())}")}\"]");
        lines.Add($"  {previous} --> load");
        return string.Join('\n', lines);
    }

    private static string Title(Design design) => design.Title.Length > 0 ? design.Title : design.Id.Value;

}
