using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// What history has taught: fault rates per segment and error rates per indicator. Absent entries
/// fall back to the line type's rate and the options' rates.
/// </summary>
/// <param name="SegmentFaultsPerKmYear">Learned fault rate per segment, faults per km·year.</param>
/// <param name="IndicatorRates">Learned error rates per indicator (misreading still comes from the options).</param>
public sealed record RankingPriors(
    ImmutableDictionary<SegmentId, double> SegmentFaultsPerKmYear,
    ImmutableDictionary<IndicatorId, IndicatorErrorRates> IndicatorRates)
{
    public static RankingPriors None { get; } = new(ImmutableDictionary<SegmentId, double>.Empty, ImmutableDictionary<IndicatorId, IndicatorErrorRates>.Empty);

    /// <summary>Prior weight of a fault on the segment: rate per km·year times length, faults per year.</summary>
    public double FaultsPerYear(Grid grid, Segment segment)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(segment);
        var perKmYear = SegmentFaultsPerKmYear.TryGetValue(segment.Id, out var learned)
            ? learned
            : Units.PerKmYear(grid.LineTypeOf(segment).EffectiveFaultsPer100KmYear);
        return perKmYear * segment.LengthKm;
    }
}
