using System.IO.Compression;

namespace DesignRules.Build.Tests;

/// <summary>What the package holds: the task and its libraries under tasks/, MSBuild's own assemblies nowhere.</summary>
[Collection(PackedFeedGroup.Name)]
public sealed class PackageLayoutTests(PackedFeed feed)
{
    [Fact]
    public void Package_has_task_folder_props_targets_sdk_pages_and_schemas_but_no_lib_and_no_msbuild()
    {
        Assert.True(feed.PackOutput.ExitCode == 0, feed.PackOutput.ToString());
        using var zip = ZipFile.OpenRead(feed.Package);
        var names = zip.Entries.Select(e => e.FullName).ToList();
        string[] expected =
        [
            "tasks/net10.0/DesignRules.Build.dll", "tasks/net10.0/DesignRules.Build.deps.json", "tasks/net10.0/DesignRules.Rules.dll", "tasks/net10.0/DesignRules.Run.dll",
            "tasks/net10.0/DesignRules.Core.dll", "tasks/net10.0/YamlDotNet.dll", "tasks/net10.0/MathNet.Numerics.dll",
            "build/DesignRules.Build.props", "build/DesignRules.Build.targets",
            "buildTransitive/DesignRules.Build.props", "buildTransitive/DesignRules.Build.targets",
            "Sdk/Sdk.props", "Sdk/Sdk.targets", "rules/DR906.md", "schemas/design.schema.json", "schemas/parts.schema.json", "schemas/rule-set.schema.json", "schemas/report.schema.json",
        ];
        Assert.All(expected, name => Assert.Contains(name, names));
        Assert.DoesNotContain(names, n => n.StartsWith("lib/", StringComparison.Ordinal));
        Assert.DoesNotContain(names, n => n.Contains("Microsoft.Build", StringComparison.Ordinal));
        var nuspec = new StreamReader(zip.Entries.Single(e => e.FullName.EndsWith(".nuspec", StringComparison.Ordinal)).Open()).ReadToEnd();
        Assert.DoesNotContain("<dependency ", nuspec, StringComparison.Ordinal);
    }
}
