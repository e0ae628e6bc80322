using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Ranking;

/// <summary>
/// An outcome: a logged incident's evidence with the segment where its fault was confirmed. The one word for a
/// confirmed fault location throughout the code (the stored event is <c>OutcomeLogged</c>).
/// </summary>
public sealed record Outcome(Incident Incident, SegmentId Segment);
