namespace FeederLocate.Core.Formats;

/// <summary>Names of the grid format's tags.</summary>
public static class GridFormat
{
    public const string FormatTag = "feederlocate-grid/1";

    public static string Name(Model.Construction construction) => construction switch
    {
        Model.Construction.Cable => "cable",
        _ => "overhead",
    };

    public static string Name(Model.GroundingScheme scheme) => scheme switch
    {
        Model.GroundingScheme.Isolated => "isolated",
        Model.GroundingScheme.Resonant => "resonant",
        Model.GroundingScheme.Solid => "solid",
        _ => "impedance",
    };

    public static string Name(Model.SwitchKind kind) => kind switch
    {
        Model.SwitchKind.Breaker => "breaker",
        Model.SwitchKind.Recloser => "recloser",
        Model.SwitchKind.LoadBreakSwitch => "loadBreakSwitch",
        Model.SwitchKind.Disconnector => "disconnector",
        _ => "fuse",
    };

    public static readonly IReadOnlyDictionary<string, Model.Construction> Constructions =
        new Dictionary<string, Model.Construction>(StringComparer.Ordinal)
        {
            ["cable"] = Model.Construction.Cable,
            ["overhead"] = Model.Construction.Overhead,
        };

    public static readonly IReadOnlyDictionary<string, Model.GroundingScheme> Schemes =
        new Dictionary<string, Model.GroundingScheme>(StringComparer.Ordinal)
        {
            ["isolated"] = Model.GroundingScheme.Isolated,
            ["resonant"] = Model.GroundingScheme.Resonant,
            ["solid"] = Model.GroundingScheme.Solid,
            ["impedance"] = Model.GroundingScheme.Impedance,
        };

    public static readonly IReadOnlyDictionary<string, Model.SwitchKind> SwitchKinds =
        new Dictionary<string, Model.SwitchKind>(StringComparer.Ordinal)
        {
            ["breaker"] = Model.SwitchKind.Breaker,
            ["recloser"] = Model.SwitchKind.Recloser,
            ["loadBreakSwitch"] = Model.SwitchKind.LoadBreakSwitch,
            ["disconnector"] = Model.SwitchKind.Disconnector,
            ["fuse"] = Model.SwitchKind.Fuse,
        };

    /// <summary>Reads an enumerated string field, reporting the allowed values when it is not one of them.</summary>
    internal static T? Choice<T>(ElementReader reader, string field, IReadOnlyDictionary<string, T> choices, bool required = true)
        where T : struct
    {
        var text = required ? reader.RequiredString(field) : reader.OptionalString(field);
        if (text is null)
        {
            return null;
        }

        if (choices.TryGetValue(text, out var value))
        {
            return value;
        }

        reader.Error(field, $"must be one of {string.Join(", ", choices.Keys.Select(k => $"\"{k}\""))}, got \"{text}\"");
        return null;
    }
}
