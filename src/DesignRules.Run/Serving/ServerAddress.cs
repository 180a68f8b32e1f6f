using System.Globalization;
using System.Net.Sockets;
using System.Security.Cryptography;
using System.Text;

namespace DesignRules.Run.Serving;

/// <summary>
/// Where the evaluation server of one task folder listens, and who it is. The socket's name is a hash of the task folder's
/// full path and of the tool's identity (every assembly of that folder by name, size and time, the tool version and the
/// protocol), so two package versions — or one version's folder rebuilt in place — never share a server. Sockets live in a
/// per-user folder that only its owner may enter.
/// </summary>
internal sealed record ServerAddress(string Folder, string Identity)
{
    /// <summary>The folder the server's files are in (per user, owner-only).</summary>
    public string SocketFolder { get; init; } = DefaultSocketFolder();

    /// <summary>The short name both files start with: a hash of <see cref="Folder"/> and <see cref="Identity"/>.</summary>
    public string Name => "drs-" + Convert.ToHexString(SHA256.HashData(Encoding.UTF8.GetBytes(Folder + "\n" + Identity)))[..20].ToLowerInvariant();

    /// <summary>The Unix domain socket the server listens on.</summary>
    public string SocketPath => Path.Combine(SocketFolder, Name + ".sock");

    /// <summary>The file the one server of this address holds locked while it lives (a second one started in a race leaves).</summary>
    public string LockPath => Path.Combine(SocketFolder, Name + ".lock");

    /// <summary>The address of the server for the task folder <paramref name="folder"/>; <paramref name="salt"/> tells test servers apart.</summary>
    public static ServerAddress For(string folder, string? salt)
    {
        // The server finds its folder as AppContext.BaseDirectory (with a trailing separator), the task as its assembly's
        // folder (without): one spelling, or the two would hash to two addresses and never meet.
        var full = Path.TrimEndingDirectorySeparator(Path.GetFullPath(folder));
        return new ServerAddress(full, ComputeIdentity(full, salt));
    }

    /// <summary>
    /// The socket's end point; null (and why) when the platform cannot address <see cref="SocketPath"/> — a Unix domain
    /// socket's path is limited to about a hundred bytes (108 on Linux, 104 on macOS), so a long socket folder
    /// (<c>DESIGNRULES_SERVER_FOLDER</c>, <c>XDG_RUNTIME_DIR</c>, <c>TMPDIR</c>) rules the server out.
    /// </summary>
    public UnixDomainSocketEndPoint? EndPoint(out string? problem)
    {
        try
        {
            problem = null;
            return new UnixDomainSocketEndPoint(SocketPath);
        }
        catch (ArgumentException ex)
        {
            problem = string.Create(CultureInfo.InvariantCulture,
                $"the server's socket path '{SocketPath}' ({Encoding.UTF8.GetByteCount(SocketPath)} bytes) is longer than this platform allows a socket's path ({ex.GetType().Name}); set DESIGNRULES_SERVER_FOLDER to a shorter folder");
            return null;
        }
        catch (PlatformNotSupportedException ex)
        {
            problem = "this platform has no Unix domain sockets (" + ex.Message.TrimEnd('.') + ")";
            return null;
        }
    }

    /// <summary>
    /// Creates the socket folder when missing and makes it owner-only; false when that cannot be done (another user's
    /// folder, a file in the way) or the socket's path is too long for the platform, and then no server is used.
    /// </summary>
    public bool PrepareSocketFolder(out string? problem)
    {
        if (EndPoint(out problem) is null)
        {
            return false;
        }

        try
        {
            if (OperatingSystem.IsWindows())
            {
                // Below the user's own local application data, which only that user (and administrators) may read.
                Directory.CreateDirectory(SocketFolder);
            }
            else
            {
                const UnixFileMode OwnerOnly = UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute;
                Directory.CreateDirectory(SocketFolder, OwnerOnly);
                // Only the owner may change a folder's mode: setting it proves the folder is ours, and closes it to others
                // should it have been created open.
                File.SetUnixFileMode(SocketFolder, OwnerOnly);
            }

            problem = null;
            return true;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException)
        {
            problem = $"the server folder '{SocketFolder}' cannot be made owner-only ({ex.Message.TrimEnd('.')})";
            return false;
        }
    }

    /// <summary>
    /// The per-user folder of the servers' sockets: <c>$XDG_RUNTIME_DIR/designrules</c> where the system gives a user a
    /// runtime folder, else <c>designrules-USER</c> in the temporary folder, and below the user's local application data on
    /// Windows. Socket paths must stay short (about 100 bytes), so the folder has a short name.
    /// </summary>
    public static string DefaultSocketFolder()
    {
        if (Environment.GetEnvironmentVariable("DESIGNRULES_SERVER_FOLDER") is { Length: > 0 } given)
        {
            return Path.GetFullPath(given);
        }

        if (OperatingSystem.IsWindows())
        {
            return Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.LocalApplicationData), "DesignRules", "servers");
        }

        if (Environment.GetEnvironmentVariable("XDG_RUNTIME_DIR") is { Length: > 0 } runtime && Directory.Exists(runtime))
        {
            return Path.Combine(runtime, "designrules");
        }

        var user = new string(Environment.UserName.Where(char.IsAsciiLetterOrDigit).Take(32).ToArray());
        return Path.Combine(Path.GetTempPath(), "designrules-" + (user.Length > 0 ? user : "user"));
    }

    /// <summary>
    /// The identity of the tool in <paramref name="folder"/>: the protocol, the version and every assembly by name, size and
    /// last write time. Cheap (no assembly is loaded), so the task can compute it on every build.
    /// </summary>
    private static string ComputeIdentity(string folder, string? salt)
    {
        var text = new StringBuilder();
        text.Append("protocol ").Append(ServerFrame.CurrentProtocol.ToString(CultureInfo.InvariantCulture)).Append('\n');
        text.Append("version ").Append(RepositoryConventions.ToolVersion).Append('\n');
        text.Append("salt ").Append(salt ?? string.Empty).Append('\n');
        foreach (var file in Directory.EnumerateFiles(folder, "*.dll").Order(StringComparer.Ordinal))
        {
            var info = new FileInfo(file);
            text.Append(info.Name).Append(' ').Append(info.Length.ToString(CultureInfo.InvariantCulture)).Append(' ')
                .Append(info.LastWriteTimeUtc.Ticks.ToString(CultureInfo.InvariantCulture)).Append('\n');
        }

        return Convert.ToHexString(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())));
    }
}
