using System.Collections.Immutable;

namespace FeederLocate.Core.Switching;

/// <summary>The cautions every plan carries: switching advice can hurt people.</summary>
public static class Cautions
{
    public static ImmutableArray<string> All { get; } =
    [
        "Advice only: this plan is computed from a model that can be wrong.",
        "Verify every device, position and step on site before it is carried out.",
        "Before any work: lock and tag every isolation point open, prove dead, earth on both sides, and issue a permit.",
        "Local switching rules and licensed practice govern.",
    ];
}
