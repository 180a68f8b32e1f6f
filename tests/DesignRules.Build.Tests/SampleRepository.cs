namespace DesignRules.Build.Tests;

/// <summary>A small hardware repository written to a temporary folder: one inverting stage on built-in parts.</summary>
internal static class SampleRepository
{
    public const string DesignPath = "designs/line-driver.yaml";

    public const string GoodAmplifier = "jfet-input-15v";

    public const string UnknownAmplifier = "no-such-amplifier";

    /// <summary>The design text with the given amplifier part and feedback resistor.</summary>
    public static string Design(string amplifier = GoodAmplifier, string feedback = "20k") => $"""
        design:
          id: line-driver
          title: Test line driver
        supplies:
          positive: 15 V
          negative: -15 V
        source:
          waveform: sine
          amplitude: 100 mV
          frequency: 1 kHz
        load:
          resistance: 10k
        stages:
          - id: gain
            block: inverting
            amplifier: {amplifier}
            resistors: thin-film-1pct
            values:
              rin: 10k
              rf: {feedback}
        """.Replace("\r\n", "\n", StringComparison.Ordinal) + "\n";

    /// <summary>The 1-based line and column of the amplifier value, where DR906 points for an unknown part.</summary>
    public static (int Line, int Column) AmplifierValuePosition(string text)
    {
        var lines = text.Split('\n');
        var index = Array.FindIndex(lines, l => l.TrimStart().StartsWith("amplifier:", StringComparison.Ordinal));
        var column = lines[index].IndexOf(':', StringComparison.Ordinal) + 3;
        return (index + 1, column);
    }

    public static void Write(string root, string text)
    {
        var path = Path.Combine(root, DesignPath);
        Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        File.WriteAllText(path, text);
    }
}
