using System.Text.Json;

namespace FeederLocate.Core.Formats;

/// <summary>
/// The JSON the readers accept (comments skipped, trailing commas allowed, depth at most 64, no duplicate
/// properties): anything else that looks into the same text reads it with these options, so it never refuses
/// what the readers took.
/// </summary>
public static class ReaderJson
{
    public static JsonDocumentOptions DocumentOptions { get; } = new()
    {
        CommentHandling = JsonCommentHandling.Skip,
        AllowTrailingCommas = true,
        MaxDepth = 64,
        AllowDuplicateProperties = false,
    };
}
