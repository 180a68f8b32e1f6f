using System.Globalization;
using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Quantities;
using DesignRules.Yaml;

namespace DesignRules.Loading;

/// <summary>
/// Reads the optional rule-set file (sections <c>rule-set:</c>, <c>rules:</c>, <c>designs:</c>, each optional): Monte Carlo settings and, per rule id, a level
/// (<c>off</c>, <c>note</c>, <c>warning</c>, <c>error</c>) and threshold values, for every design, one design, or one stage.
/// </summary>
public static class RuleSetLoader
{
    /// <summary>The file name looked for at a repository root.</summary>
    public const string DefaultFileName = "design-rules.yaml";

    private static readonly Dictionary<string, RuleLevel> Levels = new(StringComparer.Ordinal)
    {
        ["off"] = RuleLevel.Off, ["note"] = RuleLevel.Note, ["warning"] = RuleLevel.Warning, ["error"] = RuleLevel.Error,
    };

    private static readonly Dictionary<string, ToleranceDistribution> Distributions = new(StringComparer.Ordinal)
    {
        ["normal"] = ToleranceDistribution.Normal, ["uniform"] = ToleranceDistribution.Uniform,
    };

    /// <summary>Reads a rule-set file; problems come back as diagnostics and the defaults stand in for what is wrong.</summary>
    public static (RuleSet RuleSet, IReadOnlyList<Diagnostic> Diagnostics) Load(string file, LoaderLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(file);
        string? text;
        try
        {
            text = SourceFile.Read(file, limits ?? LoaderLimits.Default);
        }
        catch (RefusedFileException refused)
        {
            return (RuleSet.Default, [refused.ToDiagnostic(SourceSpan.WholeFile(file))]);
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            return (RuleSet.Default, [DesignFileDiagnostics.NotADesignFile.At(SourceSpan.WholeFile(file), $"The rule-set file '{file}' cannot be read ({ex.Message.TrimEnd('.')})")]);
        }

        if (text is null)
        {
            return (RuleSet.Default, [DesignFileDiagnostics.NotADesignFile.At(SourceSpan.WholeFile(file), $"The rule-set file '{file}' does not exist")]);
        }

        return Read(file, text, limits);
    }

