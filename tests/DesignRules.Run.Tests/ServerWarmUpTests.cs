using DesignRules.Run.Serving;

namespace DesignRules.Run.Tests;

/// <summary>
/// A new server's warm-up: it checks one design of its first run in a scratch folder of its own, and must leave every
/// file of the repository, and what the next check writes, exactly as they were.
/// </summary>
public sealed class ServerWarmUpTests : IDisposable
{
    private readonly ExampleCopy example = new();

    public void Dispose() => example.Dispose();

    private BuildCall Call() => new()
    {
        Files = [.. DesignRules.Loading.RepositoryFiles.Find([example.Root], out _)],
        RepositoryRoot = example.Root,
        RuleSetFile = example.RuleSet,
        Today = "2026-12-01",
    };

    private Dictionary<string, byte[]> Snapshot() =>
        Directory.EnumerateFiles(example.Root, "*", SearchOption.AllDirectories)
            .ToDictionary(f => Path.GetRelativePath(example.Root, f), File.ReadAllBytes, StringComparer.Ordinal);

    private static string[] ScratchFolders() =>
        Directory.GetDirectories(Path.GetTempPath(), $"designrules-warm-up-{Environment.ProcessId}-*");

    [Fact]
    public void A_warm_up_checks_the_first_design_file_and_leaves_the_repository_and_no_scratch_folder_behind()
    {
        example.Run();
        var before = Snapshot();

        var checkedFile = ServerWarmUp.Run(Call(), CancellationToken.None);

        var first = Directory.GetFiles(Path.Combine(example.Root, "designs"), "*.yaml", SearchOption.AllDirectories)
            .Select(Path.GetFullPath).Order(StringComparer.Ordinal).First();
        Assert.Equal(first, checkedFile);
        var after = Snapshot();
        Assert.Equal(before.Keys.Order(StringComparer.Ordinal), after.Keys.Order(StringComparer.Ordinal));
        Assert.All(before, file => Assert.True(file.Value.AsSpan().SequenceEqual(after[file.Key]), $"{file.Key} changed in the warm-up"));
        Assert.Empty(ScratchFolders());
    }

    [Fact]
    public void A_check_after_a_warm_up_writes_the_same_bytes_and_evaluates_the_same_designs_as_before_it()
    {
        // The warm-up shares the process's kept parse trees, templates and page state with the runs: none may leak into them.
        var (_, evaluated) = example.Run();
        var first = Snapshot();
        Directory.Delete(example.Cache, recursive: true);
        Directory.Delete(example.Pages, recursive: true);
        File.Delete(example.Json);

        ServerWarmUp.Run(Call(), CancellationToken.None);
        var (_, again) = example.Run();

        Assert.Equal(evaluated, again);
        var second = Snapshot();
        Assert.Equal(first.Keys.Order(StringComparer.Ordinal), second.Keys.Order(StringComparer.Ordinal));
        // The page state records each written file's size and write time (its stamp), which no two runs share.
        Assert.All(first.Where(f => Path.GetFileName(f.Key) != "pages.state"),
            file => Assert.True(file.Value.AsSpan().SequenceEqual(second[file.Key]), $"{file.Key} differs after the warm-up"));
    }

    [Fact]
    public void A_warm_up_asked_to_stop_before_it_begins_checks_nothing()
    {
        using var stop = new CancellationTokenSource();
        stop.Cancel();

        Assert.Null(ServerWarmUp.Run(Call(), stop.Token));
        Assert.Empty(ScratchFolders());
    }
}
