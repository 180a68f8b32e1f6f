using Microsoft.Build.Framework;
using Microsoft.Build.Utilities;

namespace DesignRules.Build.Tests;

public sealed class CheckDesignsTaskTests : IDisposable
{
    private readonly string root = TestPaths.NewTempFolder("task");

    public void Dispose() => Directory.Delete(root, recursive: true);

    private (CheckDesigns Task, RecordingEngine Engine) Task(string designText, Action<CheckDesigns>? configure = null)
    {
        SampleRepository.Write(root, designText);
        var engine = new RecordingEngine();
        var task = new CheckDesigns
        {
            BuildEngine = engine,
            Files = [new TaskItem(Path.Combine(root, SampleRepository.DesignPath))],
            RepositoryRoot = root,
            HelpUriBase = "https://example.invalid/rules",
            StampFile = Path.Combine(root, "obj", "check.stamp"),
        };
        configure?.Invoke(task);
        return (task, engine);
    }

    [Fact]
    public void Unknown_part_is_an_error_with_code_position_end_and_help_link_and_no_stamp()
    {
        var text = SampleRepository.Design(SampleRepository.UnknownAmplifier);
        var (task, engine) = Task(text);
        Directory.CreateDirectory(Path.Combine(root, "obj"));
        File.WriteAllText(task.StampFile!, "stale");

        Assert.False(task.Execute());

        var error = Assert.Single(engine.Errors, e => e.Code == "DR906");
        var (line, column) = SampleRepository.AmplifierValuePosition(text);
        Assert.Equal((line, column), (error.LineNumber, error.ColumnNumber));
        Assert.True(error.EndColumnNumber > error.ColumnNumber, $"end column {error.EndColumnNumber}");
        Assert.Equal(Path.Combine(root, SampleRepository.DesignPath), error.File);
        Assert.Equal("https://example.invalid/rules/DR906.md", error.HelpLink);
        Assert.False(File.Exists(task.StampFile), "a failed check must leave no stamp");
        Assert.Equal(1, task.ErrorCount);
    }

    [Fact]
    public void Clean_design_succeeds_and_writes_the_stamp_with_the_summary()
    {
        var (task, engine) = Task(SampleRepository.Design());
        var ok = task.Execute();
        Assert.True(ok, string.Join("\n", engine.Errors.Select(e => e.Message)));
        if (engine.Warnings.Count == 0)
        {
            Assert.Contains("0 error(s)", File.ReadAllText(task.StampFile!), StringComparison.Ordinal);
        }

        Assert.Contains(engine.Messages, m => m.Importance == MessageImportance.High && m.Message!.StartsWith("DesignRules: 1 design(s)", StringComparison.Ordinal));
    }

    [Fact]
    public void Lowered_level_logs_a_warning_and_TreatWarningsAsErrors_raises_it_unless_exempted_or_suppressed()
    {
        var text = SampleRepository.Design(SampleRepository.UnknownAmplifier);
        var (warn, warnEngine) = Task(text, t => t.Levels = "DR906=warning");
        Assert.True(warn.Execute());
        Assert.Single(warnEngine.Warnings, w => w.Code == "DR906" && w.HelpLink == "https://example.invalid/rules/DR906.md");
        Assert.True(File.Exists(warn.StampFile), "a check with warnings but no error is stamped, with its findings beside it");

        // An up-to-date build replays the stamped check: the warning shows again, with its location and help link.
        var replayEngine = new RecordingEngine();
        var replay = new CheckDesigns
        {
            BuildEngine = replayEngine, Replay = true, StampFile = warn.StampFile, HelpUriBase = "https://example.invalid/rules",
        };
        Assert.True(replay.Execute());
        var again = Assert.Single(replayEngine.Warnings, w => w.Code == "DR906");
        var first = Assert.Single(warnEngine.Warnings, w => w.Code == "DR906");
        Assert.Equal((first.File, first.LineNumber, first.ColumnNumber, first.Message, first.HelpLink),
            (again.File, again.LineNumber, again.ColumnNumber, again.Message, again.HelpLink));

        var (raised, raisedEngine) = Task(text, t => { t.Levels = "DR906=warning"; t.TreatWarningsAsErrors = true; });
        Assert.False(raised.Execute());
        Assert.Single(raisedEngine.Errors, e => e.Code == "DR906");

        var (exempt, exemptEngine) = Task(text, t => { t.Levels = "DR906=warning"; t.TreatWarningsAsErrors = true; t.WarningsNotAsErrors = "DR103;DR906"; });
        Assert.True(exempt.Execute());
        Assert.Single(exemptEngine.Warnings, w => w.Code == "DR906");

        var (quiet, quietEngine) = Task(text, t => { t.Levels = "DR906=warning"; t.TreatWarningsAsErrors = true; t.NoWarn = "CS1591,DR906"; });
        Assert.True(quiet.Execute());
        Assert.DoesNotContain(quietEngine.Warnings, w => w.Code == "DR906");
        Assert.Contains(quietEngine.Messages, m => m.Code == "DR906" && m.Importance == MessageImportance.Low);
    }

