using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>An operation the planner has decided on, before it is placed on the timeline.</summary>
/// <param name="Device">Switch index in the grid.</param>
internal sealed record PlannedOperation(StepAction Action, int Device, string Reason, NodeId? Node = null);
