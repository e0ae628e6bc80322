using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Evaluation;

/// <summary>An incident made by the simulator, with the truth it was made from.</summary>
public sealed record SimulatedIncident(Incident Incident, SegmentId Segment, double Position, FaultType Type, double FaultResistanceOhm);
