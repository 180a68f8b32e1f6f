namespace DesignRules.Run.Serving;

/// <summary>The evaluation server's times: every wait of the task on the server is bounded by one of them.</summary>
internal static class ServerSettings
{
    /// <summary>How long a server waits without a run before it exits (<c>DesignRulesServerIdleSeconds</c>): ten minutes.</summary>
    public const double DefaultIdleSeconds = 600;

    /// <summary>How long a task waits for a server it started to listen before running in-process.</summary>
    public static readonly TimeSpan StartLimit = TimeSpan.FromSeconds(20);

    /// <summary>How long a task waits for a listening server to accept or refuse a run.</summary>
    public static readonly TimeSpan AnswerLimit = TimeSpan.FromSeconds(10);

    /// <summary>How often a server says a run is still going.</summary>
    public static readonly TimeSpan Heartbeat = TimeSpan.FromSeconds(2);

    /// <summary>
    /// How long a task waits for the next frame of a run before it takes the server for hung and runs in-process: many
    /// heartbeats, so a loaded machine does not trip it.
    /// </summary>
    public static readonly TimeSpan SilenceLimit = TimeSpan.FromSeconds(60);
}
