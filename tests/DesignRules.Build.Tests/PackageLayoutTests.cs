using System.IO.Compression;
using System.Reflection.PortableExecutable;
using System.Text.Json;

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

    [Fact]
    public void Task_folder_holds_precompiled_ReadyToRun_images_that_keep_their_metadata_and_a_portable_dependency_file()
    {
        Assert.True(feed.PackOutput.ExitCode == 0, feed.PackOutput.ToString());
        using var zip = ZipFile.OpenRead(feed.Package);
        var assemblies = zip.Entries.Where(e => e.FullName.StartsWith("tasks/net10.0/", StringComparison.Ordinal) && e.FullName.EndsWith(".dll", StringComparison.Ordinal)).ToList();
        Assert.Contains(assemblies, e => e.Name == "DesignRules.Build.dll");
        Assert.Contains(assemblies, e => e.Name == "YamlDotNet.dll");
        foreach (var entry in assemblies)
        {
            using var bytes = new MemoryStream();
            using (var stream = entry.Open())
            {
                stream.CopyTo(bytes);
            }

            bytes.Position = 0;
            using var image = new PEReader(bytes);
            // Metadata and IL stay (the assembly loads and runs on any platform); the ReadyToRun header (ECMA-335 CLI
            // header's ManagedNativeHeader entry) marks code compiled ahead of time, which MSBuild's process need not JIT.
            Assert.True(image.HasMetadata, $"{entry.FullName} has no metadata");
            Assert.True(image.PEHeaders.CorHeader!.ManagedNativeHeaderDirectory.Size > 0, $"{entry.FullName} is not a ReadyToRun image");
        }

        // The dependency file is the portable one: MSBuild resolves the task's libraries the same way on every platform.
        using var deps = JsonDocument.Parse(zip.GetEntry("tasks/net10.0/DesignRules.Build.deps.json")!.Open());
        Assert.Equal(".NETCoreApp,Version=v10.0", deps.RootElement.GetProperty("runtimeTarget").GetProperty("name").GetString());
    }
}
