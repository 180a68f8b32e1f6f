namespace DesignRules.Reports;

/// <summary>Writes report bytes to a file, creating the folder, replacing the file whole.</summary>
internal static class ReportFiles
{
    public static void Write(string path, byte[] bytes)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        var full = Path.GetFullPath(path);
        if (Path.GetDirectoryName(full) is { Length: > 0 } folder)
        {
            Directory.CreateDirectory(folder);
        }

        File.WriteAllBytes(full, bytes);
    }
}
