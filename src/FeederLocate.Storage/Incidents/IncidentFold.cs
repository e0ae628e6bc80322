using System.Collections.Immutable;
using FeederLocate.Core.Evidence;
using FeederLocate.Core.Model;
using FeederLocate.Storage.Errors;
using FeederLocate.Storage.Events;

namespace FeederLocate.Storage.Incidents;

/// <summary>
/// Adds up an incident's events, in sequence order, into its <see cref="IncidentState"/>:
/// an indication replaces the earlier one of the same indicator where it stood in the list (new indicators go
/// last); a measurement's given values replace those of the same device; a switch state replaces the earlier
/// one; the latest outcome (a confirmed segment or no fault found) is in force until retracted; return-to-normal steps accumulate apart from the plan's; plan steps accumulate, a correction withdraws the latest tick of its step, a deviation
/// sets the positions switched so far as the start of a new plan (its ticks move to the earlier steps); incidentClosed closes, and only a retraction or incidentReopened may follow it; each stage change is kept with who and when; a grid move re-pins the incident to another version of its grid (one that does not start from the version in force is quarantined).
/// An event that cannot be read, or cannot apply where it stands, is quarantined:
/// left out and named in <see cref="IncidentState.Quarantined"/>, never a reason to refuse the rest.
/// </summary>
internal static class IncidentFold
{
    public static IncidentState Fold(IReadOnlyList<StoredEvent> events)
    {
        ArgumentNullException.ThrowIfNull(events);
        if (events.Count == 0 || events[0].Event is not IncidentOpened opened)
        {
            throw events.Count == 0
                ? new InvalidOperationException("an incident has at least its opening event")
                : new CorruptEventException(events[0].Id, events[0].Event is UnreadableEvent unreadable
                    ? $"opens incident {events[0].Incident} but cannot be read: {unreadable.Problem}"
                    : $"is the first event of incident {events[0].Incident} but is not incidentOpened");
        }

        var first = events[0];
        var start = new IncidentState(first.Incident, opened.GridName, opened.Incident, IncidentStatus.Open, [], null, first.Actor, first.Time, null, 1)
        {
            LastEvent = first.Id,
            GridVersion = opened.GridVersion,
            Stages = [new StageChange(IncidentStage.Open, first.Actor, first.Time)],
        };
        return Continue(start, events, 1);
    }

