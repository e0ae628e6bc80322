using System.Collections.Immutable;
using FeederLocate.Core.Model;

namespace FeederLocate.Core.Switching;

/// <summary>
/// One step of a switching plan, carried out in ascending <see cref="Order"/>.
/// </summary>
/// <param name="Device">The switch operated, replaced, verified, proved dead or earthed at; null for work on segments.</param>
/// <param name="Node">Where the crew works: the node at which it proves dead or earths.</param>
/// <param name="Segments">The segments patrolled or worked on.</param>
/// <param name="At">
/// Planned completion after the start of the incident (for a dispatch, when the crew leaves): one step after
/// another, each manual one when its crew has arrived (crews leave at the start).
/// </param>
public sealed record SwitchingStep(
    int Order,
    StepAction Action,
    SwitchId? Device,
    NodeId? Node,
    ImmutableArray<SegmentId> Segments,
    TimeSpan At,
    string Reason)
{
    /// <summary>The crew that carries the step out (its base's id and number, <c>DEPOT/1</c>); null for the control room, or where the grid names no crews.</summary>
    public string? Crew { get; init; }

    /// <summary>True for the steps that change the network: open and close.</summary>
    public bool ChangesNetwork => Action is StepAction.Open or StepAction.Close;
}
