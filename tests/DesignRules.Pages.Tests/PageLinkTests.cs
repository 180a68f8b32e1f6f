using System.Xml.Linq;
using Markdig;
using Markdig.Syntax;
using Markdig.Syntax.Inlines;

namespace DesignRules.Pages.Tests;

/// <summary>Every generated page parses as Markdown, every relative link and image exists, every plot is well-formed SVG.</summary>
public sealed class PageLinkTests
{
    private static readonly Lazy<(string Folder, PageResult Result)> Rendered = new(() => ExamplePages.Render());

    [Fact]
    public void The_example_designs_render_without_diagnostics()
    {
        var (folder, result) = Rendered.Value;
        Assert.Empty(result.Diagnostics);
        Assert.True(File.Exists(Path.Combine(folder, "index.md")));
        Assert.Equal(ExamplePages.Check().DesignCount, Directory.GetFiles(folder, "*.md").Length - 1);
    }

    [Fact]
    public void Every_relative_link_and_image_of_every_page_exists()
    {
        var (folder, _) = Rendered.Value;
        var pipeline = new MarkdownPipelineBuilder().UsePipeTables().Build();
        var followed = 0;
        // Every page, the copied help pages in rules/ included: each link resolves beside the page that holds it, so the
        // folder works wherever it is read (a wiki, a forge's file view) and never points into a package cache.
        foreach (var page in Directory.GetFiles(folder, "*.md", SearchOption.AllDirectories))
        {
            var document = Markdown.Parse(File.ReadAllText(page), pipeline);
            var links = document.Descendants<LinkInline>().Select(l => l.Url).OfType<string>().ToList();
            if (Path.GetDirectoryName(page) == folder)
            {
                Assert.NotEmpty(links);
            }

            foreach (var url in links)
            {
                Assert.False(url.Contains("://", StringComparison.Ordinal) || url.StartsWith('/'), $"{Path.GetFileName(page)} links outside the folder: {url}");
                var target = Path.Combine(Path.GetDirectoryName(page)!, Uri.UnescapeDataString(url.Split('#')[0]));
                Assert.True(File.Exists(target), $"{Path.GetFileName(page)} links to missing {url}");
                followed++;
            }
        }

        // The example carries a finding, so at least one help page was linked and copied.
        Assert.True(File.Exists(Path.Combine(folder, DatasheetPages.HelpFolder, "DR701.md")));
        Assert.True(followed > 10, $"only {followed} links followed");
    }

    [Fact]
    public void Every_plot_is_well_formed_svg_with_a_legend_and_axis_titles_with_units()
    {
        var (folder, _) = Rendered.Value;
        var plots = Directory.GetFiles(folder, "*.svg", SearchOption.AllDirectories);
        Assert.NotEmpty(plots);
        foreach (var plot in plots)
        {
            var svg = XDocument.Load(plot);
            var texts = svg.Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value).ToList();
            Assert.Contains(texts, t => t.Contains('(', StringComparison.Ordinal) && t.Contains(')', StringComparison.Ordinal));
            if (plot.EndsWith("-transient.svg", StringComparison.Ordinal))
            {
                Assert.Contains("Time (ms)", texts.Concat(["Time (µs)"]).Where(t => t.StartsWith("Time", StringComparison.Ordinal)).Select(t => t.Replace("µs", "ms", StringComparison.Ordinal)));
                Assert.Contains("Voltage (V)", texts);
                Assert.Contains(texts, t => t.EndsWith("(stage output)", StringComparison.Ordinal));
                Assert.Contains(texts, t => t.EndsWith("(input)", StringComparison.Ordinal));
            }
            else if (plot.EndsWith("-response.svg", StringComparison.Ordinal))
            {
                Assert.Contains("Frequency (Hz)", texts);
                Assert.Contains("Magnitude (dB)", texts);
                Assert.Contains("magnitude", texts);
            }
            else if (plot.Contains("-loop-", StringComparison.Ordinal))
            {
                Assert.Contains("Frequency (Hz)", texts);
                Assert.Contains("|T| (dB)", texts);
                Assert.Contains(texts, t => t.StartsWith("crossover ", StringComparison.Ordinal));
                Assert.Contains(texts, t => t.StartsWith("phase margin ", StringComparison.Ordinal));
            }
            else if (plot.EndsWith("-step.svg", StringComparison.Ordinal))
            {
                Assert.Contains("Voltage (V)", texts);
                Assert.Contains(texts, t => t.EndsWith("(stage output)", StringComparison.Ordinal));
            }
            else if (plot.EndsWith("-noise.svg", StringComparison.Ordinal))
            {
                Assert.Contains("Frequency (Hz)", texts);
                Assert.Contains("Noise density at the output (V/√Hz)", texts);
                Assert.Contains("total", texts);
            }
            else
            {
                Assert.Contains("Samples", texts);
            }
        }
    }

    [Fact]
    public void The_rectifier_transient_shows_the_amplifier_output_beside_the_stage_output()
    {
        var (folder, _) = Rendered.Value;
        var svg = XDocument.Load(Path.Combine(folder, "plots", "compressor-vibration-envelope", "rectifier-transient.svg"));
        var texts = svg.Descendants().Where(e => e.Name.LocalName == "text").Select(e => e.Value).ToList();
        Assert.Contains("rectifier.u1.out (amplifier output)", texts);
        Assert.Contains(texts, t => t.EndsWith("(stage output)", StringComparison.Ordinal));
        Assert.Contains(texts, t => t.Contains("swing limit", StringComparison.Ordinal));
    }
}
