using System.Text.Encodings.Web;
using System.Text.Json;
using DesignRules.Diagnostics;

namespace DesignRules.Reports;

/// <summary>Shared JSON writing choices: indented, "\n" line ends, readable non-ASCII text, finite numbers only.</summary>
internal static class ReportJson
{
    public static Utf8JsonWriter Writer(Stream output) => new(output, new JsonWriterOptions
    {
        Indented = true,
        NewLine = "\n",
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
    });

    /// <summary>Writes a number in its shortest round-trip form; JSON has no NaN or infinity, so those become strings.</summary>
    public static void Number(Utf8JsonWriter writer, string name, double value)
    {
        if (double.IsFinite(value))
        {
            writer.WriteNumber(name, value);
        }
        else
        {
            writer.WriteString(name, double.IsNaN(value) ? "NaN" : value > 0 ? "Infinity" : "-Infinity");
        }
    }

    /// <summary>The lower-case level word shared by SARIF and our JSON: error, warning, note.</summary>
    public static string Level(Severity severity) => severity switch
    {
        Severity.Error => "error",
        Severity.Warning => "warning",
        _ => "note",
    };

    /// <summary>Writes to memory and returns the bytes (UTF-8, no byte-order mark, ending in a line feed).</summary>
    public static byte[] ToBytes(Action<Utf8JsonWriter> write)
    {
        using var memory = new MemoryStream();
        using (var writer = Writer(memory))
        {
            write(writer);
        }

        memory.WriteByte((byte)'\n');
        return memory.ToArray();
    }
}
