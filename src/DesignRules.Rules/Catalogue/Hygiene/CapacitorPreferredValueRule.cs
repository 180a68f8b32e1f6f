using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Quantities;
using DesignRules.Rules.Evaluation;

namespace DesignRules.Rules.Catalogue.Hygiene;

/// <summary>
/// DR710: every capacitor value (block values and netlist capacitors) belongs to the E-series the design declares for
/// capacitors (<c>capacitor-e-series:</c>, IEC 60063). Capacitors come in coarser series than resistors, so they have
/// their own declaration.
/// </summary>
internal sealed class CapacitorPreferredValueRule : Rule
{
    public override RuleId Id => RuleIds.PreferredCapacitorValue;

    public override void Evaluate(DesignEvaluation evaluation)
    {
        var declared = evaluation.Design.CapacitorESeries;
        if (declared is null || !ESeries.TryGet(declared.Value, out var series))
        {
            return;
        }

        foreach (var (stage, name, value, span) in Capacitors(evaluation.Design))
        {
            if (series.Contains(value))
            {
                continue;
            }

            var nearest = series.Nearest(value);
            evaluation.Report(Id, stage.Id.Value, span, new Dictionary<string, string>
            {
                ["component"] = $"{stage.Id.Value}.{name}",
                ["value"] = Farads(value),
                ["series"] = series.Name,
                ["nearest"] = Farads(nearest),
            }, PreferredValueFix.Of($"{stage.Id.Value}.{name}", nearest, Dimension.Capacitance, span), FigureKinds.CapacitorValue.Of(value), FigureKinds.NearestPreferredCapacitorValue.Of(nearest));
        }
    }

    private static string Farads(double c) => new Quantity(c, Dimension.Capacitance).Format();

    private static IEnumerable<(Stage Stage, string Name, double Value, Diagnostics.SourceSpan Span)> Capacitors(Design design)
    {
        foreach (var stage in design.Stages)
        {
            switch (stage)
            {
                case BlockStage block:
                    foreach (var (name, v) in block.Values.Where(v => v.Value.Value.Value.Dimension == Dimension.Capacitance).OrderBy(v => v.Key, StringComparer.Ordinal))
                    {
                        yield return (stage, name, v.Value.Value.Value, v.Value.Span);
                    }

                    break;
                case NetlistStage netlist:
                    foreach (var e in netlist.Elements.Where(e => e.Kind == ElementKind.Capacitor && e.Value is not null))
                    {
                        yield return (stage, e.Id.Value, e.Value!.Value.Value, e.Value.Span);
                    }

                    break;
            }
        }
    }
}
