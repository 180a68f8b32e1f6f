using System.Collections.Concurrent;
using System.Globalization;
using DesignRules.Diagnostics;
using SourceSpan = Scriban.Parsing.SourceSpan;
using Scriban;
using Scriban.Parsing;
using Scriban.Runtime;
using Scriban.Syntax;

namespace DesignRules.Pages;

/// <summary>
/// The page templates: the built-in ones shipped in the assembly, each replaced by a file of the same name in the
/// repository's template folder when there is one. Parse errors become located diagnostics (DR930).
/// </summary>
internal sealed class TemplateSet : ITemplateLoader
{
    /// <summary>The templates a run uses; "stage" is included by "design".</summary>
    public static readonly string[] Names = ["index", "design", "stage"];

    private readonly Dictionary<string, (Template Template, string Path, string Text)> templates = new(StringComparer.Ordinal);

    private TemplateSet()
    {
    }

    public static TemplateSet Load(string? overrideFolder, List<Diagnostic> diagnostics)
    {
        var set = new TemplateSet();
        foreach (var name in Names)
        {
            var file = $"{name}.md.sbn";
            var overridePath = overrideFolder is null ? null : Path.Combine(overrideFolder, file);
            string text;
            string path;
            if (overridePath is not null && File.Exists(overridePath))
            {
                text = File.ReadAllText(overridePath);
                path = overridePath;
            }
            else
            {
                text = Builtin(file);
                path = $"templates/{file}";
            }

            var template = Parsed(text, path);
            if (template.HasErrors)
            {
                foreach (var message in template.Messages.Where(m => m.Type == ParserMessageType.Error))
                {
                    diagnostics.Add(Error(path, message.Span, message.Message));
                }

                continue;
            }

            set.templates[name] = (template, path, text);
        }

        return set;
    }

    /// <summary>How many parsed templates a process keeps (the built-in three and a few repositories' own).</summary>
    internal const int ParsedCapacity = 64;

    // Templates this process parsed, by their path and exact text (compared in full): a warm server renders pages on every
    // run from the same few templates, and parsing them was a share of every run. A parsed template is never changed by
    // rendering (each rendering has its own context; the designs of one run already share one), so text that is exactly
    // the same gets the template parsed from it then. A template with errors is parsed again, for its diagnostics.
    private static readonly ConcurrentDictionary<(string Path, string Text), Template> ParsedTemplates = new();

    private static Template Parsed(string text, string path)
    {
        if (ParsedTemplates.TryGetValue((path, text), out var known))
        {
            return known;
        }

        var template = Template.Parse(text, path);
        if (!template.HasErrors)
        {
            if (ParsedTemplates.Count >= ParsedCapacity)
            {
                ParsedTemplates.Clear();
            }

            ParsedTemplates[(path, text)] = template;
        }

        return template;
    }

    /// <summary>How many parsed templates are kept now (tests).</summary>
    internal static int ParsedCount => ParsedTemplates.Count;

    public bool IsComplete => templates.Count == Names.Length;

    public (Template Template, string Path, string Text) this[string name] => templates[name];

    public static Diagnostic Error(string path, SourceSpan span, string message)
    {
        var start = span.Start;
        var end = span.End;
        var located = new DesignRules.Diagnostics.SourceSpan(path, Math.Max(1, start.Line + 1), Math.Max(1, start.Column + 1),
            Math.Max(1, end.Line + 1), Math.Max(1, end.Column + 2));
        return RuleCatalogue.Default[RuleIds.TemplateError].At(located, path, message.TrimEnd('.'));
    }

    string ITemplateLoader.GetPath(TemplateContext context, SourceSpan callerSpan, string templateName) =>
        templates.TryGetValue(templateName, out var t) ? t.Path : throw new ScriptRuntimeException(callerSpan,
            string.Create(CultureInfo.InvariantCulture, $"no template named '{templateName}' (templates: {string.Join(", ", Names)})"));

    string ITemplateLoader.Load(TemplateContext context, SourceSpan callerSpan, string templatePath) =>
        templates.Values.First(t => t.Path == templatePath).Text;

    ValueTask<string?> ITemplateLoader.LoadAsync(TemplateContext context, SourceSpan callerSpan, string templatePath) =>
        ValueTask.FromResult<string?>(((ITemplateLoader)this).Load(context, callerSpan, templatePath));

    private static string Builtin(string file)
    {
        using var stream = typeof(TemplateSet).Assembly.GetManifestResourceStream($"DesignRules.Templates.{file}")
            ?? throw new InvalidOperationException($"The built-in template {file} is missing from the assembly.");
        using var reader = new StreamReader(stream);
        return reader.ReadToEnd();
    }
}
