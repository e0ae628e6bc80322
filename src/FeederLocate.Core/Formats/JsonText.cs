using System.Text.Json;

namespace FeederLocate.Core.Formats;

/// <summary>Parses JSON text into a document, reporting a syntax error with its line and position.</summary>
internal static class JsonText
{
    private static readonly JsonDocumentOptions Options = new()
    {
        CommentHandling = JsonCommentHandling.Skip,
        AllowTrailingCommas = true,
        MaxDepth = 64,
        AllowDuplicateProperties = false,
    };

    public static JsonDocument? Parse(string text, string kind, IssueLog log)
    {
        ArgumentNullException.ThrowIfNull(text);
        try
        {
            var document = JsonDocument.Parse(text, Options);
            if (document.RootElement.ValueKind != JsonValueKind.Object)
            {
                log.Error(kind, "file", string.Empty, $"must hold one JSON object, got {ElementReader.Describe(document.RootElement)}");
                document.Dispose();
                return null;
            }

            return document;
        }
        catch (JsonException e)
        {
            var where = e.LineNumber is { } line ? $" at line {line + 1}, position {e.BytePositionInLine + 1}" : string.Empty;
            log.Error(kind, "file", string.Empty, $"is not valid JSON{where}: {FirstSentence(e.Message)}");
            return null;
        }
    }

    private static string FirstSentence(string message)
    {
        var end = message.IndexOf(". ", StringComparison.Ordinal);
        return end < 0 ? message : message[..(end + 1)];
    }
}
