using System.Text.RegularExpressions;

namespace DesignRules.Run.Tests;

public sealed class RunRequestTests : IDisposable
{
    private readonly ExampleCopy repo = new();

    public void Dispose() => repo.Dispose();

    [Fact]
    public void Command_line_options_that_cannot_be_used_are_problems_naming_each_option_not_exceptions()
    {
        var folder = Path.Combine(repo.Root, "reports");
        Directory.CreateDirectory(folder);
        var parse = RunRequest.FromCommandLine(new CommandLineInputs([repo.Root, Path.Combine(repo.Root, "no-such")])
        {
            Levels = "DR906=loud",
            Today = "30/06/2027",
            Sarif = folder,
            RuleSet = Path.Combine(repo.Root, "no-rules.yaml"),
        });
        Assert.Null(parse.Request);
        var lines = parse.Problems.Select(p => p.ToString()).ToList();
        Assert.Contains(lines, l => l.EndsWith("no-such: error: no such file or folder", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.StartsWith("--levels: error: ", StringComparison.Ordinal));
        Assert.Contains("--today: error: write the date as yyyy-MM-dd, e.g. 2027-06-30", lines);
        Assert.Contains(lines, l => l.Contains("no-rules.yaml: error: no such rule-set file", StringComparison.Ordinal));
        Assert.Contains(lines, l => l.StartsWith($"error: --sarif '{folder}' is a folder", StringComparison.Ordinal));
    }

    [Fact]
    public void Build_properties_that_cannot_be_used_are_problems_and_a_mistyped_date_is_one_of_them()
    {
        var parse = RunRequest.FromBuild(new BuildInputs([repo.Design("motor-current-monitor")])
        {
            RepositoryRoot = repo.Root,
            Today = "2027-6-30",
            Levels = "DR999=off",
        });
        Assert.Null(parse.Request);
        Assert.Contains("DesignRulesToday: '2027-6-30' is not a date; write the date as yyyy-MM-dd, e.g. 2027-06-30", parse.Problems.Select(p => p.ForBuild));
        Assert.Contains(parse.Problems, p => p.Subject == "DesignRulesLevels" && p.Message.Contains("DR999", StringComparison.Ordinal));
    }

    [Fact]
    public void Both_hosts_find_the_rule_set_at_the_root_and_read_the_same_request_from_the_same_inputs()
    {
        var cli = RunRequest.FromCommandLine(new CommandLineInputs([repo.Root]) { Today = "2026-12-01" }).Request!;
        var build = RunRequest.FromBuild(new BuildInputs(cli.Files)
        {
            RepositoryRoot = repo.Root,
            RuleSetFile = RepositoryConventions.FindRuleSet(repo.Root),
            Today = "2026-12-01",
        }).Request!;
        Assert.Equal(repo.RuleSet, cli.RuleSetFile);
        Assert.Equal(cli.RuleSetFile, build.RuleSetFile);
        Assert.Equal(cli.Files.Order(StringComparer.Ordinal), build.Files.Order(StringComparer.Ordinal));
        Assert.Equal((cli.Root, cli.Today, cli.ReportRoot), (build.Root, build.Today, build.ReportRoot));
    }

    [Fact]
    public void A_head_start_and_the_build_s_own_check_leave_the_cores_to_the_run_layer()
    {
        BuildInputs Inputs(bool headStart) => new([repo.Design("motor-current-monitor")]) { RepositoryRoot = repo.Root, Today = "2026-12-01", HeadStart = headStart };

        // The head start's cores are the run layer's to give (HeadStartCores: one during the restore, every core once the
        // build's check waits); neither request caps its loops.
        Assert.Null(RunRequest.FromBuild(Inputs(headStart: true)).Request!.MaxDegreeOfParallelism);
        Assert.Null(RunRequest.FromBuild(Inputs(headStart: false)).Request!.MaxDegreeOfParallelism);
    }

    [Fact]
    public void The_build_props_default_to_the_same_globs_and_folders_as_the_repository_conventions()
    {
        // MSBuild needs the defaults before any task runs, so the props file repeats them; this keeps the copy in step.
        var props = File.ReadAllText(Path.Combine(ExampleCopy.RepositoryRoot, "src", "DesignRules.Build", "build", "DesignRules.Build.props"));
        var targets = File.ReadAllText(Path.Combine(ExampleCopy.RepositoryRoot, "src", "DesignRules.Build", "build", "DesignRules.Build.targets"));
        Assert.Matches($">{Regex.Escape(RepositoryConventions.DesignPattern)}</DesignRulesDesignPattern>", props);
        Assert.Matches($">{Regex.Escape(RepositoryConventions.PartsPattern)}</DesignRulesPartsPattern>", props);
        Assert.Contains($"$(DesignRulesRoot)/{RepositoryConventions.RuleSetFileName}", targets, StringComparison.Ordinal);
        Assert.Contains($"$(DesignRulesRoot)/{RepositoryConventions.PagesFolderName}<", targets, StringComparison.Ordinal);
        Assert.Contains($"$(DesignRulesRoot)/{RepositoryConventions.TemplateFolderName}<", targets, StringComparison.Ordinal);
        Assert.Contains($"ToString('{RepositoryConventions.DateFormat}')", targets, StringComparison.Ordinal);
    }
}
