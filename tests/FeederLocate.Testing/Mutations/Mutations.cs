using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Nodes;
using System.Text.RegularExpressions;
using CsCheck;

namespace FeederLocate.Testing;

/// <summary>Edits made on the parsed JSON tree, so the file stays well-formed and reaches the element checks.</summary>
public enum TreeOp
{
    DeleteMember,
    WrongType,
    OddNumber,
    RenameProperty,
    MissingReference,
    IdOfAnotherElement,
    DuplicateArrayItem,
    EmptyArray,
    FormatTag,
    DeepNesting,
    OddString,
    UnknownField,
}

/// <summary>Edits made on the text, most of which break the JSON syntax.</summary>
public enum TextOp
{
    FlipCharBit,
    FlipUtf8Bit,
    Truncate,
    DeleteLine,
    DuplicateLine,
    DeleteChars,
    DuplicateChars,
    InsertUnicode,
    ReplaceNumberToken,
    ReplaceStringToken,
    DeepNesting,
    FormatTag,
}

/// <summary>One tree edit: <see cref="Target"/> picks the node (modulo the candidates), <see cref="Choice"/> the replacement.</summary>
public readonly record struct TreeEdit(TreeOp Op, int Target, int Choice)
{
    public override string ToString() => $"{Op}(target {Target}, choice {Choice})";
}

/// <summary>One text edit: positions are taken modulo the text's length, so every value is a valid edit.</summary>
public readonly record struct TextEdit(TextOp Op, int Position, int Length, int Choice)
{
    public override string ToString() => $"{Op}(at {Position}, length {Length}, choice {Choice})";
}

/// <summary>
/// A mutant of one of the sample files: the tree edits are applied first, then the text edits. It is a
/// plain value, so CsCheck shrinks it (fewer edits, smaller positions) and prints it when a check fails.
/// </summary>
public sealed record Mutant(int Base, TreeEdit[] TreeEdits, TextEdit[] TextEdits)
{
    public string Apply(IReadOnlyList<string> bases)
    {
        var text = bases[Base % bases.Count];
        if (TreeEdits.Length > 0)
        {
            text = Mutations.ApplyTree(text, TreeEdits);
        }

        foreach (var edit in TextEdits)
        {
            text = Mutations.ApplyText(text, edit);
        }

        return text;
    }

    public override string ToString() =>
        $"base {Base}; tree [{string.Join(", ", TreeEdits)}]; text [{string.Join(", ", TextEdits)}]";
}

/// <summary>Generators of mutants, and the edits themselves.</summary>
public static class Mutations
{
    private static readonly Regex NumberToken = new(@"(?<![\w.""\-])-?\d+(?:\.\d+)?(?:[eE][+-]?\d+)?(?![\w.""])", RegexOptions.CultureInvariant);

    private static readonly Regex StringToken = new(@"""(?:[^""\\]|\\.)*""", RegexOptions.CultureInvariant);

    private static readonly JsonSerializerOptions Indented = new()
    {
        WriteIndented = true,
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
        MaxDepth = 1000, // deep-nesting edits go past the readers' limit of 64 on purpose
    };


    /// <summary>Values of the wrong JSON type for any field.</summary>
    private static readonly string[] WrongTypes =
        ["\"text\"", "\"\"", "true", "false", "null", "[]", "{}", "0", "[1, 2]", "{\"id\": \"X\"}", "[null]", "\"50\""];

    /// <summary>Numbers (and number-like strings) outside what any field allows, or just at its edge.</summary>
    private static readonly string[] OddNumbers =
    [
        "-1", "0", "-0", "1e308", "-1e308", "1e400", "-1e400", "1e-400", "5e-324", "\"NaN\"", "\"Infinity\"",
        "\"-Infinity\"", "2147483648", "9007199254740993", "0.5", "1.5", "50", "60", "100", "-100", "1E2", "0.0",
        "1e9", "-1e9", "1000000000.5", "999999999", "1e-9",
    ];

    /// <summary>Text-level replacements for a number token: most are not JSON at all.</summary>
    private static readonly string[] OddNumberTokens =
    [
        "NaN", "Infinity", "-Infinity", "1e400", "-1e400", "1e308", "-1", "0", "\"12\"", "null", "true", "01",
        "1.", ".5", "+1", "0x1F", "1e", "-", "1_000", "\uFF19", "1e+", "--1", "1,5",
    ];

