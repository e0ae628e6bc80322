using System.Text.Json;
using System.Text.Json.Serialization;

namespace FeederLocate.Cli.Output;

/// <summary>The one JSON document a command prints with <c>--json</c>.</summary>
public static class JsonOutput
{
    public static readonly JsonSerializerOptions Options = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        WriteIndented = true,
        DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
    };

    public static void Write<T>(TextWriter output, T document)
    {
        output.WriteLine(JsonSerializer.Serialize(document, Options));
    }
}
