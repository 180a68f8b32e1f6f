using System.Diagnostics;
using DesignRules.Loading;

namespace DesignRules.Tests.Loading;

/// <summary>A named pipe is refused as what it is, never opened (opening one blocks until someone writes to it).</summary>
public sealed class SpecialFileTests : IDisposable
{
    private readonly string folder = Directory.CreateTempSubdirectory("designrules-fifo-").FullName;

    public void Dispose() => Directory.Delete(folder, recursive: true);

    [Fact]
    public void A_named_pipe_as_design_file_is_refused_as_not_a_regular_file_and_an_empty_file_is_still_empty()
    {
        if (!OperatingSystem.IsLinux())
        {
            return;
        }

        var pipe = Path.Combine(folder, "pipe.yaml");
        using (var mkfifo = Process.Start(new ProcessStartInfo("mkfifo", [pipe]) { UseShellExecute = false })!)
        {
            mkfifo.WaitForExit();
            Assert.Equal(0, mkfifo.ExitCode);
        }

        var empty = Path.Combine(folder, "empty.yaml");
        File.WriteAllText(empty, string.Empty);

        var loaded = DesignLoader.LoadFiles([pipe, empty]);
        var refused = Assert.Single(loaded.Diagnostics, d => d.Span.File == pipe);
        Assert.Equal("DR915", refused.Id);
        Assert.Contains("is a named pipe (FIFO), not a regular file", refused.Message, StringComparison.Ordinal);
        var emptyFile = Assert.Single(loaded.Diagnostics, d => d.Span.File == empty);
        Assert.Contains("The file is empty", emptyFile.Message, StringComparison.Ordinal);
    }
}