    /// <summary>
    /// Strings that are valid JSON but awkward: control characters, direction marks, combining marks,
    /// surrogate pairs, whitespace-only and very long text.
    /// </summary>
    private static readonly string[] OddStrings =
    [
        "", " ", "   ", "\u0000", "\u202Eevil", "e\u0301", "\U0001F642", "\t\n", "\\", "\"", "\uFFFF", "\uFEFF",
        "S101 ", " S101", "s101", "\u00A0", "\u2028", new string('x', 5000), "\u0130", "null", "0",
    ];

    /// <summary>Inserted into the text at a random point.</summary>
    private static readonly string[] Insertions =
    [
        "\u0000", "\uFEFF", "\u202E", "\u00E9", "\U0001F642", "\t", "\r\n", "\\", "\"", "{", "}", "[", "]", ",", ":",
        "\\u0041", "\\u00", "\\x41", "//", "/*", "\u00A0", "\u2028", "\u0007", "\uFFFD", "\"extra\": 1,",
        "\\uD800", "\\uDC00", "\\uD83D\\uDE42",
    ];

    /// <summary>String tokens as written in the file: escapes of half a surrogate pair are valid JSON but no text.</summary>
    private static readonly string[] RawStringTokens =
        ["\"\\uD800\"", "\"a\\uDFFFb\"", "\"\\uDBFF\\u0041\"", "\"\\uD83D\\uDE42\"", "\"\\u0000\"", "\"\\/\"", "\"\\t\""];

    private static readonly string[] GridTags =
        ["feederlocate-grid/2", "feederlocate-grid/0", "feederlocate-incident/1", "", " feederlocate-grid/1", "FEEDERLOCATE-GRID/1", "feederlocate-grid/1.0", "feederlocate-grid"];

    private static readonly string[] IncidentTags =
        ["feederlocate-incident/2", "feederlocate-incident/0", "feederlocate-grid/1", "", "feederlocate-incident/1 ", "FeederLocate-Incident/1", "feederlocate-incident"];

    public static readonly Gen<TreeEdit> TreeEditGen =
        Gen.Select(Gen.Enum<TreeOp>(), Gen.Int[0, 100_000], Gen.Int[0, 1_000], (op, target, choice) => new TreeEdit(op, target, choice));

    public static readonly Gen<TextEdit> TextEditGen =
        Gen.Select(Gen.Enum<TextOp>(), Gen.Int[0, 1_000_000], Gen.Int[0, 200], Gen.Int[0, 1_000], (op, position, length, choice) => new TextEdit(op, position, length, choice));

    /// <summary>Only odd numbers put in: these often pass the range checks and reach the calculations.</summary>
    public static readonly Gen<TreeEdit> NumberEditGen =
        Gen.Select(Gen.Int[0, 100_000], Gen.Int[0, 1_000], (target, choice) => new TreeEdit(TreeOp.OddNumber, target, choice));

    /// <summary>
    /// Mutants of <paramref name="baseCount"/> files: 3 in 10 with tree edits of any kind (well-formed, deep
    /// checks), 2 in 10 with odd numbers only (valid files with extreme values), 2 in 10 with text edits
    /// only, 3 in 10 with both.
    /// </summary>
    public static Gen<Mutant> MutantGen(int baseCount) => Gen.Frequency(
        (3, Gen.Select(Gen.Int[0, baseCount - 1], TreeEditGen.Array[1, 3], (b, tree) => new Mutant(b, tree, []))),
        (2, NumberMutantGen(baseCount)),
        (2, Gen.Select(Gen.Int[0, baseCount - 1], TextEditGen.Array[1, 2], (b, text) => new Mutant(b, [], text))),
        (3, Gen.Select(Gen.Int[0, baseCount - 1], TreeEditGen.Array[1, 2], TextEditGen.Array[1, 2], (b, tree, text) => new Mutant(b, tree, text))));