    /// <summary>
    /// The state after <paramref name="events"/> from index <paramref name="from"/> on, given the state the
    /// events before it add up to: the same as folding them all, in time proportional to the new events and the evidence, not to the events before.
    /// </summary>
    public static IncidentState Continue(IncidentState state, IReadOnlyList<StoredEvent> events, int from)
    {
        ArgumentNullException.ThrowIfNull(state);
        ArgumentNullException.ThrowIfNull(events);
        var incident = state.Incident;
        var indications = incident.Indications.ToBuilder();
        var measurements = incident.Measurements.ToBuilder();
        var switchStates = incident.SwitchStates.ToBuilder();
        var steps = state.CompletedSteps.ToBuilder();
        var outcome = state.Outcome;
        var closedAt = state.ClosedAt;
        var quarantined = state.Quarantined.ToBuilder();
        var corrections = state.Corrections.ToBuilder();
        var deviations = state.Deviations.ToBuilder();
        var earlier = state.EarlierSteps.ToBuilder();
        var switched = state.SwitchedBeforePlan.ToBuilder();
        var times = state.Times;
        var stages = state.Stages.ToBuilder();
        var entries = state.IndicationEntries.ToBuilder();
        var noFault = state.NoFaultFound;
        var returnSteps = state.ReturnSteps.ToBuilder();
        var gridVersion = state.GridVersion;
        var gridMoves = state.GridMoves.ToBuilder();

        for (var index = from; index < events.Count; index++)
        {
            var stored = events[index];
            if (stored.Event is UnreadableEvent unreadable)
            {
                quarantined.Add(new QuarantinedEvent(stored.Id, stored.Incident, stored.Sequence, unreadable.StoredKind, unreadable.Problem));
                continue;
            }

            if (closedAt is not null && stored.Event is not (OutcomeRetracted or IncidentReopened))
            {
                quarantined.Add(new QuarantinedEvent(stored.Id, stored.Incident, stored.Sequence, stored.Kind, $"follows the closing of incident {stored.Incident}"));
                continue;
            }

            switch (stored.Event)
            {
                case IndicationEntered { Indication: var indication }:
                    var previous = entries.GetValueOrDefault(indication.Indicator);
                    var overrode = previous is not null && previous.Actor.Name != stored.Actor.Name && stored.Time - previous.EnteredAt <= IndicationEntry.OverrideWindow
                        ? previous with { Overrode = null }
                        : null;
                    entries[indication.Indicator] = new IndicationEntry(indication, stored.Actor, stored.Time, overrode);
                    var at = IndexOf(indications, i => i.Indicator == indication.Indicator);
                    if (at < 0)
                    {
                        indications.Add(indication);
                    }
                    else
                    {
                        indications[at] = indication;
                    }

                    break;
                case MeasurementRecorded { Measurement: var measurement }:
                    var m = IndexOf(measurements, x => x.Device == measurement.Device);
                    if (m < 0)
                    {
                        measurements.Add(measurement);
                    }
                    else
                    {
                        var old = measurements[m];
                        measurements[m] = new SubstationMeasurement(
                            measurement.Device,
                            measurement.PhaseCurrentA ?? old.PhaseCurrentA,
                            measurement.ResidualCurrentA ?? old.ResidualCurrentA,
                            measurement.NeutralVoltageV ?? old.NeutralVoltageV);
                    }

                    break;
                case SwitchStateChanged change:
                    switchStates[change.Switch] = change.Position;
                    switched.Remove(change.Switch);
                    break;
                case IncidentTimesEntered entered:
                    times = new IncidentTimes(entered.FaultAt ?? times.FaultAt, entered.TrippedAt ?? times.TrippedAt, entered.ReclosedAt ?? times.ReclosedAt);
                    break;
                case PlanStepCorrected correction:
                    var ticked = LastIndexOf(steps, d => d.Step.Order == correction.Order);
                    corrections.Add(new RecordedCorrection(ticked < 0 ? null : steps[ticked], correction.Reason, stored.Actor, stored.Time));
                    if (ticked >= 0)
                    {
                        steps.RemoveAt(ticked);
                    }

                    break;
                case SwitchingDeviationRecorded deviation:
                    foreach (var done in steps.Concat(returnSteps))
                    {
                        if (done.Step is { Device: { } device, Action: "open" or "close" })
                        {
                            switched[new SwitchId(device)] = done.Step.Action == "close" ? SwitchPosition.Closed : SwitchPosition.Open;
                        }
                    }

                    switched[deviation.Switch] = deviation.Position;
                    earlier.AddRange(steps);
                    earlier.AddRange(returnSteps);
                    steps.Clear();
                    returnSteps.Clear();
                    deviations.Add(new RecordedDeviation(deviation, stored.Actor, stored.Time));
                    break;
                case PlanStepCompleted step:
                    steps.Add(new CompletedPlanStep(step, stored.Actor, stored.Time));
                    break;
                case OutcomeLogged logged:
                    outcome = new OutcomeInForce(logged, stored.Actor, stored.Time);
                    noFault = null;
                    break;
                case NoFaultFoundLogged finding:
                    noFault = new NoFaultFoundInForce(finding, stored.Actor, stored.Time);
                    outcome = null;
                    break;
                case ReturnStepCompleted back:
                    returnSteps.Add(new CompletedPlanStep(new PlanStepCompleted(back.Order, back.Action, back.Device, null, back.DoneAt), stored.Actor, stored.Time));
                    break;
                case IncidentClosed closed:
                    closedAt = stored.Time;
                    stages.Add(new StageChange(IncidentStage.Closed, stored.Actor, stored.Time, closed.Note));
                    break;
                case IncidentReopened when closedAt is null:
                    throw new CorruptEventException(stored.Id, $"reopens incident {stored.Incident}, which is open");
                case IncidentReopened reopened:
                    closedAt = null;
                    var before = stages.Count >= 2 ? stages[^2].Stage : IncidentStage.Open;
                    stages.Add(new StageChange(before == IncidentStage.Closed ? IncidentStage.Open : before, stored.Actor, stored.Time, reopened.Reason));
                    break;
                case IncidentGridMoved move when move.FromVersion != gridVersion:
                    quarantined.Add(new QuarantinedEvent(stored.Id, stored.Incident, stored.Sequence, stored.Kind,
                        $"moves incident {stored.Incident} from grid version {move.FromVersion}, but it stands on version {gridVersion}"));
                    break;
                case IncidentGridMoved move:
                    gridVersion = move.ToVersion;
                    gridMoves.Add(new GridMove(move.FromVersion, move.ToVersion, move.Reason, stored.Actor, stored.Time));
                    break;
                case IncidentStageChanged moved:
                    stages.Add(new StageChange(moved.Stage, stored.Actor, stored.Time));
                    break;
                case TripAmended amended:
                    incident = incident with { TrippedDevice = amended.TrippedDevice, FaultType = amended.FaultType };
                    break;
                case ProtectionRecorded protection:
                    incident = protection.ApplyTo(incident);
                    break;
                case OutcomeRetracted:
                    outcome = null;
                    noFault = null;
                    break;
                case IncidentOpened:
                    quarantined.Add(new QuarantinedEvent(stored.Id, stored.Incident, stored.Sequence, stored.Kind, $"opens incident {stored.Incident} a second time"));
                    break;
                default:
                    throw new InvalidOperationException($"event kind {stored.Event.GetType().Name} is not folded");
            }
        }

        var current = incident with
        {
            Indications = indications.ToImmutable(),
            Measurements = measurements.ToImmutable(),
            SwitchStates = switchStates.ToImmutable(),
        };
        return state with
        {
            Incident = current,
            Status = closedAt is null ? IncidentStatus.Open : IncidentStatus.Closed,
            CompletedSteps = steps.ToImmutable(),
            Outcome = outcome,
            ClosedAt = closedAt,
            Corrections = corrections.ToImmutable(),
            Deviations = deviations.ToImmutable(),
            EarlierSteps = earlier.ToImmutable(),
            SwitchedBeforePlan = switched.ToImmutable(),
            Times = times,
            Stages = stages.ToImmutable(),
            IndicationEntries = entries.ToImmutable(),
            NoFaultFound = noFault,
            ReturnSteps = returnSteps.ToImmutable(),
            GridVersion = gridVersion,
            GridMoves = gridMoves.ToImmutable(),
            EventCount = state.EventCount + Math.Max(0, events.Count - from),
            Quarantined = quarantined.ToImmutable(),
            LastEvent = events.Count > from ? events[^1].Id : state.LastEvent,
        };
    }

    private static int LastIndexOf<T>(ImmutableArray<T>.Builder items, Func<T, bool> match)
    {
        for (var i = items.Count - 1; i >= 0; i--)
        {
            if (match(items[i]))
            {
                return i;
            }
        }

        return -1;
    }

    private static int IndexOf<T>(ImmutableArray<T>.Builder items, Func<T, bool> match)
    {
        for (var i = 0; i < items.Count; i++)
        {
            if (match(items[i]))
            {
                return i;
            }
        }

        return -1;
    }
}
