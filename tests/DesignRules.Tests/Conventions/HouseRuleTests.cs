using System.Reflection;
using System.Runtime.CompilerServices;
using DesignRules.Diagnostics;
using DesignRules.Loading;
using DesignRules.Tests.Loading;

namespace DesignRules.Tests.Conventions;

/// <summary>House rules that hold for the whole code base.</summary>
public sealed class HouseRuleTests
{
    private static readonly Assembly Core = typeof(DesignLoader).Assembly;

    [Fact]
    public void Every_diagnostic_has_a_unique_id_of_the_form_DR_and_three_digits()
    {
        var ids = DesignFileDiagnostics.All.Select(d => d.Id).ToList();
        Assert.All(ids, id => Assert.Matches("^DR[0-9]{3}$", id));
        Assert.Equal(ids.Count, ids.Distinct().Count());
    }

    [Fact]
    public void Every_diagnostic_field_is_listed_in_the_catalogue()
    {
        var fields = typeof(DesignFileDiagnostics).GetFields(BindingFlags.Public | BindingFlags.Static)
            .Where(f => f.FieldType == typeof(DiagnosticDescriptor))
            .Select(f => (DiagnosticDescriptor)f.GetValue(null)!);
        Assert.Equal(fields.Select(d => d.Id).Order(), DesignFileDiagnostics.All.Select(d => d.Id).Order());
    }

    [Fact]
    public void Every_diagnostic_has_a_help_page_that_says_why_and_how_to_fix()
    {
        var root = FixtureFiles.RepositoryRoot();
        foreach (var descriptor in DesignFileDiagnostics.All)
        {
            var page = Path.Combine(root, descriptor.HelpPage);
            Assert.True(File.Exists(page), $"{descriptor.Id}: no help page at {descriptor.HelpPage}");
            var text = File.ReadAllText(page);
            Assert.StartsWith($"# {descriptor.Id}: {descriptor.Title}", text, StringComparison.Ordinal);
            Assert.Contains("## Why this rule exists", text, StringComparison.Ordinal);
            Assert.Contains("## How to fix it", text, StringComparison.Ordinal);
        }
    }

    [Fact]
    public void Every_public_type_is_sealed_static_abstract_a_record_an_enum_or_an_interface()
    {
        var offenders = Core.GetExportedTypes()
            .Where(t => t.IsClass && !t.IsSealed && !t.IsAbstract && !IsRecord(t))
            .Select(t => t.FullName);
        Assert.Empty(offenders);
    }

    [Fact]
    public void No_public_type_is_named_helper_manager_or_utils()
    {
        var offenders = Core.GetExportedTypes()
            .Where(t => t.Name.EndsWith("Helper", StringComparison.Ordinal) || t.Name.EndsWith("Manager", StringComparison.Ordinal) ||
                        t.Name.EndsWith("Utils", StringComparison.Ordinal))
            .Select(t => t.FullName);
        Assert.Empty(offenders);
    }

    [Fact]
    public void Messages_built_from_file_text_keep_braces_literally()
    {
        var d = DesignFileDiagnostics.UnknownKey.At(SourceSpan.WholeFile("x.yaml"), "{0}{1}", "the {design}", string.Empty, "a, b");
        Assert.Equal("Unknown key '{0}{1}' in the {design}. Accepted keys: a, b.", d.Message);
    }

    [Fact]
    public void Every_parallel_loop_runs_on_the_scheduler_of_the_task_it_is_in()
    {
        // ParallelOptions name TaskScheduler.Default unless told otherwise: a loop inside a build's head start would then
        // take every core while the build restores, instead of the one core HeadStartCores gives it until the build waits.
        var root = FixtureFiles.RepositoryRoot();
        var offenders = new List<string>();
        foreach (var source in Directory.EnumerateFiles(Path.Combine(root, "src"), "*.cs", SearchOption.AllDirectories)
                     .Where(f => !f.Contains($"{Path.DirectorySeparatorChar}obj{Path.DirectorySeparatorChar}", StringComparison.Ordinal))
                     .Order(StringComparer.Ordinal))
        {
            var lines = File.ReadAllLines(source);
            for (var i = 0; i < lines.Length; i++)
            {
                var line = lines[i];
                var makesOptions = line.Contains("new ParallelOptions", StringComparison.Ordinal) ||
                    (line.Contains("ParallelOptions ", StringComparison.Ordinal) && line.Contains("=> new()", StringComparison.Ordinal));
                var loopWithoutOptions = System.Text.RegularExpressions.Regex.IsMatch(line, @"Parallel\.For\([^,]+,[^,]+,\s*\w+\s*=>|Parallel\.ForEach\([^,]+,\s*\w+\s*=>") ||
                    line.Contains("Parallel.Invoke", StringComparison.Ordinal) || line.Contains(".AsParallel()", StringComparison.Ordinal);
                if ((makesOptions && !line.Contains("TaskScheduler = TaskScheduler.Current", StringComparison.Ordinal)) || loopWithoutOptions)
                {
                    offenders.Add($"{Path.GetRelativePath(root, source)}({i + 1}): {line.Trim()}");
                }
            }
        }

        Assert.True(offenders.Count == 0, string.Join('\n', offenders));
    }

    private static bool IsRecord(Type t) =>
        t.GetMethod("<Clone>$") is not null || t.GetCustomAttributes<CompilerGeneratedAttribute>().Any();
}
