using System.Reflection;
using System.Runtime.CompilerServices;
using DesignRules.Build;
using DesignRules.Diagnostics;
using DesignRules.Elaboration;
using DesignRules.Pages;
using DesignRules.Reports;
using DesignRules.Rules;

namespace DesignRules.Build.Tests;

/// <summary>
/// The house rules hold in every shipped assembly, not only the model's: public types are sealed (or static, abstract,
/// records, enums, interfaces), and no type is named for a pattern instead of the trade (Helper, Manager, Utils).
/// </summary>
public sealed class HouseRuleAssemblyTests
{
    private static IReadOnlyList<Assembly> Shipped()
    {
        var list = new List<Assembly>
        {
            typeof(RuleCatalogue).Assembly, typeof(Circuit).Assembly, typeof(ChainElaborator).Assembly, typeof(DesignCheck).Assembly,
            typeof(DatasheetPages).Assembly, typeof(JsonReport).Assembly, typeof(CheckDesigns).Assembly, typeof(DesignRules.Run.DesignRun).Assembly,
            // The figures layer has no public type; it ships beside the rules that use it.
            Assembly.Load(new AssemblyName("DesignRules.Figures")),
            // The warm evaluation server ships in the task folder; it has no public type either.
            Assembly.Load(new AssemblyName("DesignRules.Server")),
        };
        // The command line is an application the tests run as a process; its assembly is read from the build output.
        if (File.Exists(TestPaths.CliAssembly))
        {
            list.Add(Assembly.LoadFrom(TestPaths.CliAssembly));
        }

        return list;
    }

    [Fact]
    public void Every_shipped_assembly_is_covered()
    {
        var names = Shipped().Select(a => a.GetName().Name).ToList();
        var projects = Directory.EnumerateDirectories(Path.Combine(TestPaths.RepositoryRoot, "src")).Select(Path.GetFileName)
            .Where(p => File.Exists(Path.Combine(TestPaths.RepositoryRoot, "src", p!, p + ".csproj"))).ToList();
        // The command line's assembly is named for its command.
        Assert.All(projects, p => Assert.True(names.Contains(p) || p == "DesignRules.Cli" && names.Contains("designrules"), $"{p} is not checked"));
    }

    [Fact]
    public void Every_public_type_is_sealed_static_abstract_a_record_an_enum_or_an_interface()
    {
        var offenders = Shipped().SelectMany(a => a.GetExportedTypes())
            .Where(t => t.IsClass && !t.IsSealed && !t.IsAbstract && !IsRecord(t))
            .Select(t => t.FullName);
        Assert.Empty(offenders);
    }

    [Fact]
    public void No_type_is_named_helper_manager_or_utils()
    {
        var offenders = Shipped().SelectMany(a => a.GetTypes())
            .Where(t => !t.IsDefined(typeof(CompilerGeneratedAttribute), false))
            .Where(t => t.Name.EndsWith("Helper", StringComparison.Ordinal) || t.Name.EndsWith("Manager", StringComparison.Ordinal) ||
                        t.Name.EndsWith("Utils", StringComparison.Ordinal) || t.Name.EndsWith("Helpers", StringComparison.Ordinal))
            .Select(t => t.FullName);
        Assert.Empty(offenders);
    }

    private static bool IsRecord(Type t) =>
        t.GetMethod("<Clone>$") is not null || t.GetCustomAttributes<CompilerGeneratedAttribute>().Any();
}