    /// <summary>Mutants with 1 to 3 odd numbers put in and nothing else.</summary>
    public static Gen<Mutant> NumberMutantGen(int baseCount) =>
        Gen.Select(Gen.Int[0, baseCount - 1], NumberEditGen.Array[1, 3], (b, tree) => new Mutant(b, tree, []));

    /// <summary>The mutant's edits and where its text first departs from the original, for a failure message.</summary>
    public static string Describe(Mutant mutant, IReadOnlyList<string> bases)
    {
        var original = bases[mutant.Base % bases.Count];
        string text;
        try
        {
            text = mutant.Apply(bases);
        }
#pragma warning disable CA1031 // A description must not fail; the failure itself is reported by the test.
        catch (Exception e)
#pragma warning restore CA1031
        {
            return $"{mutant} (applying it threw {e.GetType().Name})";
        }

        var start = 0;
        while (start < original.Length && start < text.Length && original[start] == text[start])
        {
            start++;
        }

        var end = 0;
        while (end < original.Length - start && end < text.Length - start && original[^(end + 1)] == text[^(end + 1)])
        {
            end++;
        }

        var from = Math.Max(0, start - 60);
        var to = Math.Min(text.Length, Math.Max(start, text.Length - end) + 60);
        var changed = text[from..to];
        if (changed.Length > 600)
        {
            changed = changed[..600] + "...";
        }

        return $"{mutant}; {text.Length} chars, first change at {start}: {JsonSerializer.Serialize(changed)}";
    }

    public static string ApplyTree(string json, IEnumerable<TreeEdit> edits)
    {
        if (JsonNode.Parse(json) is not JsonObject root)
        {
            return json;
        }

        var ids = new List<string>();
        CollectIds(root, ids);
        var isGrid = root["format"]?.GetValueKind() == JsonValueKind.String
            && root["format"]!.GetValue<string>().Contains("grid", StringComparison.Ordinal);
        foreach (var edit in edits)
        {
            Apply(root, edit, ids, isGrid);
        }

        return root.ToJsonString(Indented);
    }

    public static string ApplyText(string text, TextEdit edit)
    {
        if (text.Length == 0)
        {
            return text;
        }

        var at = Boundary(text, edit.Position % text.Length);
        var length = 1 + (edit.Length % 32);
        switch (edit.Op)
        {
            case TextOp.FlipCharBit:
                {
                    // Bits 0..6 keep a character out of (and a surrogate within) the surrogate range.
                    var position = edit.Position % text.Length;
                    var flipped = (char)(text[position] ^ (1 << (edit.Choice % 7)));
                    return string.Concat(text.AsSpan(0, position), new string(flipped, 1), text.AsSpan(position + 1));
                }

            case TextOp.FlipUtf8Bit:
                {
                    // As a file would be damaged on disk: a bit of the UTF-8 bytes, then decoded with replacement.
                    var bytes = Encoding.UTF8.GetBytes(text);
                    bytes[edit.Position % bytes.Length] ^= (byte)(1 << (edit.Choice % 8));
                    return new UTF8Encoding(false, false).GetString(bytes);
                }

            case TextOp.Truncate:
                return text[..at];
            case TextOp.DeleteLine:
            case TextOp.DuplicateLine:
                {
                    var lines = text.Split('\n').ToList();
                    var line = edit.Position % lines.Count;
                    if (edit.Op == TextOp.DeleteLine)
                    {
                        lines.RemoveAt(line);
                    }
                    else
                    {
                        lines.Insert(line, lines[line]);
                    }

                    return string.Join('\n', lines);
                }

            case TextOp.DeleteChars:
                return text.Remove(at, Boundary(text, Math.Min(text.Length, at + length)) - at);
            case TextOp.DuplicateChars:
                {
                    var end = Boundary(text, Math.Min(text.Length, at + length));
                    return text.Insert(end, text[at..end]);
                }

            case TextOp.InsertUnicode:
                return text.Insert(at, Insertions[edit.Choice % Insertions.Length]);
            case TextOp.ReplaceNumberToken:
                return ReplaceMatch(text, NumberToken, edit.Position, OddNumberTokens[edit.Choice % OddNumberTokens.Length]);
            case TextOp.ReplaceStringToken:
                {
                    var strings = StringToken.Matches(text);
                    if (strings.Count == 0)
                    {
                        return text;
                    }

                    // Another string of the same file (an id of another element, a field name), an odd string,
                    // or an escape sequence written as it stands.
                    var replacement = (edit.Choice % 3) switch
                    {
                        0 => strings[edit.Choice / 3 % strings.Count].Value,
                        1 => JsonSerializer.Serialize(OddStrings[edit.Choice / 3 % OddStrings.Length], Indented),
                        _ => RawStringTokens[edit.Choice / 3 % RawStringTokens.Length],
                    };
                    return ReplaceMatch(text, StringToken, edit.Position, replacement);
                }

            case TextOp.DeepNesting:
                {
                    var depth = 1 + (edit.Length % 120);
                    var nested = edit.Choice % 2 == 0
                        ? new string('[', depth) + "1" + new string(']', depth)
                        : string.Concat(Enumerable.Repeat("{\"a\":", depth)) + "1" + new string('}', depth);
                    return ReplaceMatch(text, NumberToken, edit.Position, nested);
                }

            case TextOp.FormatTag:
                {
                    var (tag, variants) = text.Contains("feederlocate-grid/1", StringComparison.Ordinal)
                        ? ("feederlocate-grid/1", GridTags)
                        : ("feederlocate-incident/1", IncidentTags);
                    var index = text.IndexOf(tag, StringComparison.Ordinal);
                    return index < 0 ? text : string.Concat(text.AsSpan(0, index), variants[edit.Choice % variants.Length], text.AsSpan(index + tag.Length));
                }

            default:
                throw new ArgumentOutOfRangeException(nameof(edit), edit.Op, "unknown text edit");
        }
    }

