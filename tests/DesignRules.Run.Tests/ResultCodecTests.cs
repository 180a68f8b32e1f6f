using System.Collections;
using System.Reflection;
using DesignRules.Diagnostics;
using DesignRules.Loading;
using DesignRules.Rules;

namespace DesignRules.Run.Tests;

/// <summary>
/// The results cache replays a design from its entry instead of checking it again, so the entry must give back every
/// member of the result the reports and pages read: a member the codec drops renders a different page from the cache
/// than from a fresh check. The sample result is built by reflection with a distinct value in every member of every
/// plot, figure, finding, fix hint, yield and verdict, so a member added later is covered without touching this test.
/// </summary>
public sealed class ResultCodecTests
{
    [Fact]
    public void Every_member_of_a_result_with_every_member_set_survives_the_codec()
    {
        var design = AnyDesign();
        var values = new SampleValues();
        var original = new DesignResult(
            [values.Finding(), values.Finding()],
            new DesignSummary(design, values.Figures(), [new("stage-a", values.Figures()), new("stage-b", values.Figures())])
            {
                Plots = [values.Make<StagePlots>(), values.Make<StagePlots>()],
                Yields = [values.Make<YieldEstimate>()],
                Requirements = [values.Make<RequirementVerdict>()],
            });
        AssertEveryMemberSet(original, "result");

        var replayed = ResultCodec.Decode(ResultCodec.Encode(original), design);

        AssertSame(original, replayed, "result");
    }

    [Fact]
    public void The_loop_gain_and_step_plots_are_among_the_members_that_survive()
    {
        // Named here so that the stability plots cannot silently fall out of the sample above.
        var values = new SampleValues();
        var plots = values.Make<StagePlots>();
        Assert.NotEmpty(plots.LoopGains);
        Assert.NotNull(plots.Step);
        var design = AnyDesign();
        var original = new DesignResult([], new DesignSummary(design, [], []) { Plots = [plots] });

        var replayed = ResultCodec.Decode(ResultCodec.Encode(original), design).Summary.Plots.Single();

        AssertSame(plots.LoopGains, replayed.LoopGains, "loop gains");
        AssertSame(plots.Step, replayed.Step, "step");
    }

    [Fact]
    public void The_result_of_a_real_check_of_a_design_with_loop_gain_plots_survives_the_codec()
    {
        var file = Path.Combine(ExampleCopy.RepositoryRoot, "example-design", "designs", "door-impact-peak-hold.yaml");
        var report = DesignCheck.Run([file], new CheckOptions(null, new DateOnly(2026, 12, 1)));
        var summary = report.Designs.Single();
        Assert.Contains(summary.Plots, p => p.LoopGains.Count > 0);
        var original = new DesignResult(report.Findings.Where(f => f.DesignId == summary.Design.Id.Value).ToList(), summary);

        var replayed = ResultCodec.Decode(ResultCodec.Encode(original), summary.Design);

        AssertSame(original, replayed, "result");
    }

    private static DesignRules.Model.Design AnyDesign()
    {
        var file = Path.Combine(ExampleCopy.RepositoryRoot, "example-design", "designs", "door-impact-peak-hold.yaml");
        return DesignLoader.LoadFiles([file]).Designs.Single();
    }

    /// <summary>Fails on any null reference or empty list in the sample: the sample must exercise every member.</summary>
    private static void AssertEveryMemberSet(object? value, string path)
    {
        Assert.True(value is not null, $"{path} is not set in the sample");
        var type = value.GetType();
        if (IsLeaf(type) || value is DesignRules.Model.Design)
        {
            return;
        }

        if (value is IEnumerable items)
        {
            var list = items.Cast<object?>().ToList();
            bool nestedAlternatives = path.EndsWith(".Alternatives", StringComparison.Ordinal) && path.Contains(".Alternatives[", StringComparison.Ordinal);
            Assert.True(list.Count > 0 || nestedAlternatives, $"{path} is empty in the sample");
            for (int i = 0; i < list.Count; i++)
            {
                AssertEveryMemberSet(list[i], $"{path}[{i}]");
            }

            return;
        }

        foreach (var property in Members(type))
        {
            AssertEveryMemberSet(property.GetValue(value), $"{path}.{property.Name}");
        }
    }

