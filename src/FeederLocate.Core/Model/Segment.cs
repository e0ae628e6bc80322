namespace FeederLocate.Core.Model;

/// <summary>A line segment between two nodes; a fault position on it is measured from <see cref="From"/>.</summary>
public sealed record Segment(SegmentId Id, NodeId From, NodeId To, LineTypeId LineType, double LengthKm);