    [Fact]
    public void Internal_failure_is_one_DR990_error_from_the_catalogue_not_an_exception()
    {
        // MSBuild never passes a path holding a NUL character; one reaching the task is a fault of the tool's own wiring.
        var (task, engine) = Task(SampleRepository.Design(), t => t.RepositoryRoot = "root\0with a NUL");
        Assert.False(task.Execute());
        var error = Assert.Single(engine.Errors);
        Assert.Equal(CheckDesigns.InternalErrorCode, error.Code);
        Assert.StartsWith("DesignRules failed inside the tool: ", error.Message, StringComparison.Ordinal);
        Assert.Contains("fault of the tool", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void A_mistyped_date_is_a_plain_error_naming_the_property_not_a_fault_of_the_tool()
    {
        var (task, engine) = Task(SampleRepository.Design(), t => t.Today = "30/06/2027");
        Assert.False(task.Execute());
        var error = Assert.Single(engine.Errors);
        Assert.Null(error.Code);
        Assert.Contains("DesignRulesToday: '30/06/2027' is not a date; write the date as yyyy-MM-dd", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Malformed_levels_are_one_clear_error()
    {
        var (task, engine) = Task(SampleRepository.Design(), t => t.Levels = "DR906=loud");
        Assert.False(task.Execute());
        Assert.Contains("DesignRulesLevels", Assert.Single(engine.Errors).Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Reports_are_written_beside_the_diagnostics()
    {
        var sarif = Path.Combine(root, "out", "r.sarif");
        var json = Path.Combine(root, "out", "r.json");
        var (task, _) = Task(SampleRepository.Design(SampleRepository.UnknownAmplifier), t => { t.SarifFile = sarif; t.JsonFile = json; });
        Assert.False(task.Execute());
        Assert.Contains("\"DR906\"", File.ReadAllText(sarif), StringComparison.Ordinal);
        Assert.Contains("\"designs/line-driver.yaml\"", File.ReadAllText(json), StringComparison.Ordinal);
    }

    [Fact]
    public void In_a_build_whose_culture_writes_decimal_commas_the_pages_are_the_same_bytes_and_the_culture_is_restored()
    {
        // MSBuild runs the task in the user's culture; a comma-decimal one (like de-DE) is made from the invariant one
        // because the tests run with invariant globalization.
        var comma = (System.Globalization.CultureInfo)System.Globalization.CultureInfo.InvariantCulture.Clone();
        comma.NumberFormat.NumberDecimalSeparator = ",";
        comma.NumberFormat.NumberGroupSeparator = ".";
        var (invariantTask, _) = Task(SampleRepository.Design(), t => t.PagesFolder = Path.Combine(root, "invariant"));
        Assert.True(invariantTask.Execute());

        var saved = System.Globalization.CultureInfo.CurrentCulture;
        try
        {
            System.Globalization.CultureInfo.CurrentCulture = comma;
            var (commaTask, _) = Task(SampleRepository.Design(), t => t.PagesFolder = Path.Combine(root, "comma"));
            Assert.True(commaTask.Execute());
            Assert.Same(comma, System.Globalization.CultureInfo.CurrentCulture);
        }
        finally
        {
            System.Globalization.CultureInfo.CurrentCulture = saved;
        }

        var files = Directory.GetFiles(Path.Combine(root, "invariant"), "*.svg", SearchOption.AllDirectories);
        Assert.NotEmpty(files);
        foreach (var file in files.Concat(Directory.GetFiles(Path.Combine(root, "invariant"), "*.md")))
        {
            var twin = Path.Combine(root, "comma", Path.GetRelativePath(Path.Combine(root, "invariant"), file));
            Assert.True(File.ReadAllBytes(file).AsSpan().SequenceEqual(File.ReadAllBytes(twin)), file);
        }
    }

    [Fact]
    public void A_sarif_path_that_is_a_folder_is_a_plain_error_naming_it_not_a_fault_of_the_tool()
    {
        var folder = Path.Combine(root, "reports");
        Directory.CreateDirectory(folder);
        var (task, engine) = Task(SampleRepository.Design(), t => t.SarifFile = folder);
        Assert.False(task.Execute());
        var error = Assert.Single(engine.Errors);
        Assert.Null(error.Code);
        Assert.Contains($"DesignRulesSarifFile '{folder}' is a folder", error.Message, StringComparison.Ordinal);
    }
}
