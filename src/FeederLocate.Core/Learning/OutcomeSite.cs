using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>Where an outcome confirmed the fault (<paramref name="Segment"/>) and when the incident was reported: all the fault-rate learning counts.</summary>
public sealed record OutcomeSite(SegmentId Segment, DateTimeOffset ReportedAt);
