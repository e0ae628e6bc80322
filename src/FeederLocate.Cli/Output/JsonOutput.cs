using System.Text.Json;

namespace FeederLocate.Cli.Output;

/// <summary>The one JSON document a command prints with <c>--json</c>.</summary>
public static class JsonOutput
{
    public static readonly JsonSerializerOptions Options = FeederLocate.Core.Formats.Documents.DocumentJson.Options;

    public static void Write<T>(TextWriter output, T document)
    {
        output.WriteLine(JsonSerializer.Serialize(document, Options));
    }
}