    /// <summary>Reads rule-set text given as a string.</summary>
    public static (RuleSet RuleSet, IReadOnlyList<Diagnostic> Diagnostics) Read(string file, string text, LoaderLimits? limits = null)
    {
        ArgumentNullException.ThrowIfNull(file);
        ArgumentNullException.ThrowIfNull(text);
        var diagnostics = new List<Diagnostic>();
        var tree = YamlTreeReader.Read(file, text, limits ?? LoaderLimits.Default, diagnostics);
        if (tree is null)
        {
            return (RuleSet.Default with { File = file }, diagnostics);
        }

        var root = MappingReader.Of(tree, "the rule-set file", diagnostics);
        if (root is null)
        {
            return (RuleSet.Default with { File = file }, diagnostics);
        }

        // Every section is optional: a file with only `rules:` (or only `designs:`) is a whole rule-set file.
        var header = root.Child("rule-set", "the rule-set header", required: false, "monte-carlo settings (may be empty)");
        var monteCarlo = MonteCarloSettings.Default;
        var mc = header?.Child("monte-carlo", "the Monte Carlo settings", required: false, string.Empty);
        if (mc is not null)
        {
            var samples = mc.Quantity("samples", Dimension.Ratio, required: false,
                q => q.Value is >= 10 and <= MonteCarloSettings.SampleLimit && q.Value == Math.Floor(q.Value) ? null : MonteCarloSettings.SamplesRange);
            var seed = mc.Quantity("seed", Dimension.Ratio, required: false,
                q => q.Value is >= 0 and <= int.MaxValue && q.Value == Math.Floor(q.Value) ? null : "a whole number from 0 to 2147483647");
            var distribution = mc.Choice("distribution", Distributions, required: false);
            var sequential = mc.Flag("sequential");
            var maxSamples = mc.Quantity("max-samples", Dimension.Ratio, required: false,
                q => q.Value is >= 10 and <= MonteCarloSettings.SampleLimit && q.Value == Math.Floor(q.Value) ? null : MonteCarloSettings.SamplesRange);
            mc.Finish();
            monteCarlo = new MonteCarloSettings(
                samples is null ? monteCarlo.Samples : (int)samples.Value.Value,
                seed is null ? monteCarlo.Seed : (int)seed.Value.Value,
                distribution?.Value ?? monteCarlo.Distribution)
            {
                Sequential = sequential?.Value ?? false,
                MaxSamples = maxSamples is null ? MonteCarloSettings.DefaultMaxSamples : (int)maxSamples.Value.Value,
            };
            if (maxSamples is not null && monteCarlo.MaxSamples < monteCarlo.Samples)
            {
                diagnostics.Add(DesignFileDiagnostics.OutOfRange.At(maxSamples.Span, maxSamples.Value.Format(), "max-samples",
                    $"the cap must be at least the batch size 'samples' ({monteCarlo.Samples.ToString(CultureInfo.InvariantCulture)})"));
                monteCarlo = monteCarlo with { MaxSamples = monteCarlo.Samples };
            }
        }

        header?.Finish();
        var rules = ReadRules(root.Child("rules", "the rule changes", required: false, string.Empty), diagnostics);
        var designs = new Dictionary<string, DesignRuleOverrides>(StringComparer.Ordinal);
        var designMap = root.Child("designs", "the per-design changes", required: false, string.Empty);
        foreach (var (key, node) in designMap?.Entries ?? [])
        {
            designMap!.Know(key.Value);
            var design = MappingReader.Of(node, $"the changes for design '{key.Value}'", diagnostics);
            if (design is null)
            {
                continue;
            }

            var designRules = ReadRules(design.Child("rules", $"the rule changes for design '{key.Value}'", false, string.Empty), diagnostics);
            var stages = new Dictionary<string, IReadOnlyDictionary<string, RuleOverride>>(StringComparer.Ordinal);
            var stageMap = design.Child("stages", $"the stage changes for design '{key.Value}'", false, string.Empty);
            foreach (var (stageKey, stageNode) in stageMap?.Entries ?? [])
            {
                stageMap!.Know(stageKey.Value);
                stages[stageKey.Value] = ReadRules(MappingReader.Of(stageNode, $"the rule changes for stage '{stageKey.Value}'", diagnostics), diagnostics);
            }

            stageMap?.Finish();
            design.Finish();
            designs[key.Value] = new DesignRuleOverrides(new Located<string>(key.Value, key.Span), designRules, stages);
        }

        designMap?.Finish();
        root.Finish();
        return (new RuleSet(file, monteCarlo, rules, designs), diagnostics);
    }

    private static Dictionary<string, RuleOverride> ReadRules(MappingReader? map, List<Diagnostic> diagnostics)
    {
        var result = new Dictionary<string, RuleOverride>(StringComparer.Ordinal);
        if (map is null)
        {
            return result;
        }

        var catalogue = RuleCatalogue.Default;
        foreach (var (key, node) in map.Entries)
        {
            map.Know(key.Value);
            if (!catalogue.TryGet(key.Value, out var rule) || rule is null || rule.Category == "design-file")
            {
                var ids = catalogue.Rules.Where(r => r.Category != "design-file").Select(r => r.Id).ToList();
                diagnostics.Add(DesignFileDiagnostics.UnknownChoice.At(key.Span, key.Value, "a rule id",
                    SpellingSuggestion.Hint(key.Value, ids), "the ids of rules/catalogue.yaml from DR100 to DR899"));
                continue;
            }

            if (node is YamlScalar scalar)
            {
                // The short form names only the level: "DR702: off".
                var level = map.ReadChoice(scalar, key.Value, Levels);
                if (level is not null)
                {
                    result[key.Value] = new RuleOverride(level, new Dictionary<string, Located<Quantity>>(StringComparer.Ordinal));
                }

                continue;
            }

            var entry = MappingReader.Of(node, $"the changes to {key.Value}", diagnostics);
            if (entry is null)
            {
                continue;
            }

            var changedLevel = entry.Choice("severity", Levels, required: false);
            var thresholds = new Dictionary<string, Located<Quantity>>(StringComparer.Ordinal);
            foreach (var threshold in rule.Thresholds)
            {
                var value = entry.Quantity(threshold.Name, threshold.Default.Dimension, required: false);
                if (value is not null)
                {
                    thresholds[threshold.Name] = value;
                }
            }

            entry.Finish();
            result[key.Value] = new RuleOverride(changedLevel, thresholds);
        }

        return result;
    }

    /// <summary>Formats a level the way rule-set files write it.</summary>
    public static string Name(RuleLevel level) => level.ToString().ToLower(CultureInfo.InvariantCulture);
}
