using System.Globalization;
using DesignRules.Run.Serving;

namespace DesignRules.Server;

/// <summary>
/// The evaluation server's entry point: <c>dotnet exec DesignRules.Server.dll --idle SECONDS [--salt TEXT]
/// [--socket-folder DIR]</c>, started by the MSBuild task from the task folder. It writes nothing to the console (the task
/// closes its standard streams); its exit code says why it ended, for whoever runs it by hand.
/// </summary>
internal static class Program
{
    private static int Main(string[] args)
    {
        // Every output must be the same bytes on every machine, whatever the user's locale.
        CultureInfo.DefaultThreadCurrentCulture = CultureInfo.InvariantCulture;
        CultureInfo.DefaultThreadCurrentUICulture = CultureInfo.InvariantCulture;
        CultureInfo.CurrentCulture = CultureInfo.InvariantCulture;
        CultureInfo.CurrentUICulture = CultureInfo.InvariantCulture;
        // A warm process reads the same design and parts files run after run: keep each file's YAML tree while its text is
        // exactly the same (DesignRules.Yaml.ParsedTrees in the loader; compared in full, so an edit is always read afresh).
        AppContext.SetSwitch("DesignRules.KeepParsedFiles", true);
        var idle = TimeSpan.FromSeconds(ServerSettings.DefaultIdleSeconds);
        string? salt = null;
        string? socketFolder = null;
        for (var i = 0; i + 1 < args.Length; i += 2)
        {
            switch (args[i])
            {
                case "--idle" when double.TryParse(args[i + 1], NumberStyles.Float, CultureInfo.InvariantCulture, out var seconds) && seconds > 0:
                    idle = TimeSpan.FromSeconds(seconds);
                    break;
                case "--salt":
                    salt = args[i + 1];
                    break;
                case "--socket-folder":
                    socketFolder = args[i + 1];
                    break;
                default:
                    return 2;
            }
        }

        var address = ServerAddress.For(AppContext.BaseDirectory, salt);
        if (socketFolder is not null)
        {
            address = address with { SocketFolder = Path.GetFullPath(socketFolder) };
        }

        // Warmed up once after its first run (ServerWarmUp): a build's server serves the developer's next edits.
        using var server = new EvaluationServer(address, idle, warmUp: true);
        return (int)server.Run();
    }
}
