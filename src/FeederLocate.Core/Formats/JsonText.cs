using System.Text.Json;

namespace FeederLocate.Core.Formats;

/// <summary>Parses JSON text into a document, reporting a syntax error with its line and position.</summary>
internal static class JsonText
{
    private static readonly JsonDocumentOptions Options = ReaderJson.DocumentOptions;

    public static JsonDocument? Parse(string text, string kind, IssueLog log)
    {
        var document = ParseAny(text, kind, log, "file");
        if (document is not null && document.RootElement.ValueKind != JsonValueKind.Object)
        {
            log.Error(kind, "file", string.Empty, $"must hold one JSON object, got {ElementReader.Describe(document.RootElement)}");
            document.Dispose();
            return null;
        }

        return document;
    }

    /// <summary>Any JSON value (the caller checks its shape); a syntax error is reported against <paramref name="id"/>.</summary>
    public static JsonDocument? ParseAny(string text, string kind, IssueLog log, string id = "body")
    {
        ArgumentNullException.ThrowIfNull(text);
        try
        {
            return JsonDocument.Parse(text, Options);
        }
        catch (JsonException e)
        {
            var where = e.LineNumber is { } line ? $" at line {line + 1}, position {e.BytePositionInLine + 1}" : string.Empty;
            log.Error(kind, id, string.Empty, $"is not valid JSON{where}: {FirstSentence(e.Message)}");
            return null;
        }
    }

    private static string FirstSentence(string message)
    {
        var end = message.IndexOf(". ", StringComparison.Ordinal);
        return end < 0 ? message : message[..(end + 1)];
    }
}
