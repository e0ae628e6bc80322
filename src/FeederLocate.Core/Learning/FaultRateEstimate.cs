using System.Collections.Frozen;
using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>Learned fault rates of every line type and segment of a grid.</summary>
public sealed record FaultRateEstimate
{
    private readonly FrozenDictionary<SegmentId, FaultRatePosterior> _bySegment;

    public FaultRateEstimate(
        ImmutableArray<LineTypeFaultRate> lineTypes,
        ImmutableArray<FaultRatePosterior> segments,
        double observationYears,
        int faults,
        ImmutableArray<SegmentId> unknownSegments)
    {
        LineTypes = lineTypes;
        Segments = segments;
        ObservationYears = observationYears;
        Faults = faults;
        UnknownSegments = unknownSegments;
        _bySegment = segments.ToFrozenDictionary(s => s.Segment);
    }

    /// <summary>One entry per line type of the grid, in grid order.</summary>
    public ImmutableArray<LineTypeFaultRate> LineTypes { get; }

    /// <summary>One entry per segment of the grid, in grid order.</summary>
    public ImmutableArray<FaultRatePosterior> Segments { get; }

    /// <summary>T: the history length in years that the exposures were computed with (0 with no history).</summary>
    public double ObservationYears { get; }

    /// <summary>Confirmed faults counted (those on segments of the grid).</summary>
    public int Faults { get; }

    /// <summary>Confirmed segments not in the grid (renamed or removed since): not counted, listed once each.</summary>
    public ImmutableArray<SegmentId> UnknownSegments { get; }

    /// <summary>The segment's learned rate; throws <see cref="KeyNotFoundException"/> for a segment not in the grid.</summary>
    public FaultRatePosterior Of(SegmentId segment) =>
        _bySegment.TryGetValue(segment, out var rate)
            ? rate
            : throw new KeyNotFoundException($"segment {segment} is not in the grid the fault rates were learned for");
}
