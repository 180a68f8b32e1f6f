using System.Globalization;
using DesignRules.Diagnostics;
using DesignRules.Model;
using DesignRules.Yaml;

namespace DesignRules.Loading;

/// <summary>
/// Loads design files and parts files into the typed, located model. Never throws for bad input: every problem
/// is a diagnostic with an id, file, line and column, and loading goes on to report all problems it can.
/// </summary>
public sealed class DesignLoader
{
    /// <summary>The file name under which the built-in parts library is reported.</summary>
    public const string BuiltinLibraryFile = "builtin:parts";

    private readonly LoaderLimits limits;
    private readonly Func<string, string?> readFile;
    private readonly Dictionary<string, LibraryEntry> libraries = new(StringComparer.Ordinal);
    private readonly Dictionary<string, List<LibraryEntry>> resolved = new(StringComparer.Ordinal);
    private readonly Dictionary<string, SourceSpan> designIds = new(StringComparer.Ordinal);
    private int filesRead;
    private readonly List<PartsLibrary> libraryOrder = [];
    private readonly List<Diagnostic> diagnostics = [];
    private LibraryEntry? builtin;

    /// <summary>A loader reading files from disk.</summary>
    /// <param name="limits">Size and nesting bounds; <see cref="LoaderLimits.Default"/> when null.</param>
    public DesignLoader(LoaderLimits? limits = null)
        : this(limits, null)
    {
    }

    private readonly HashSet<string> readPaths = new(StringComparer.Ordinal);

    /// <summary>A loader reading files through <paramref name="readFile"/>, which returns null for a missing file.</summary>
    internal DesignLoader(LoaderLimits? limits, Func<string, string?>? readFile)
    {
        this.limits = limits ?? LoaderLimits.Default;
        this.readFile = readFile ?? ReadFromDisk;
    }

    /// <summary>Loads design and parts files (told apart by their first key). Parts files named here are checked too.</summary>
    public static LoadResult LoadFiles(IEnumerable<string> files, LoaderLimits? limits = null) =>
        new DesignLoader(limits).Load(files);

    /// <summary>Loads the files with this loader.</summary>
    public LoadResult Load(IEnumerable<string> files)
    {
        ArgumentNullException.ThrowIfNull(files);
        var designs = new List<Design>();
        EnsureBuiltin();
        foreach (var file in files)
        {
            var text = SafeRead(file, null);
            if (text is not null)
            {
                LoadOne(file, text, designs);
            }
        }

        return Result(designs);
    }

    /// <summary>Loads one file given as text; parts libraries it names are read relative to <paramref name="file"/>.</summary>
    public LoadResult LoadText(string file, string text)
    {
        ArgumentNullException.ThrowIfNull(file);
        ArgumentNullException.ThrowIfNull(text);
        var designs = new List<Design>();
        EnsureBuiltin();
        LoadOne(file, text, designs);
        return Result(designs);
    }

    private LoadResult Result(List<Design> designs)
    {
        // The same library problem can be reached from several designs; report it once.
        var distinct = diagnostics.Distinct().ToList();
        return new LoadResult(designs, libraryOrder.ToList(), distinct) { Files = [.. readPaths.Order(StringComparer.Ordinal)] };
    }

    private void LoadOne(string file, string text, List<Design> designs)
    {
        var root = ReadRoot(file, text);
        if (root is null)
        {
            return;
        }

        if (IsPartsFile(root))
        {
            var full = FullPath(file);
            if (!libraries.TryGetValue(full, out var entry))
            {
                entry = ReadLibrary(file, root);
                libraries[full] = entry;
            }

            // A parts file named directly is checked, including the libraries it uses.
            if (entry.Library is not null)
            {
                ResolveUses(entry, [], 0);
            }

            return;
        }

        var errorsBefore = diagnostics.Count;
        var header = DesignReader.ReadHeader(root);
        var visible = new List<PartsLibrary> { builtin!.Library! };
        var seen = new HashSet<string>(StringComparer.Ordinal) { BuiltinLibraryFile };
        foreach (var reference in header.Libraries)
        {
            var entry = Reference(file, reference);
            if (entry is not null)
            {
                Collect(entry, visible, seen);
            }
        }

        var catalog = new PartsCatalog(visible, diagnostics, file);
        var design = DesignReader.Read(file, root, header, visible, catalog);

        if (design is not null && designIds.TryGetValue(design.Id.Value, out var first))
        {
            // Two designs with one id would write one page over the other; the first in file order keeps it.
            diagnostics.Add(DesignFileDiagnostics.DuplicateId.At(design.Id.Span, "design", design.Id.Value,
                $"{first.File} {MappingReader.Position(first)}"));
            return;
        }

        if (design is not null)
        {
            designIds[design.Id.Value] = design.Id.Span;
        }

        // A design with any error is not handed on: later stages see only designs that loaded cleanly.
        if (design is not null && !diagnostics.Skip(errorsBefore).Any(d => d.Severity == Severity.Error))
        {
            designs.Add(design);
        }
    }

