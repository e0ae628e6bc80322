using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>
/// An incident as its events add up to: the evidence (<see cref="Incident"/>, with every later indication,
/// measurement and switch state applied in order), the plan steps done, the outcome if logged and not retracted,
/// open or closed.
/// </summary>
/// <param name="OpenedAt">When the incident was logged (not when it was reported: see <see cref="ReportedAt"/>).</param>
/// <param name="EventCount">Events logged for the incident, the opening one included.</param>
public sealed record IncidentState(
    IncidentId Id,
    string GridName,
    Incident Incident,
    IncidentStatus Status,
    ImmutableArray<CompletedPlanStep> CompletedSteps,
    OutcomeInForce? Outcome,
    Actor OpenedBy,
    DateTimeOffset OpenedAt,
    DateTimeOffset? ClosedAt,
    int EventCount)
{
    public DateTimeOffset ReportedAt => Incident.ReportedAt;

    /// <summary>The incident's events left out of this state because they cannot be read or cannot apply.</summary>
    public ImmutableArray<QuarantinedEvent> Quarantined { get; init; } = [];

    /// <summary>
    /// The id of the incident's latest event. Ids increase in commit order across the whole log, so a state
    /// with a greater id is a later one: what caches of anything derived from the incident key on.
    /// </summary>
    public EventId LastEvent { get; init; }

    /// <summary>Ticks withdrawn by a correction, in the order logged.</summary>
    public ImmutableArray<RecordedCorrection> Corrections { get; init; } = [];

    /// <summary>Switches operated outside the switching order, in the order logged.</summary>
    public ImmutableArray<RecordedDeviation> Deviations { get; init; } = [];

    /// <summary>Steps ticked under an earlier plan, before the latest deviation made the plan again.</summary>
    public ImmutableArray<CompletedPlanStep> EarlierSteps { get; init; } = [];

    /// <summary>
    /// Positions put by switching up to the latest deviation (the ticks then, and the deviations): the switching
    /// the present plan starts from. Empty until a deviation; a position found later for a switch replaces it.
    /// </summary>
    public ImmutableDictionary<SwitchId, SwitchPosition> SwitchedBeforePlan { get; init; } = ImmutableDictionary<SwitchId, SwitchPosition>.Empty;

    /// <summary>
    /// Who entered each indicator's present reading after the opening, and when (readings given with the
    /// opening are the opener's, at <see cref="OpenedAt"/>, and are not listed).
    /// </summary>
    public ImmutableDictionary<IndicatorId, IndicationEntry> IndicationEntries { get; init; } = ImmutableDictionary<IndicatorId, IndicationEntry>.Empty;

    /// <summary>Every stage the incident went through, with who and when, the first being its opening.</summary>
    public ImmutableArray<StageChange> Stages { get; init; } = [];

    /// <summary>Where the incident stands now.</summary>
    public IncidentStage Stage => Stages.IsEmpty ? IncidentStage.Open : Stages[^1].Stage;

    /// <summary>The no-fault-found outcome in force; null when none is (then <see cref="Outcome"/> may be).</summary>
    public NoFaultFoundInForce? NoFaultFound { get; init; }

    /// <summary>True when an outcome is in force: a confirmed segment or no fault found.</summary>
    public bool HasOutcome => Outcome is not null || NoFaultFound is not null;

    /// <summary>Steps of the return to normal carried out, in the order ticked (apart from <see cref="CompletedSteps"/>).</summary>
    public ImmutableArray<CompletedPlanStep> ReturnSteps { get; init; } = [];
    /// <summary>
    /// The version of its grid the incident is pinned to: the one it was opened on, or the one an engineer last
    /// moved it to. Its ranking and plan are made on that version, whatever newer versions were loaded since.
    /// </summary>
    public int GridVersion { get; init; } = 1;

    /// <summary>Every move to another grid version, with who, when and why, in the order logged.</summary>
    public ImmutableArray<GridMove> GridMoves { get; init; } = [];

    /// <summary>The fault, trip and reclosure times as entered.</summary>
    public IncidentTimes Times { get; init; } = IncidentTimes.None;

    /// <summary>When the fault began: the time entered, else when it was reported.</summary>
    public DateTimeOffset FaultAt => Times.FaultAt ?? Incident.ReportedAt;

    /// <summary>The evidence with the positions switched before the present plan: what the switching order is made from.</summary>
    public Incident PlanBasis => SwitchedBeforePlan.IsEmpty
        ? Incident
        : Incident with { SwitchStates = Incident.SwitchStates.SetItems(SwitchedBeforePlan) };
}
