using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Web.Components.Workspace;

/// <summary>A switch position found on site, waiting for the operator's confirmation.</summary>
public sealed record SwitchPositionRequest(SwitchId Switch, SwitchPosition Position);
