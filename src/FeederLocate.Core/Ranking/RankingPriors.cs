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
    /// <summary>
    /// Relative errors of the substation measurements learned from the history (recorded against predicted at the
    /// confirmed faults); null where the history has too few measurements of the quantity.
    /// </summary>
    public LearnedMeasurementErrors MeasurementErrors { get; init; } = LearnedMeasurementErrors.None;

    /// <summary>
    /// The options with each current tolerance's relative part widened to the learned relative error where that
    /// is larger: measurements found to err more than assumed weigh less. Never narrowed below the options.
    /// </summary>
    public RankingOptions WidenTolerances(RankingOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        static MeasurementTolerance Widen(MeasurementTolerance tolerance, double? learned) =>
            learned is { } relative && relative > tolerance.Relative ? tolerance with { Relative = relative } : tolerance;
        return MeasurementErrors == LearnedMeasurementErrors.None
            ? options
            : options with
            {
                PhaseCurrentTolerance = Widen(options.PhaseCurrentTolerance, MeasurementErrors.PhaseCurrentRelative),
                ResidualCurrentTolerance = Widen(options.ResidualCurrentTolerance, MeasurementErrors.ResidualCurrentRelative),
            };
    }

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

/// <summary>
/// Relative errors of substation current measurements learned from the history: the root mean square of
/// ln(recorded / predicted) at the confirmed faults, bias and spread together (0.05 ≈ 5 %). Null: not learned.
/// </summary>
public sealed record LearnedMeasurementErrors(double? PhaseCurrentRelative, double? ResidualCurrentRelative)
{
    public static LearnedMeasurementErrors None { get; } = new(null, null);
}