    private MappingReader? ReadRoot(string file, string text)
    {
        var before = diagnostics.Count;
        var tree = YamlTreeReader.Read(file, text, limits, diagnostics);
        if (tree is null)
        {
            if (diagnostics.Count == before)
            {
                diagnostics.Add(DesignFileDiagnostics.NotADesignFile.At(SourceSpan.WholeFile(file), "The file is empty"));
            }

            return null;
        }

        if (tree is not YamlMapping mapping)
        {
            diagnostics.Add(DesignFileDiagnostics.NotADesignFile.At(tree.Span, $"The file holds {tree.ShapeName} at its top level"));
            return null;
        }

        var hasDesign = mapping.Entries.Any(e => e.Key.Value == "design");
        var hasLibrary = mapping.Entries.Any(e => e.Key.Value == "library");
        if (hasDesign == hasLibrary)
        {
            var why = hasDesign ? "The file has both 'design:' and 'library:'" : "The file has neither 'design:' nor 'library:'";
            var firstKey = mapping.Entries.FirstOrDefault().Key;
            var hint = firstKey is null ? string.Empty : SpellingSuggestion.Hint(firstKey.Value, ["design", "library"]);
            diagnostics.Add(DesignFileDiagnostics.NotADesignFile.At(firstKey?.Span ?? mapping.Span, why + "." + hint.TrimEnd('?', '.')));
            return null;
        }

        var what = hasDesign ? "the design file" : "the parts file";
        return MappingReader.Of(mapping, what, diagnostics);
    }

    private LibraryEntry ReadLibrary(string file, MappingReader root)
    {
        var library = PartsReader.Read(file, root);
        if (library is not null)
        {
            libraryOrder.Add(library);
        }

        return new LibraryEntry(file, library);
    }

    private void EnsureBuiltin()
    {
        if (builtin is not null)
        {
            return;
        }

        var text = BuiltinParts.Text();
        var root = ReadRoot(BuiltinLibraryFile, text);
        builtin = root is null ? new LibraryEntry(BuiltinLibraryFile, null) : ReadLibrary(BuiltinLibraryFile, root);
        if (builtin.Library is null)
        {
            // The shipped library is covered by tests; reaching this is a packaging fault, not a user error.
            throw new InvalidOperationException("The built-in parts library failed to load: " + string.Join("; ", diagnostics));
        }

        libraries[BuiltinLibraryFile] = builtin;
    }

    /// <summary>Reads the library a reference names, relative to the file that names it.</summary>
    private LibraryEntry? Reference(string fromFile, Located<string> reference)
    {
        var path = Path.Combine(Path.GetDirectoryName(fromFile) ?? string.Empty, reference.Value);
        var full = FullPath(path);
        if (libraries.TryGetValue(full, out var cached))
        {
            return cached;
        }

        var text = SafeRead(path, reference);
        if (text is null)
        {
            return null;
        }

        var root = ReadRoot(path, text);
        if (root is null)
        {
            libraries[full] = new LibraryEntry(path, null);
            return libraries[full];
        }

        if (!IsPartsFile(root))
        {
            diagnostics.Add(DesignFileDiagnostics.NotADesignFile.At(reference.Span, $"'{reference.Value}' is a design file, not a parts file"));
            libraries[full] = new LibraryEntry(path, null);
            return libraries[full];
        }

        libraries[full] = ReadLibrary(path, root);
        return libraries[full];
    }

