namespace DesignRules.Loading;

/// <summary>The built-in parts library shipped inside this assembly.</summary>
internal static class BuiltinParts
{
    public static string Text()
    {
        using var stream = typeof(BuiltinParts).Assembly.GetManifestResourceStream("DesignRules.Library.builtin-parts.yaml")
            ?? throw new InvalidOperationException("The built-in parts library is missing from the assembly.");
        using var reader = new StreamReader(stream);
        return reader.ReadToEnd();
    }
}
