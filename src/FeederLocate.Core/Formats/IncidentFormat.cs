using FeederLocate.Core.Evidence;

namespace FeederLocate.Core.Formats;

/// <summary>Names of the incident format's tags.</summary>
public static class IncidentFormat
{
    public const string FormatTag = "feederlocate-incident/1";

    public static readonly IReadOnlyDictionary<string, FaultType?> FaultTypes =
        new Dictionary<string, FaultType?>(StringComparer.Ordinal)
        {
            ["LG"] = FaultType.LG,
            ["LL"] = FaultType.LL,
            ["LLG"] = FaultType.LLG,
            ["LLL"] = FaultType.LLL,
            ["unknown"] = null,
        };

    public static readonly IReadOnlyDictionary<string, IndicatorState> States =
        new Dictionary<string, IndicatorState>(StringComparer.Ordinal)
        {
            ["fault"] = IndicatorState.Fault,
            ["none"] = IndicatorState.None,
            ["forward"] = IndicatorState.Forward,
            ["reverse"] = IndicatorState.Reverse,
            ["unknown"] = IndicatorState.Unknown,
        };

    public static readonly IReadOnlyDictionary<string, IndicationSource> Sources =
        new Dictionary<string, IndicationSource>(StringComparer.Ordinal)
        {
            ["remote"] = IndicationSource.Remote,
            ["field"] = IndicationSource.Field,
        };

    public static readonly IReadOnlyDictionary<string, SwitchPosition> Positions =
        new Dictionary<string, SwitchPosition>(StringComparer.Ordinal)
        {
            ["open"] = SwitchPosition.Open,
            ["closed"] = SwitchPosition.Closed,
        };

    public static readonly IReadOnlyDictionary<string, ReclosingResult> ReclosingResults =
        new Dictionary<string, ReclosingResult>(StringComparer.Ordinal)
        {
            ["lockout"] = ReclosingResult.Lockout,
            ["success"] = ReclosingResult.Success,
        };

    public static readonly IReadOnlyDictionary<string, FuseCondition> FuseConditions =
        new Dictionary<string, FuseCondition>(StringComparer.Ordinal)
        {
            ["blown"] = FuseCondition.Blown,
            ["intact"] = FuseCondition.Intact,
        };

    public static readonly IReadOnlyDictionary<string, EarthFaultDirection> EarthFaultDirections =
        new Dictionary<string, EarthFaultDirection>(StringComparer.Ordinal)
        {
            ["forward"] = EarthFaultDirection.Forward,
            ["reverse"] = EarthFaultDirection.Reverse,
            ["none"] = EarthFaultDirection.None,
        };

    public static string Name(ReclosingResult result) => ReclosingResults.First(p => p.Value == result).Key;

    public static string Name(FuseCondition condition) => FuseConditions.First(p => p.Value == condition).Key;

    public static string Name(EarthFaultDirection direction) => EarthFaultDirections.First(p => p.Value == direction).Key;

    public static string Name(FaultType? type) => type?.ToString() ?? "unknown";

    public static string Name(IndicatorState state) => States.First(p => p.Value == state).Key;

    public static string Name(IndicationSource source) => Sources.First(p => p.Value == source).Key;

    public static string Name(SwitchPosition position) => Positions.First(p => p.Value == position).Key;
}