    /// <summary>Adds a library and everything it uses to <paramref name="visible"/>, each once, in depth-first order.</summary>
    private void Collect(LibraryEntry entry, List<PartsLibrary> visible, HashSet<string> seen)
    {
        if (entry.Library is null || !seen.Add(FullPath(entry.File)))
        {
            return;
        }

        visible.Add(entry.Library);
        foreach (var next in ResolveUses(entry, [], 0))
        {
            Collect(next, visible, seen);
        }
    }

    /// <summary>
    /// The libraries <paramref name="entry"/> uses directly, resolved once per run and remembered, so that a lattice of
    /// libraries using the same few files costs each file once, not once per path. Cycles are reported where they close.
    /// </summary>
    private List<LibraryEntry> ResolveUses(LibraryEntry entry, List<LibraryEntry> chain, int depth)
    {
        if (entry.Library is null)
        {
            return [];
        }

        var key = FullPath(entry.File);
        if (resolved.TryGetValue(key, out var known))
        {
            return known;
        }

        var result = new List<LibraryEntry>();
        if (depth >= limits.MaxLibraryDepth)
        {
            var span = entry.Library.Uses.Count > 0 ? entry.Library.Uses[0].Span : SourceSpan.WholeFile(entry.File);
            diagnostics.Add(DesignFileDiagnostics.SizeLimit.At(span, "The chain of parts libraries using each other",
                $"{limits.MaxLibraryDepth.ToString(CultureInfo.InvariantCulture)} levels"));
            resolved[key] = result;
            return result;
        }

        var path = chain.Append(entry).ToList();
        foreach (var use in entry.Library.Uses)
        {
            var next = Reference(entry.File, use);
            if (next is null)
            {
                continue;
            }

            var at = path.FindIndex(e => FullPath(e.File) == FullPath(next.File));
            if (at >= 0)
            {
                var circle = string.Join(" → ", path.Skip(at).Append(next).Select(e => e.Library?.Id.Value ?? e.File));
                diagnostics.Add(DesignFileDiagnostics.LibraryCycle.At(use.Span, circle));
                continue;
            }

            result.Add(next);
            ResolveUses(next, path, depth + 1);
        }

        resolved[key] = result;
        return result;
    }

    private string? SafeRead(string path, Located<string>? reference)
    {
        // Every file the check depends on, read or merely looked for (a missing library that appears later must rerun
        // an incremental build too).
        if (path != BuiltinLibraryFile)
        {
            readPaths.Add(FullPath(path));
        }

        if (++filesRead > limits.MaxFiles)
        {
            // Said once, at the first file over the bound; the run fails, so the files not read cannot pass unnoticed.
            if (filesRead == limits.MaxFiles + 1)
            {
                diagnostics.Add(DesignFileDiagnostics.SizeLimit.At(reference?.Span ?? SourceSpan.WholeFile(path),
                    "The number of design and parts files one run reads",
                    $"{limits.MaxFiles.ToString(CultureInfo.InvariantCulture)} files"));
            }

            return null;
        }

        string? text;
        try
        {
            text = readFile(path);
        }
        catch (RefusedFileException refused)
        {
            diagnostics.Add(refused.ToDiagnostic(reference?.Span ?? SourceSpan.WholeFile(path)));
            return null;
        }
        catch (Exception ex) when (ex is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            diagnostics.Add(DesignFileDiagnostics.NotADesignFile.At(reference?.Span ?? SourceSpan.WholeFile(path), $"'{path}' cannot be read ({ex.Message.TrimEnd('.')})"));
            return null;
        }

        if (text is null)
        {
            if (reference is not null)
            {
                diagnostics.Add(DesignFileDiagnostics.LibraryNotFound.At(reference.Span, reference.Value, path));
            }
            else
            {
                diagnostics.Add(DesignFileDiagnostics.NotADesignFile.At(SourceSpan.WholeFile(path), $"'{path}' does not exist"));
            }
        }

        return text;
    }

    private string? ReadFromDisk(string path) => SourceFile.Read(path, limits);

    private static bool IsPartsFile(MappingReader root) => root.Entries.Any(e => e.Key.Value == "library");

    private static string FullPath(string path) =>
        path == BuiltinLibraryFile ? path : Path.GetFullPath(path);

    private sealed record LibraryEntry(string File, PartsLibrary? Library);
}