    /// <summary>Structural equality over every public member, doubles bit for bit (a cached figure is the figure).</summary>
    private static void AssertSame(object? expected, object? actual, string path)
    {
        if (expected is null || actual is null)
        {
            Assert.True(expected is null && actual is null, $"{path}: expected {expected ?? "null"}, got {actual ?? "null"}");
            return;
        }

        var type = expected.GetType();
        if (expected is DesignRules.Model.Design)
        {
            Assert.Same(expected, actual);
            return;
        }

        if (IsLeaf(type))
        {
            Assert.True(expected.Equals(actual), $"{path}: expected {expected}, got {actual}");
            return;
        }

        if (expected is IEnumerable items)
        {
            var left = items.Cast<object?>().ToList();
            var right = ((IEnumerable)actual).Cast<object?>().ToList();
            Assert.True(left.Count == right.Count, $"{path}: expected {left.Count} items, got {right.Count}");
            for (int i = 0; i < left.Count; i++)
            {
                AssertSame(left[i], right[i], $"{path}[{i}]");
            }

            return;
        }

        Assert.Equal(type, actual.GetType());
        foreach (var property in Members(type))
        {
            AssertSame(property.GetValue(expected), property.GetValue(actual), $"{path}.{property.Name}");
        }
    }

    private static bool IsLeaf(Type type) =>
        type.IsPrimitive || type.IsEnum || type == typeof(string) || type == typeof(decimal) || type == typeof(FigureKind);

    /// <summary>
    /// The stored members: public auto-properties. A computed member (a fix hint's <c>All</c>, which starts with the hint
    /// itself) derives from them and would lead the walk in a circle.
    /// </summary>
    private static IEnumerable<PropertyInfo> Members(Type type) =>
        type.GetProperties(BindingFlags.Public | BindingFlags.Instance).Where(p => p.GetIndexParameters().Length == 0 && p.Name != "EqualityContract"
            && p.DeclaringType!.GetField($"<{p.Name}>k__BackingField", BindingFlags.NonPublic | BindingFlags.Instance) is not null);

    /// <summary>Distinct values for every member: numbers that need all 17 digits, strings that differ, the last enum member.</summary>
    private sealed class SampleValues
    {
        private int next;

        public T Make<T>() => (T)Make(typeof(T));

        public List<Figure> Figures() =>
            FigureKinds.All.Select(kind => new Figure(new FigureKey(kind, Text()), Number()) { Limit = Number(), Margin = Number(), Temperature = Number() }).ToList();

        public Finding Finding() =>
            new(RuleIds.CapacitiveLoad.Value, Text(), Severity.Warning, Text(), Span(), Text(), Text(), Text(), Text(), Figures())
            {
                Fix = Fix() with { Alternatives = [Fix(), Fix()] },
            };

        /// <summary>A fix hint with every member set but its alternatives, which do not nest (<c>FixHint.Or</c> flattens them).</summary>
        private FixHint Fix() =>
            new(Enum.GetValues<FixKind>()[^1], Text(), Number(), Text(), Text())
            {
                ValueSpan = Span(),
                Replacement = Text(),
                BeyondPartClasses = true,
            };

        private SourceSpan Span() => new(Text(), ++next, ++next, ++next, ++next);

        private double Number() => Math.PI * ++next / 7;

        private string Text() => $"value-{++next}";

        private object Make(Type type)
        {
            var underlying = Nullable.GetUnderlyingType(type) ?? type;
            if (underlying == typeof(double)) return Number();
            if (underlying == typeof(int)) return ++next;
            if (underlying == typeof(long)) return (long)++next;
            if (underlying == typeof(bool)) return true;
            if (underlying == typeof(string)) return Text();
            if (underlying.IsEnum) return Enum.GetValues(underlying).GetValue(Enum.GetValues(underlying).Length - 1)!;
            if (underlying.IsGenericType && underlying.GetGenericTypeDefinition() == typeof(IReadOnlyList<>))
            {
                var element = underlying.GetGenericArguments()[0];
                var list = (IList)Activator.CreateInstance(typeof(List<>).MakeGenericType(element))!;
                list.Add(Make(element));
                list.Add(Make(element));
                return list;
            }

            // A record: its widest constructor, then every settable member the constructor left alone.
            var constructor = underlying.GetConstructors().OrderByDescending(c => c.GetParameters().Length).First();
            var made = constructor.Invoke(constructor.GetParameters().Select(p => Make(p.ParameterType)).ToArray());
            var set = constructor.GetParameters().Select(p => p.Name).ToHashSet(StringComparer.OrdinalIgnoreCase);
            foreach (var property in Members(underlying).Where(p => p.SetMethod is { IsPublic: true } && !set.Contains(p.Name)))
            {
                property.SetValue(made, Make(property.PropertyType));
            }

            return made;
        }
    }
}
