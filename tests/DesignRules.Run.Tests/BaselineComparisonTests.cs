using System.Text.Json;
using DesignRules.Diagnostics;
using DesignRules.Reports.Comparison;

namespace DesignRules.Run.Tests;

/// <summary>
/// A pull request reviewed by its figures: a base and a head run of one design, compared (new, resolved, unchanged and
/// changed findings, margins that shrank), SARIF's baselineState, and the new-only gate.
/// </summary>
public sealed class BaselineComparisonTests : IDisposable
{
    private const string Today = "2026-12-01";

    private readonly string root = Path.Combine(Path.GetTempPath(), $"designrules-compare-{Guid.NewGuid():N}");

    public BaselineComparisonTests() => Directory.CreateDirectory(root);

    public void Dispose() => Directory.Delete(root, recursive: true);

    private string DesignFile => Path.Combine(root, "designs", "line-driver.yaml");

    /// <summary>
    /// An inverting stage on an E24 repository, gain −rf/rin. Base: rin 10k (an E24 value), rf 21k (not one: 20k and 22k
    /// are, IEC 60063 E24 table), so DR701 fires on rf. Head: rin 10.5k (not E24: it is an E96 value) and rf 33k (E24): DR701
    /// on rf is resolved, DR701 on rin is new, and the gain rises from 2.1 to 3.14, so the output swing margin shrinks.
    /// </summary>
    private static string Design(string rin, string rf, string preamble = "") => $"""
        design:
          id: line-driver
          title: Test line driver
        {preamble}e-series: E24
        supplies:
          positive: 15 V
          negative: -15 V
        source:
          waveform: sine
          amplitude: 1 V
          frequency: 10 kHz
        load:
          resistance: 10k
        stages:
          - id: gain
            block: inverting
            amplifier: jfet-input-15v
            resistors: thin-film-1pct
            values:
              rin: {rin}
              rf: {rf}
        """.Replace("\r\n", "\n", StringComparison.Ordinal) + "\n";

    private static readonly string Base = Design("10k", "21k");

    private static readonly string Head = Design("10.5k", "33k");

    private RunOutcome Check(string design, string json, string? baseline = null, bool newOnly = false, bool warningsAsErrors = false, string? sarif = null)
    {
        Directory.CreateDirectory(Path.GetDirectoryName(DesignFile)!);
        File.WriteAllText(DesignFile, design);
        var parse = RunRequest.FromCommandLine(new CommandLineInputs([root])
        {
            Root = root,
            Today = Today,
            Json = Path.Combine(root, json),
            Sarif = sarif is null ? null : Path.Combine(root, sarif),
            Baseline = baseline is null ? null : Path.Combine(root, baseline),
            NewOnly = newOnly,
            WarningsAsErrors = warningsAsErrors,
        });
        Assert.True(parse.Request is not null, string.Join("\n", parse.Problems));
        var outcome = DesignRun.Execute(parse.Request);
        Assert.True(outcome.Fault is null, outcome.FaultDetail);
        return outcome;
    }

    private RunComparison Compare(string baseJson, string headJson) =>
        RunComparison.Compare(ReportSnapshot.Read(Path.Combine(root, baseJson)).Snapshot!, ReportSnapshot.Read(Path.Combine(root, headJson)).Snapshot!);

