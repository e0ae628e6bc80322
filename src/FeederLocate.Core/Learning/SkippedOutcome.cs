using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>
/// A logged outcome the learning left out because the grid it is learned for cannot explain it (its segment
/// is gone, its switch states close a loop, it names an element the grid lacks): reported, never fatal.
/// </summary>
/// <param name="ReportedAt">When the incident was reported: which outcome it is.</param>
/// <param name="Reason">Why, naming the element.</param>
public sealed record SkippedOutcome(DateTimeOffset ReportedAt, SegmentId Segment, string Reason);
