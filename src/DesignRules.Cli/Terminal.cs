namespace DesignRules.Cli;

/// <summary>Colour only for a person at a terminal: stdout not redirected and NO_COLOR unset or empty (no-color.org).</summary>
internal sealed class Terminal
{
    private const string Reset = "\u001b[0m";

    public Terminal(TextWriter output, bool colour)
    {
        Output = output;
        Colour = colour;
    }

    public TextWriter Output { get; }

    public bool Colour { get; }

    public static Terminal ForStandardOutput() =>
        new(Console.Out, !Console.IsOutputRedirected && string.IsNullOrEmpty(Environment.GetEnvironmentVariable("NO_COLOR")));

    public string Red(string text) => Paint("31", text);

    public string Yellow(string text) => Paint("33", text);

    public string Cyan(string text) => Paint("36", text);

    public string Dim(string text) => Paint("2", text);

    public string Bold(string text) => Paint("1", text);

    private string Paint(string code, string text) => Colour ? $"\u001b[{code}m{text}{Reset}" : text;
}