    [Fact]
    public void A_change_that_makes_one_finding_new_resolves_another_and_shrinks_a_margin_is_summarised_as_the_golden_file_says()
    {
        Check(Base, "base.json");
        Check(Head, "head.json");
        var comparison = Compare("base.json", "head.json");

        var added = Assert.Single(comparison.Of(FindingChange.New));
        Assert.Equal(("DR701", "stages[gain].values.rin"), (added.Head!.RuleId, added.Head.Node));
        var resolved = Assert.Single(comparison.Of(FindingChange.Resolved));
        Assert.Equal(("DR701", "stages[gain].values.rf"), (resolved.Base!.RuleId, resolved.Base.Node));

        // The output peak rises from 2.1 V to 3.14 V (inverting gain −rf/rin, any analog textbook), so the swing margin
        // shrinks by about their difference, 1.04 V; the loaded headroom moves a little with the output current.
        var swing = comparison.Shrunk.Single(m => m.Current.Key == "swing.margin@u1");
        Assert.Equal(1.0 * (33.0 / 10.5 - 21.0 / 10.0), swing.Base!.Value - swing.Head!.Value, 0.05);
        Assert.True(swing.MarginShrink > 0);

        // The summary, asserted whole. After an intended change to the wording or the figures, review the new text and
        // copy it over Golden/compare-summary.md.
        var summary = ReviewSummary.Write(comparison);
        var golden = File.ReadAllText(Path.Combine(AppContext.BaseDirectory, "Golden", "compare-summary.md")).Replace("\r\n", "\n", StringComparison.Ordinal);
        Assert.Equal(golden, summary);

        // Same reports, same bytes: the second head run and comparison write the same summary.
        Check(Head, "head-again.json");
        Assert.Equal(File.ReadAllBytes(Path.Combine(root, "head.json")), File.ReadAllBytes(Path.Combine(root, "head-again.json")));
        Assert.Equal(summary, ReviewSummary.Write(Compare("base.json", "head-again.json")));
    }

    [Fact]
    public void A_finding_keeps_its_identity_when_unrelated_lines_are_added_above_it_and_a_changed_message_is_changed_not_new()
    {
        Check(Base, "base.json");
        Check(Design("10k", "21k", preamble: "  summary: Drives the line.\n# a comment line\n"), "moved.json");
        var moved = Compare("base.json", "moved.json");
        var same = Assert.Single(moved.Findings);
        Assert.Equal(FindingChange.Unchanged, same.Change);
        Assert.NotEqual(same.Base!.Line, same.Head!.Line);

        // rf 21k -> 21.5k: still not an E24 value, with another value in the message: the same finding, changed.
        Check(Design("10k", "21.5k"), "changed.json");
        var changed = Assert.Single(Compare("base.json", "changed.json").Findings);
        Assert.Equal(FindingChange.Changed, changed.Change);
    }

    [Fact]
    public void Sarif_carries_a_baseline_state_on_every_result_against_the_baseline()
    {
        Check(Base, "base.json");
        var outcome = Check(Design("10.5k", "21k"), "head.json", baseline: "base.json", sarif: "head.sarif");
        using var sarif = JsonDocument.Parse(File.ReadAllBytes(Path.Combine(root, "head.sarif")));
        var results = sarif.RootElement.GetProperty("runs")[0].GetProperty("results").EnumerateArray().ToList();
        Assert.Equal(2, results.Count);
        var states = results.Select(r => (r.GetProperty("message").GetProperty("text").GetString()!.Contains("gain.rf", StringComparison.Ordinal),
            r.GetProperty("baselineState").GetString())).OrderBy(s => s.Item1).ToList();
        Assert.Equal([(false, "new"), (true, "unchanged")], states);
        Assert.Equal("against the baseline: 1 new, 0 changed, 1 unchanged, 0 resolved finding(s).", outcome.BaselineLine);

        // Without a baseline no result claims a state.
        Check(Base, "plain.json", sarif: "plain.sarif");
        Assert.DoesNotContain("baselineState", File.ReadAllText(Path.Combine(root, "plain.sarif")), StringComparison.Ordinal);
    }