    private static void Apply(JsonObject root, TreeEdit edit, List<string> ids, bool isGrid)
    {
        var all = new List<Place>();
        Collect(root, null, null, -1, all);
        var members = all.Skip(1).ToList();
        switch (edit.Op)
        {
            case TreeOp.DeleteMember:
                if (Pick(members, edit.Target) is { } deleted)
                {
                    deleted.Remove();
                }

                break;
            case TreeOp.WrongType:
                Pick(members, edit.Target)?.Set(Parse(WrongTypes[edit.Choice % WrongTypes.Length]));
                break;
            case TreeOp.OddNumber:
                (Pick(members.Where(p => p.Kind == JsonValueKind.Number).ToList(), edit.Target) ?? Pick(members, edit.Target))
                    ?.Set(Parse(OddNumbers[edit.Choice % OddNumbers.Length]));
                break;
            case TreeOp.RenameProperty:
                if (Pick(members.Where(p => p.Parent is JsonObject).ToList(), edit.Target) is { Key: { } key } renamed)
                {
                    string[] names = [key + "X", key.ToUpperInvariant(), key.Length > 0 ? key[..^1] : "X", string.Empty, " " + key, key + " ", "Id"];
                    var name = names[edit.Choice % names.Length];
                    var parent = (JsonObject)renamed.Parent!;
                    if (!parent.ContainsKey(name))
                    {
                        var value = renamed.Node;
                        parent.Remove(key);
                        parent[name] = value;
                    }
                }

                break;
            case TreeOp.MissingReference:
                Pick(members.Where(p => p.Kind == JsonValueKind.String).ToList(), edit.Target)?.Set(JsonValue.Create("MISSING-404"));
                break;
            case TreeOp.IdOfAnotherElement:
                if (ids.Count > 0)
                {
                    Pick(members.Where(p => p.Kind == JsonValueKind.String).ToList(), edit.Target)?.Set(JsonValue.Create(ids[edit.Choice % ids.Count]));
                }

                break;
            case TreeOp.DuplicateArrayItem:
                if (Pick(members.Where(p => p.Parent is JsonArray).ToList(), edit.Target) is { } item)
                {
                    ((JsonArray)item.Parent!).Insert(item.Index + 1, item.Node?.DeepClone());
                }

                break;
            case TreeOp.EmptyArray:
                (Pick(members.Where(p => p.Node is JsonArray).ToList(), edit.Target)?.Node as JsonArray)?.Clear();
                break;
            case TreeOp.FormatTag:
                {
                    var tags = isGrid ? GridTags : IncidentTags;
                    var choice = edit.Choice % (tags.Length + 3);
                    if (choice == tags.Length)
                    {
                        root.Remove("format");
                    }
                    else
                    {
                        root["format"] = choice < tags.Length ? JsonValue.Create(tags[choice]) : Parse(choice == tags.Length + 1 ? "null" : "1");
                    }

                    break;
                }

            case TreeOp.DeepNesting:
                if (Pick(members, edit.Target) is { } nestedPlace)
                {
                    var depth = 1 + (edit.Choice % 100);
                    var value = nestedPlace.Node?.DeepClone();
                    for (var i = 0; i < depth; i++)
                    {
                        value = edit.Choice % 2 == 0 ? new JsonArray(value) : new JsonObject { ["v"] = value };
                    }

                    nestedPlace.Set(value);
                }

                break;
            case TreeOp.OddString:
                Pick(members.Where(p => p.Kind == JsonValueKind.String).ToList(), edit.Target)?.Set(JsonValue.Create(OddStrings[edit.Choice % OddStrings.Length]));
                break;
            case TreeOp.UnknownField:
                if (Pick(all.Where(p => p.Node is JsonObject).ToList(), edit.Target)?.Node is JsonObject target)
                {
                    target[$"extra{edit.Choice}"] = Parse(WrongTypes[edit.Choice % WrongTypes.Length]);
                }

                break;
            default:
                throw new ArgumentOutOfRangeException(nameof(edit), edit.Op, "unknown tree edit");
        }
    }

