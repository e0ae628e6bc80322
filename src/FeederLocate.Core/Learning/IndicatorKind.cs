using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// The pool an indicator's reliability is shrunk toward: directional or not, times remote (telecontrol)
/// or read in the field, as the grid states it.
/// </summary>
public readonly record struct IndicatorKind(bool Directional, bool Remote)
{
    /// <summary>The four kinds in a fixed order.</summary>
    public static IReadOnlyList<IndicatorKind> All { get; } =
    [
        new(Directional: false, Remote: true),
        new(Directional: true, Remote: true),
        new(Directional: false, Remote: false),
        new(Directional: true, Remote: false),
    ];

    public static IndicatorKind Of(Indicator indicator)
    {
        ArgumentNullException.ThrowIfNull(indicator);
        return new IndicatorKind(indicator.Directional, indicator.Remote);
    }

    public override string ToString() =>
        $"{(Directional ? "directional" : "non-directional")} {(Remote ? "remote" : "field-read")}";
}
