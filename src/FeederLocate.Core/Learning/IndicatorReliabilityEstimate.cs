using System.Collections.Frozen;
using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>Learned reliability of every indicator of a grid and of the four indicator kinds.</summary>
public sealed record IndicatorReliabilityEstimate
{
    private readonly FrozenDictionary<IndicatorId, IndicatorReliability> _byIndicator;

    public IndicatorReliabilityEstimate(
        ImmutableArray<IndicatorKindReliability> kinds,
        ImmutableArray<IndicatorReliability> indicators,
        ImmutableArray<IndicatorId> unknownIndicators)
    {
        Kinds = kinds;
        Indicators = indicators;
        UnknownIndicators = unknownIndicators;
        _byIndicator = indicators.ToFrozenDictionary(i => i.Indicator);
    }

    /// <summary>The four kinds, in the order of <see cref="IndicatorKind.All"/>.</summary>
    public ImmutableArray<IndicatorKindReliability> Kinds { get; }

    /// <summary>One entry per indicator of the grid, in grid order.</summary>
    public ImmutableArray<IndicatorReliability> Indicators { get; }

    /// <summary>Observed indicators not in the grid: not counted, listed once each.</summary>
    public ImmutableArray<IndicatorId> UnknownIndicators { get; }

    /// <summary>The indicator's learned reliability; throws <see cref="KeyNotFoundException"/> for one not in the grid.</summary>
    public IndicatorReliability Of(IndicatorId indicator) =>
        _byIndicator.TryGetValue(indicator, out var reliability)
            ? reliability
            : throw new KeyNotFoundException($"indicator {indicator} is not in the grid the reliabilities were learned for");

    public IndicatorKindReliability Of(IndicatorKind kind) => Kinds.Single(k => k.Kind == kind);
}
