using FeederLocate.Core.Model;

namespace FeederLocate.Core.Learning;

/// <summary>A fault whose location was confirmed on <paramref name="Segment"/>, reported at <paramref name="ReportedAt"/>.</summary>
public sealed record ConfirmedFault(SegmentId Segment, DateTimeOffset ReportedAt);
