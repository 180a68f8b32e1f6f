using DesignRules.Diagnostics;

namespace DesignRules.Reports;

/// <summary>
/// Why a report file or pages folder named by the user cannot be written, in a plain sentence naming the path, so that a
/// host can refuse it as the user's mistake before the check runs rather than fail as a fault of the tool afterwards.
/// </summary>
public static class OutputPaths
{
    /// <summary>Why <paramref name="path"/> cannot take a report file (<paramref name="option"/> names the setting); null when it can.</summary>
    public static string? FileProblem(string option, string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        var shown = DiagnosticText.Escape(path);
        if (path.Length == 0 || path.EndsWith('/') || path.EndsWith(Path.DirectorySeparatorChar) || Directory.Exists(path))
        {
            return $"{option} '{shown}' is a folder; {option} takes a file name, e.g. '{Path.Combine(shown.TrimEnd('/', Path.DirectorySeparatorChar), "designrules.sarif")}'.";
        }

        return FileOnTheWay(option, path);
    }

    /// <summary>Why <paramref name="path"/> cannot be the pages folder; null when it can (it is created when missing).</summary>
    public static string? FolderProblem(string option, string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        if (File.Exists(path))
        {
            return $"{option} '{DiagnosticText.Escape(path)}' is a file, not a folder; name a folder for the pages (it is created when missing).";
        }

        return FileOnTheWay(option, path);
    }

    // A file where a folder on the way should be: the folder cannot be created.
    private static string? FileOnTheWay(string option, string path)
    {
        for (var folder = Path.GetDirectoryName(Path.GetFullPath(path)); !string.IsNullOrEmpty(folder); folder = Path.GetDirectoryName(folder))
        {
            if (File.Exists(folder))
            {
                return $"{option} '{DiagnosticText.Escape(path)}' cannot be written: '{DiagnosticText.Escape(folder)}' on its way is a file, not a folder.";
            }

            if (Directory.Exists(folder))
            {
                return null;
            }
        }

        return null;
    }
}
