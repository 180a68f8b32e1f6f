using System.Reflection;
using DesignRules.Figures;

namespace DesignRules.Rules.Tests;

/// <summary>The figures layer names every analysis it shares (house rule of DEVELOPERS.md: one named member per analysis).</summary>
public sealed class FiguresLayerConventionTests
{
    [Fact]
    public void The_design_analyses_share_nothing_under_a_string_key()
    {
        // A member that takes a key and a way to compute would let a rule share an anonymous analysis again.
        var keyed = typeof(DesignAnalyses)
            .GetMethods(BindingFlags.Instance | BindingFlags.Static | BindingFlags.Public | BindingFlags.NonPublic | BindingFlags.DeclaredOnly)
            .Where(m => m.GetParameters().Any(p => p.ParameterType == typeof(string)) &&
                        m.GetParameters().Any(p => p.ParameterType.IsGenericType && p.ParameterType.Name.StartsWith("Func", StringComparison.Ordinal)))
            .Select(m => m.Name);
        Assert.Empty(keyed);
    }

    [Fact]
    public void No_rule_computes_a_filter_or_a_power_figure_outside_the_figures_layer()
    {
        var rules = typeof(DesignRules.Rules.DesignCheck).Assembly.GetTypes()
            .Where(t => t.Namespace?.StartsWith("DesignRules.Rules", StringComparison.Ordinal) == true)
            .Select(t => t.Name);
        Assert.DoesNotContain("FilterFigures", rules);
        Assert.DoesNotContain("FilterTolerance", rules);
        Assert.DoesNotContain("TransientRuns", rules);
    }
}
