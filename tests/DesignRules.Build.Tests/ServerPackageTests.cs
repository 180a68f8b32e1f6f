using System.Diagnostics;
using System.Text.RegularExpressions;

namespace DesignRules.Build.Tests;

/// <summary>
/// The warm evaluation server as the package starts it: a real background process of the packed task folder, started by
/// the first build, reached by the next ones, gone after its idle time or when its socket folder is deleted. Builds read
/// to the end of their output (as these tests do) must never wait on the server's lifetime.
/// </summary>
[Collection(PackedFeedGroup.Name)]
public sealed partial class ServerPackageTests(PackedFeed feed)
{
    private static readonly TimeSpan Bound = TimeSpan.FromSeconds(60);

    [Fact]
    public void A_served_build_writes_what_an_in_process_build_writes_reports_an_edit_at_once_and_falls_back_when_its_server_is_gone()
    {
        Assert.True(feed.PackOutput.ExitCode == 0, feed.PackOutput.ToString());
        using var repo = new ConsumerRepository(feed, asProjectSdk: true);
        var started = new List<int>();
        try
        {
            SampleRepository.Write(repo.Root, SampleRepository.Design());
            var inProcess = repo.Build("-p:DesignRulesServer=false", "-p:DesignRulesToday=2026-12-01", "-p:DesignRulesJsonFile=out/designrules.json", "-v:d");
            Assert.True(inProcess.ExitCode == 0, inProcess.ToString());
            Assert.DoesNotContain("checked by the evaluation server", inProcess.Output, StringComparison.Ordinal);
            Assert.DoesNotContain("DesignRules: head start", inProcess.Output, StringComparison.Ordinal);
            var expected = Outputs(repo.Root);
            ForgetOutputs(repo.Root);

            // The first build starts the server while it restores (the head start) and hands it the check; the check target
            // then reads the head start's result or waits for it (which of the two depends on timing; the run layer's
            // tests pin the wait); the outputs are the same bytes.
            var served = repo.Build("-p:DesignRulesToday=2026-12-01", "-p:DesignRulesJsonFile=out/designrules.json", "-v:d");
            Assert.True(served.ExitCode == 0, served.ToString());
            Assert.Contains("DesignRules: head start: the evaluation server checks the designs", served.Output, StringComparison.Ordinal);
            // The head start target runs at two steps of the restore (the entry project's first, and the project's own);
            // the server is handed the check once.
            Assert.Single(Regex.Matches(served.Output, "DesignRules: head start: the evaluation server checks the designs"));
            Assert.Contains("DesignRules: head start: handed over earlier in this restore.", served.Output, StringComparison.Ordinal);
            var server = ServerProcess(served);
            started.Add(server);
            var actual = Outputs(repo.Root);
            Assert.Equal(expected.Keys, actual.Keys);
            foreach (var (file, bytes) in expected)
            {
                Assert.True(bytes.AsSpan().SequenceEqual(actual[file]), $"{file} differs between the served and the in-process build");
            }

            // Nothing changed: neither the head start nor the check runs (both are skipped by their inputs and outputs).
            var again = repo.Build("-p:DesignRulesToday=2026-12-01", "-p:DesignRulesJsonFile=out/designrules.json", "-v:d");
            Assert.True(again.ExitCode == 0, again.ToString());
            Assert.Contains("evaluation skipped", again.Output, StringComparison.Ordinal);
            Assert.DoesNotContain("DesignRules: head start", again.Output, StringComparison.Ordinal);

            // An edited design goes to the same, warm server, which reports its new error: never a stale green.
            SampleRepository.Write(repo.Root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
            var edited = repo.Build("-p:DesignRulesToday=2026-12-01", "-p:DesignRulesJsonFile=out/designrules.json", "-v:d");
            Assert.True(edited.ExitCode != 0, edited.ToString());
            Assert.Contains("error DR906", edited.Output, StringComparison.Ordinal);
            Assert.Equal(server, ServerProcess(edited));

            // Another tool identity (here: another salt of the same folder) never reaches that server.
            SampleRepository.Write(repo.Root, SampleRepository.Design());
            var other = repo.Build("-p:_DesignRulesServerSalt=another-build", "-p:DesignRulesServerIdleSeconds=3", "-v:d");
            Assert.True(other.ExitCode == 0, other.ToString());
            var otherServer = ServerProcess(other);
            started.Add(otherServer);
            Assert.NotEqual(server, otherServer);

            // ... and that one leaves after its idle time of 3 s.
            Assert.True(Exits(otherServer), $"the server {otherServer} did not leave after its idle time");

            // A killed server: the next build finds its socket dead and starts another one; the check still passes.
            using (var process = Process.GetProcessById(server))
            {
                process.Kill();
                process.WaitForExit(Bound);
            }

            SampleRepository.Write(repo.Root, SampleRepository.Design(feedback: "22k"));
            var afterKill = repo.Build("-v:d");
            Assert.True(afterKill.ExitCode == 0, afterKill.ToString());
            var restarted = ServerProcess(afterKill);
            started.Add(restarted);
            Assert.NotEqual(server, restarted);

            // A server that cannot be reached at all (its socket folder cannot be made: a file is in the way): the build
            // checks in-process, says why at detailed verbosity, and still reports the error.
            var blocked = Path.Combine(repo.Root, "not-a-folder");
            File.WriteAllText(blocked, "a file where the socket folder would be\n");
            SampleRepository.Write(repo.Root, SampleRepository.Design(SampleRepository.UnknownAmplifier));
            var unreachable = repo.BuildWithServerFolder(Path.Combine(blocked, "sockets"), "-v:d");
            Assert.True(unreachable.ExitCode != 0, unreachable.ToString());
            Assert.Contains("error DR906", unreachable.Output, StringComparison.Ordinal);
            Assert.Contains("DesignRules: checking in the build process:", unreachable.Output, StringComparison.Ordinal);
            Assert.DoesNotContain("checked by the evaluation server", unreachable.Output, StringComparison.Ordinal);
        }
        finally
        {
            // Deleting the socket folder stops every server of this repository: none may outlive the test.
            if (Directory.Exists(repo.ServerFolder))
            {
                Directory.Delete(repo.ServerFolder, recursive: true);
            }

            foreach (var pid in started)
            {
                Assert.True(Exits(pid), $"the server {pid} outlived its test");
            }
        }
    }

    [GeneratedRegex(@"checked by the evaluation server \(process (\d+)\)")]
    private static partial Regex ServedBy();

    private static int ServerProcess(ProcessRun build)
    {
        var match = ServedBy().Match(build.Output);
        Assert.True(match.Success, "the build was not served:\n" + build);
        return int.Parse(match.Groups[1].Value, System.Globalization.CultureInfo.InvariantCulture);
    }

    /// <summary>True once process <paramref name="pid"/> is gone (waiting a bounded time).</summary>
    private static bool Exits(int pid)
    {
        var waited = Stopwatch.StartNew();
        while (waited.Elapsed < Bound)
        {
            try
            {
                using var process = Process.GetProcessById(pid);
                if (process.HasExited)
                {
                    return true;
                }
            }
            catch (ArgumentException)
            {
                return true;
            }

            Thread.Sleep(100);
        }

        return false;
    }

    private static SortedDictionary<string, byte[]> Outputs(string root)
    {
        var files = new SortedDictionary<string, byte[]>(StringComparer.Ordinal);
        foreach (var folder in new[] { "out", "design-pages" })
        {
            foreach (var file in Directory.EnumerateFiles(Path.Combine(root, folder), "*", SearchOption.AllDirectories))
            {
                files[Path.GetRelativePath(root, file)] = File.ReadAllBytes(file);
            }
        }

        return files;
    }

    private static void ForgetOutputs(string root)
    {
        foreach (var folder in new[] { "out", "design-pages", "obj" })
        {
            Directory.Delete(Path.Combine(root, folder), recursive: true);
        }
    }
}