    private static JsonNode? Parse(string json) => JsonNode.Parse(json);

    private static Place? Pick(List<Place> places, int target) => places.Count == 0 ? null : places[target % places.Count];

    private static void Collect(JsonNode? node, JsonNode? parent, string? key, int index, List<Place> places)
    {
        places.Add(new Place(node, parent, key, index));
        switch (node)
        {
            case JsonObject o:
                foreach (var (k, v) in o.ToList())
                {
                    Collect(v, o, k, -1, places);
                }

                break;
            case JsonArray a:
                for (var i = 0; i < a.Count; i++)
                {
                    Collect(a[i], a, null, i, places);
                }

                break;
        }
    }

    private static void CollectIds(JsonNode? node, List<string> ids)
    {
        switch (node)
        {
            case JsonObject o:
                foreach (var (k, v) in o)
                {
                    if (k is "id" or "indicator" or "device" && v?.GetValueKind() == JsonValueKind.String)
                    {
                        ids.Add(v.GetValue<string>());
                    }

                    CollectIds(v, ids);
                }

                break;
            case JsonArray a:
                foreach (var v in a)
                {
                    CollectIds(v, ids);
                }

                break;
        }
    }

    private static string ReplaceMatch(string text, Regex pattern, int which, string replacement)
    {
        var matches = pattern.Matches(text);
        if (matches.Count == 0)
        {
            return text;
        }

        var m = matches[which % matches.Count];
        return string.Concat(text.AsSpan(0, m.Index), replacement, text.AsSpan(m.Index + m.Length));
    }

    /// <summary>Moves a cut off the middle of a surrogate pair, so no edit leaves half a character behind.</summary>
    private static int Boundary(string text, int at) =>
        at > 0 && at < text.Length && char.IsLowSurrogate(text[at]) && char.IsHighSurrogate(text[at - 1]) ? at + 1 : at;

    /// <summary>Where a node sits: in an object under <see cref="Key"/>, or in an array at <see cref="Index"/>.</summary>
    private sealed record Place(JsonNode? Node, JsonNode? Parent, string? Key, int Index)
    {
        public JsonValueKind Kind => Node?.GetValueKind() ?? JsonValueKind.Null;

        public void Set(JsonNode? value)
        {
            switch (Parent)
            {
                case JsonObject o:
                    o[Key!] = value;
                    break;
                case JsonArray a:
                    a[Index] = value;
                    break;
            }
        }

        public void Remove()
        {
            switch (Parent)
            {
                case JsonObject o:
                    o.Remove(Key!);
                    break;
                case JsonArray a:
                    a.RemoveAt(Index);
                    break;
            }
        }
    }
}
