using System.Text.Json;
using System.Text.Json.Serialization;

namespace FeederLocate.Core.Formats.Documents;

/// <summary>How the result documents (ranking, plan) are written as JSON: camelCase, nulls left out, numbers to 12 significant digits.</summary>
public static class DocumentJson
{
    public static JsonSerializerOptions Options { get; } = new()
    {
        PropertyNamingPolicy = JsonNamingPolicy.CamelCase,
        WriteIndented = true,
        DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
        Converters = { new RoundedDoubleConverter() },
    };
}
