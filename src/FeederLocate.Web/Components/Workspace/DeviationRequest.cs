using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;

namespace FeederLocate.Web.Components.Workspace;

/// <summary>An engineer's record of a switch put in <paramref name="Position"/> outside the order, with the reason.</summary>
public sealed record DeviationRequest(SwitchId Switch, SwitchPosition Position, string Reason);