    [Fact]
    public void The_new_only_gate_fails_only_on_findings_new_against_the_baseline_and_waivers_keep_working()
    {
        Check(Base, "base.json");

        // Warnings as errors: the old DR701 on rf and the new one on rin are both errors without the gate ...
        var head = Design("10.5k", "21k");
        Assert.Equal(2, Check(head, "head.json", warningsAsErrors: true).ErrorCount);

        // ... with it, only the new one fails; the old one is a note that says why.
        var gated = Check(head, "head.json", baseline: "base.json", newOnly: true, warningsAsErrors: true);
        Assert.Equal(1, gated.ErrorCount);
        var old = gated.Shown.Findings.Single(f => f.Message.Contains("gain.rf", StringComparison.Ordinal));
        Assert.Equal(Severity.Note, old.Severity);
        Assert.EndsWith(NewOnlyGate.InBaselineNote, old.Message, StringComparison.Ordinal);
        Assert.Contains("New-only gate: 1 finding(s) also in the baseline", gated.BaselineLine, StringComparison.Ordinal);

        // The unchanged base itself passes the gate; a waiver still covers a new finding.
        Assert.Equal(0, Check(Base, "again.json", baseline: "base.json", newOnly: true, warningsAsErrors: true).ErrorCount);
        var waived = head + "waivers:\n  - rule: DR701\n    stage: gain\n    reason: Values chosen from the stock on hand.\n";
        var withWaiver = Check(waived, "waived.json", baseline: "base.json", newOnly: true, warningsAsErrors: true);
        Assert.Equal(0, withWaiver.ErrorCount);
        Assert.All(withWaiver.Shown.Findings.Where(f => f.RuleId == "DR701"), f => Assert.True(f.IsWaived));
    }

    [Fact]
    public void A_missing_foreign_or_older_baseline_and_a_gate_without_one_are_plain_problems_naming_the_option_and_the_file()
    {
        Check(Base, "base.json", sarif: "base.sarif");
        var older = File.ReadAllText(Path.Combine(root, "base.json")).Replace("\"formatVersion\": 2", "\"formatVersion\": 1", StringComparison.Ordinal);
        File.WriteAllText(Path.Combine(root, "older.json"), older);
        File.WriteAllText(Path.Combine(root, "broken.json"), "{ \"format\": ");

        string Problem(string? baseline, bool newOnly = false, bool build = false)
        {
            var parse = build
                ? RunRequest.FromBuild(new BuildInputs([DesignFile]) { RepositoryRoot = root, BaselineFile = baseline is null ? null : Path.Combine(root, baseline), NewOnly = newOnly })
                : RunRequest.FromCommandLine(new CommandLineInputs([root]) { Baseline = baseline is null ? null : Path.Combine(root, baseline), NewOnly = newOnly });
            Assert.Null(parse.Request);
            return build ? Assert.Single(parse.Problems).ForBuild : Assert.Single(parse.Problems).ToString();
        }

        Assert.Matches(@"^--baseline: error: .*missing\.json: no such report file", Problem("missing.json"));
        Assert.Matches(@"^--baseline: error: .*base\.sarif: is not a DesignRules JSON report", Problem("base.sarif"));
        Assert.Matches(@"^--baseline: error: .*older\.json: is report format 1, older than format 2", Problem("older.json"));
        Assert.Matches(@"^--baseline: error: .*broken\.json: is not JSON", Problem("broken.json"));
        Assert.StartsWith("--new-only: error: the new-only gate needs a baseline report", Problem(null, newOnly: true), StringComparison.Ordinal);
        Assert.Matches(@"^DesignRulesBaseline: .*older\.json: is report format 1", Problem("older.json", build: true));
        Assert.StartsWith("DesignRulesNewOnly: the new-only gate needs a baseline report", Problem(null, newOnly: true, build: true), StringComparison.Ordinal);
    }

    [Fact]
    public void The_summary_caps_each_table_and_says_how_many_more_there_are()
    {
        var findings = Enumerable.Range(1, 13).Select(i => new SnapshotFinding("DR701", "warning", $"Resistor r{i}.", "designs/x.yaml", i, "x", "s", $"stages[s].values.r{i}", false, [])
        {
            Identity = $"DR701|x|s|r{i}",
        }).ToList();
        var comparison = RunComparison.Compare(new ReportSnapshot("1", [], []), new ReportSnapshot("1", findings, []));
        var summary = ReviewSummary.Write(comparison, maxRows: 10);
        Assert.Contains("| Resistor r10. |", summary, StringComparison.Ordinal);
        Assert.DoesNotContain("Resistor r11.", summary, StringComparison.Ordinal);
        Assert.Contains("… and 3 more.", summary, StringComparison.Ordinal);
    }
}
