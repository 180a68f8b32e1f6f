using Markdig;
using Markdig.Extensions.Tables;
using Markdig.Syntax;
using Markdig.Syntax.Inlines;
using DesignRules.Loading;
using DesignRules.Rules;

namespace DesignRules.Pages.Tests;

/// <summary>
/// User text (title, summary, waiver reason, part description, stage ids in diagrams) reaches a page only as text:
/// never HTML, a link, emphasis, a heading, an extra table cell or an invisible control character. Checked by parsing
/// the page with Markdig (CommonMark with GitHub's pipe tables) and looking at what it became.
/// </summary>
public sealed class EscapingTests : IDisposable
{
    private const string HostileTitle = "<script>alert(1)</script> **bold** [link](https://example.invalid) | cell \u0007 \u202Eevil";
    private const string HostileSummary = "# Not a heading\n> not a quote <img src=x onerror=alert(1)> _em_ `tick";
    private const string HostileReason = "Accepted <b>loud</b> ![img](x.png) ~~gone~~ $x$ & &amp; \\*";
    private const string HostileDescription = "Part | with | pipes <i>i</i>";
    private readonly string root = Path.Combine(Path.GetTempPath(), "designrules-escape-" + Guid.NewGuid().ToString("N"));

    public void Dispose() => Directory.Delete(root, recursive: true);

    private (string Design, string Index) Render()
    {
        Directory.CreateDirectory(Path.Combine(root, "designs"));
        Directory.CreateDirectory(Path.Combine(root, "parts"));
        File.WriteAllText(Path.Combine(root, "parts", "p.yaml"), $$"""
            library:
              id: odd-parts
            resistors:
              - id: odd-film
                description: "{{HostileDescription}}"
                tolerance: 1%
                tempco: 50 ppm/°C
                power: 125 mW
            """);
        File.WriteAllText(Path.Combine(root, "designs", "d.yaml"), $$"""
            design:
              id: hostile
              title: "{{Yaml(HostileTitle)}}"
              summary: "{{Yaml(HostileSummary)}}"
            libraries: [../parts/p.yaml]
            e-series: E24
            supplies: { positive: 15 V, negative: -15 V }
            source: { waveform: sine, amplitude: 100 mV, frequency: 1 kHz }
            load: { resistance: 10k }
            stages:
              - id: gain
                block: inverting
                amplifier: jfet-input-15v
                resistors: odd-film
                values: { rin: 10k, rf: 49.9k }
            waivers:
              - rule: DR701
                stage: gain
                reason: "{{Yaml(HostileReason)}}"
            """);
        var files = RepositoryFiles.Find([root], out _);
        var report = DesignCheck.Run(files, new CheckOptions(null, new DateOnly(2026, 12, 1)));
        Assert.Contains(report.Findings, f => f.RuleId == "DR701" && f.IsWaived);
        var folder = Path.Combine(root, "pages");
        var result = DatasheetPages.Write(report, new PageOptions(folder, null, root));
        Assert.Empty(result.Diagnostics);
        return (File.ReadAllText(Path.Combine(folder, "hostile.md")), File.ReadAllText(Path.Combine(folder, "index.md")));
    }

    private static string Yaml(string text) => text.Replace("\\", "\\\\", StringComparison.Ordinal).Replace("\"", "\\\"", StringComparison.Ordinal)
        .Replace("\n", "\\n", StringComparison.Ordinal).Replace("\u0007", "\\a", StringComparison.Ordinal).Replace("\u202E", "\\u202E", StringComparison.Ordinal);

    private static readonly MarkdownPipeline Pipeline = new MarkdownPipelineBuilder().UsePipeTables().UseEmphasisExtras().Build();

    [Fact]
    public void User_text_becomes_neither_html_nor_links_nor_emphasis_nor_headings()
    {
        var (design, index) = Render();
        foreach (var page in new[] { design, index })
        {
            var document = Markdown.Parse(page, Pipeline);
            Assert.Empty(document.Descendants<HtmlBlock>());
            Assert.Empty(document.Descendants<HtmlInline>());
            Assert.DoesNotContain(document.Descendants<LinkInline>(), l => l.Url is { } url && url.Contains("example.invalid", StringComparison.Ordinal));
            Assert.DoesNotContain(document.Descendants<LinkInline>(), l => l.IsImage && l.Url == "x.png");
            Assert.DoesNotContain(document.Descendants<EmphasisInline>(), e => Text(e).Contains("bold", StringComparison.Ordinal) || Text(e) is "em" or "gone");
            Assert.DoesNotContain(document.Descendants<HeadingBlock>(), h => Text(h).Contains("Not a heading", StringComparison.Ordinal));
            Assert.DoesNotContain(document.Descendants<QuoteBlock>(), q => Text(q).Contains("not a quote", StringComparison.Ordinal));
        }

        // The text itself survives, readable.
        var html = Markdown.ToHtml(design, Pipeline);
        Assert.Contains("&lt;script&gt;alert(1)&lt;/script&gt; **bold**", html, StringComparison.Ordinal);
        Assert.Contains("Accepted &lt;b&gt;loud&lt;/b&gt; ![img](x.png) ~~gone~~ $x$ &amp; &amp;amp; \\*", html, StringComparison.Ordinal);
    }

    [Fact]
    public void Pipes_stay_inside_their_table_cell_and_controls_are_shown_not_hidden()
    {
        var (design, index) = Render();
        var table = Markdown.Parse(index, Pipeline).Descendants<Table>().Single();
        Assert.All(table.OfType<TableRow>(), row => Assert.Equal(6, row.Count));
        var values = Markdown.Parse(design, Pipeline).Descendants<Table>().First(t => Text(t).Contains("Component", StringComparison.Ordinal));
        Assert.All(values.OfType<TableRow>(), row => Assert.Equal(4, row.Count));
        foreach (var page in new[] { design, index })
        {
            Assert.DoesNotContain(page, c => c is '\u0007' or '\u202E');
        }

        Assert.Contains("U+0007", index, StringComparison.Ordinal);
        Assert.Contains("U+202E", index, StringComparison.Ordinal);
    }

    private static string Text(MarkdownObject node) => string.Concat(node.Descendants<LiteralInline>().Select(l => l.Content.ToString()));
}
